// `npm run walk:onboarding -- --url http://127.0.0.1:3000 [--homes 100000] [--split]`: walks a fresh
// landlord's first day against a running `npm start`, through the same HTTP API and session (cookie, CSRF
// token) the admin's browser uses: the landlord is added (`npm run landlord:add`'s service, on the
// database the configuration points at), the admin's invitation is read from the mail catcher and
// accepted, then the admin previews and imports a generated register of N homes and a tenancy file of N
// tenancies, reads the invitations' progress, creates an API key and reads the homes with it, registers a webhook
// endpoint (a receiver on this machine: plain http to localhost is allowed outside production) that
// must receive the case created through the key, and exports each table as CSV and .xlsx (row counts
// checked against the list's total). One line per step, with its time and figures.
// `--split`: tenancy files of at most 50 000 rows each (the import's limit) instead of one file.
import { createHmac, randomUUID, timingSafeEqual } from "node:crypto";
import { closeSync, createReadStream, mkdtempSync, openSync, rmSync, statSync, writeSync } from "node:fs";
import http from "node:http";
import type { AddressInfo } from "node:net";
import { tmpdir } from "node:os";
import path from "node:path";
import { Readable } from "node:stream";
import { parseArgs } from "node:util";
import { parse as parseCsv } from "csv-parse";
import ExcelJS from "exceljs";
import { createAppContext } from "../server/app-context.js";
import { loadConfig } from "../server/config/env.js";
import { OrganisationService } from "../server/modules/organisations/organisation.service.js";
import { Session } from "./lib/http-load.js";
import { uprnOf, writeRegister } from "./lib/stock-register.js";

const { values } = parseArgs({
  options: {
    url: { type: "string" },
    homes: { type: "string", default: "100000" },
    split: { type: "boolean", default: false },
    "mail-url": { type: "string" },
    "invitation-wait": { type: "string", default: "150" },
    keep: { type: "boolean", default: false },
  },
});
const HOMES = Number(values.homes);
if (!values.url || !Number.isInteger(HOMES) || HOMES < 1) {
  console.error(
    "Usage: npm run walk:onboarding -- --url http://127.0.0.1:3000 [--homes 100000] [--split] [--mail-url http://127.0.0.1:1080]",
  );
  process.exit(2);
}
const base = values.url.replace(/\/$/, "");
const config = loadConfig();
const mailUrl = (values["mail-url"] ?? `http://127.0.0.1:${config.smtp.webPort}`).replace(/\/$/, "");
/** The tenancy import's limit per file today (see --split). */
const TENANCIES_PER_FILE = 50_000;
const run = randomUUID().slice(0, 8);
const work = mkdtempSync(path.join(tmpdir(), "dewline-walk-"));
const started = performance.now();
const n = (x: number) => x.toLocaleString("en-GB");

/** One line per step: total time so far, the step's own time, what it did. */
async function step<T>(name: string, body: () => Promise<[T, string]>): Promise<T> {
  const t0 = performance.now();
  try {
    const [value, figures] = await body();
    const own = ((performance.now() - t0) / 1000).toFixed(1);
    const total = ((performance.now() - started) / 1000).toFixed(1);
    console.log(`${total.padStart(7)} s  ${name.padEnd(24)} ${own.padStart(6)} s  ${figures}`);
    return value;
  } catch (error) {
    console.error(`FAILED at "${name}": ${error instanceof Error ? error.message : String(error)}`);
    throw error;
  }
}

async function ok(res: Response, status: number, what: string): Promise<Response> {
  if (res.status !== status)
    throw new Error(`${what}: expected ${status}, got ${res.status} ${(await res.text()).slice(0, 500)}`);
  return res;
}

async function json<T>(res: Response, status: number, what: string): Promise<T> {
  return (await (await ok(res, status, what)).json()) as T;
}

/** Waits for a state, asking every `everyMs`, up to `timeoutMs`. */
async function until<T>(what: string, probe: () => Promise<T | undefined>, timeoutMs: number, everyMs = 250): Promise<T> {
  const deadline = performance.now() + timeoutMs;
  for (;;) {
    const value = await probe();
    if (value !== undefined) return value;
    if (performance.now() > deadline) throw new Error(`gave up waiting for ${what} after ${timeoutMs / 1000} s`);
    await new Promise((r) => setTimeout(r, everyMs));
  }
}

/**
 * A multipart upload as the browser's form sends it, through node:http rather than fetch: fetch gives up
 * waiting for the answer's headers after 300 s, and a big file's import may take longer than that.
 */
async function upload(session: Session, urlPath: string, file: string, name: string, mapping?: unknown): Promise<Response> {
  const boundary = `----dewline-walk-${randomUUID()}`;
  const head = Buffer.from(
    (mapping === undefined
      ? ""
      : `--${boundary}\r\nContent-Disposition: form-data; name="mapping"\r\n\r\n${JSON.stringify(mapping)}\r\n`) +
      `--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="${name}"\r\nContent-Type: text/csv\r\n\r\n`,
  );
  const tail = Buffer.from(`\r\n--${boundary}--\r\n`);
  const url = new URL(`${base}${urlPath}`);
  return new Promise<Response>((resolve, reject) => {
    const req = http.request(
      {
        host: url.hostname,
        port: url.port,
        path: url.pathname,
        method: "POST",
        headers: {
          ...session.headers,
          "content-type": `multipart/form-data; boundary=${boundary}`,
          "content-length": head.length + statSync(file).size + tail.length,
        },
      },
      (res) => {
        const chunks: Buffer[] = [];
        res.on("data", (c: Buffer) => chunks.push(c));
        res.on("end", () =>
          resolve(
            new Response(res.statusCode === 204 ? null : Buffer.concat(chunks), {
              status: res.statusCode ?? 0,
              headers: { "content-type": String(res.headers["content-type"] ?? "") },
            }),
          ),
        );
        res.on("error", reject);
      },
    );
    req.on("error", reject);
    req.write(head);
    const stream = createReadStream(file);
    stream.on("error", reject);
    stream.on("end", () => req.end(tail));
    stream.pipe(req, { end: false });
  });
}

/** The data rows of a CSV export (header left out), counted by a real CSV parser. */
async function csvRows(body: ReadableStream<Uint8Array>): Promise<number> {
  let rows = 0;
  const parser = Readable.fromWeb(body as never).pipe(parseCsv({ bom: true, relax_column_count: true }));
  for await (const _record of parser) rows++;
  return rows - 1;
}

/** The data rows of an .xlsx export's first sheet (header left out), read as a stream. */
async function xlsxRows(body: ReadableStream<Uint8Array>): Promise<number> {
  let rows = 0;
  const reader = new ExcelJS.stream.xlsx.WorkbookReader(Readable.fromWeb(body as never), {});
  for await (const sheet of reader) {
    for await (const _row of sheet) rows++;
    break;
  }
  return rows - 1;
}

interface Received {
  body: string;
  signature: string;
  eventType: string;
}

/** A webhook receiver on this machine: answers 200 and keeps what it got. */
async function startReceiver(): Promise<{ url: string; hooks: Received[]; close(): Promise<void> }> {
  const hooks: Received[] = [];
  const server = http.createServer((req, res) => {
    const chunks: Buffer[] = [];
    req.on("data", (c: Buffer) => chunks.push(c));
    req.on("end", () => {
      hooks.push({
        body: Buffer.concat(chunks).toString("utf8"),
        signature: String(req.headers["dewline-signature"] ?? ""),
        eventType: String(req.headers["dewline-event-type"] ?? ""),
      });
      res.writeHead(200).end();
    });
  });
  await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", resolve));
  const { port } = server.address() as AddressInfo;
  return {
    url: `http://127.0.0.1:${port}/dewline-events`,
    hooks,
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}

/** Checks a delivery's signature as DEVELOPERS.md tells a receiver to ("Verifying Dewline webhooks"). */
function signedWith(secret: string, hook: Received): boolean {
  const parts = hook.signature.split(",").map((p) => p.split("=", 2));
  const t = parts.find(([k]) => k === "t")?.[1];
  const expected = createHmac("sha256", secret).update(`${t}.${hook.body}`).digest();
  return parts
    .filter(([k, v]) => k === "v1" && /^[0-9a-f]{64}$/.test(v ?? ""))
    .some(([, v]) => timingSafeEqual(Buffer.from(v!, "hex"), expected));
}

/** The tenancy files: one tenancy per home of the register, each file at most `perFile` rows. */
function writeTenancyFiles(perFile: number): string[] {
  const files: string[] = [];
  for (let first = 0; first < HOMES; first += perFile) {
    const file = path.join(work, `tenancies-${files.length + 1}.csv`);
    const fd = openSync(file, "w");
    let lines = ["Tenancy Reference,UPRN,Tenant Name,Email,Phone,Start Date,Language"];
    for (let i = first; i < Math.min(HOMES, first + perFile); i++) {
      const day = String((i % 28) + 1).padStart(2, "0");
      lines.push(
        `T-${run}-${i},${uprnOf(i)},Tenant ${i} Walker,tenant.${i}.${run}@walk.example,07700${String(900000 + (i % 100000)).slice(-6)},${day}/0${(i % 9) + 1}/2024,${i % 10 === 0 ? "cy" : "en"}`,
      );
      if (lines.length >= 5_000) {
        writeSync(fd, lines.join("\r\n") + "\r\n");
        lines = [];
      }
    }
    if (lines.length) writeSync(fd, lines.join("\r\n") + "\r\n");
    closeSync(fd);
    files.push(file);
  }
  return files;
}

interface Page {
  items: { id: number }[];
  total: number;
}

try {
  await ok(await fetch(`${base}/api/health/ready`), 200, `is Dewline running at ${base}? /api/health/ready`);
  await ok(await fetch(`${mailUrl}/email?to.address=nobody@walk.example`), 200, `the mail catcher at ${mailUrl}`);

  const landlordName = `Walkover Homes ${run}`;
  const adminEmail = `admin.${run}@walk.example`;
  const password = `walk-${randomUUID()}`;
  const landlord = await step("landlord added", async () => {
    const ctx = await createAppContext(config);
    try {
      const added = await new OrganisationService(ctx.dataSource).addLandlord(
        { name: landlordName, adminEmail, adminName: "Wren Walker" },
        { accounts: ctx.services.users, invitations: ctx.services.auth },
      );
      return [added, `"${added.name}" (id ${added.organisationId}), admin ${adminEmail} invited`];
    } finally {
      await ctx.close();
    }
  });

  await step("invitation accepted", async () => {
    const mail = await until(
      "the invitation e-mail in the mail catcher",
      async () => {
        const res = await fetch(`${mailUrl}/email?to.address=${encodeURIComponent(adminEmail)}`);
        const list = (await res.json()) as { text?: string; subject: string }[];
        return list.find((m) => /\/invitation\/[A-Za-z0-9_-]{43}/.test(m.text ?? ""));
      },
      // The outbox sends oldest first, across landlords: behind a backlog of other e-mails this takes longer.
      300_000,
    );
    const token = /\/invitation\/([A-Za-z0-9_-]{43})/.exec(mail.text!)![1]!;
    const anon = new Session(base);
    const csrf = await fetch(`${base}/api/auth/csrf`);
    anon.cookie =
      csrf.headers
        .getSetCookie()
        .find((c) => c.startsWith("dewline.sid="))
        ?.split(";")[0] ?? "";
    anon.csrf = ((await csrf.json()) as { csrfToken: string }).csrfToken;
    const who = await json<{ organisationName: string }>(
      await anon.request("GET", `/api/auth/invitations/${token}`),
      200,
      "the invitation",
    );
    if (who.organisationName !== landlordName) throw new Error(`the invitation names "${who.organisationName}"`);
    await ok(await anon.request("POST", "/api/auth/invitations/accept", { token, password }), 204, "accepting the invitation");
    return [undefined, `"${mail.subject}"`];
  });

  const admin = await step("signed in", async () => {
    const s = await Session.signIn(base, adminEmail, password);
    const me = await json<{ organisationId: number; role: string }>(await s.request("GET", "/api/auth/me"), 200, "me");
    if (me.organisationId !== landlord.organisationId || me.role !== "admin")
      throw new Error(`signed in as ${JSON.stringify(me)}`);
    const homes = await json<Page>(await s.request("GET", "/api/properties?pageSize=1"), 200, "homes");
    return [s, `admin of landlord ${me.organisationId}, ${homes.total} homes so far`];
  });

  const register = path.join(work, "register.csv");
  const mapping = await step("register previewed", async () => {
    const bytes = writeRegister(register, HOMES, 13);
    const preview = await json<{ mapping: Record<string, number>; missing: string[]; headers: string[] }>(
      await upload(admin, "/api/stock-imports/preview", register, "register.csv"),
      200,
      "register preview",
    );
    if (preview.missing.length) throw new Error(`the preview still needs: ${preview.missing.join(", ")}`);
    return [
      preview.mapping,
      `${n(HOMES)} homes, ${(bytes / 1e6).toFixed(1)} MB, ${Object.keys(preview.mapping).length} columns mapped`,
    ];
  });

  await step("register imported", async () => {
    const result = await json<{ created: number; updated: number; unchanged: number; refused: number }>(
      await upload(admin, "/api/stock-imports", register, "register.csv", mapping),
      201,
      "register import",
    );
    if (result.created !== HOMES) throw new Error(`created ${result.created} of ${HOMES}: ${JSON.stringify(result)}`);
    return [undefined, `${n(result.created)} created, ${result.refused} refused`];
  });

  const tenancyFiles = writeTenancyFiles(values.split ? TENANCIES_PER_FILE : HOMES);
  const tenancyMapping = await step("tenancies previewed", async () => {
    const preview = await json<{ mapping: Record<string, number | null>; missing: string[]; rows: number }>(
      await upload(admin, "/api/tenancy-imports/preview", tenancyFiles[0]!, "tenancies-1.csv"),
      200,
      "tenancy preview",
    );
    if (preview.missing.length) throw new Error(`the preview still needs: ${preview.missing.join(", ")}`);
    return [preview.mapping, `${n(HOMES)} tenancies in ${tenancyFiles.length} file(s); first file ${n(preview.rows)} rows`];
  });

  const batches = await step("tenancies imported", async () => {
    let created = 0;
    let rejected = 0;
    const ids: number[] = [];
    for (const [i, file] of tenancyFiles.entries()) {
      const result = await json<{ id: number; created: number; rejected: number; invitations: { total: number } | null }>(
        await upload(admin, "/api/tenancy-imports", file, `tenancies-${i + 1}.csv`, tenancyMapping),
        201,
        `tenancy import of file ${i + 1}`,
      );
      created += result.created;
      rejected += result.rejected;
      ids.push(result.id);
    }
    if (created !== HOMES) throw new Error(`created ${created} of ${HOMES} tenancies (${rejected} rejected)`);
    return [ids, `${n(created)} created, ${rejected} rejected, invitations queued`];
  });

  await step("invitations sending", async () => {
    type Progress = { total: number; sent: number; pending: number; state: string; nextReleaseAt: string | null };
    const progress = async () => {
      const list = await json<{ items: { id: number; invitations: Progress | null }[] }>(
        await admin.request("GET", "/api/tenancy-imports"),
        200,
        "tenancy imports",
      );
      const mine = list.items.filter((item) => batches.includes(item.id)).map((item) => item.invitations!);
      return mine.reduce((a, p) => ({ total: a.total + p.total, sent: a.sent + p.sent, pending: a.pending + p.pending }), {
        total: 0,
        sent: 0,
        pending: 0,
      });
    };
    const first = await progress();
    // The background tick releases INVITATIONS_PER_BATCH every INVITATION_BATCH_INTERVAL_MS, oldest first across
    // landlords: wait a while for the first of these, and say so if other landlords' queued ones still go first.
    const later = await until(
      "the first invitations to be sent",
      async () => {
        const p = await progress();
        return p.sent > 0 ? p : undefined;
      },
      Number(values["invitation-wait"]) * 1000,
      1000,
    ).catch(() => undefined);
    return [
      undefined,
      `${n(first.total)} queued, ${n(first.sent)} sent at first; ` +
        (later
          ? `then ${n(later.sent)} of ${n(later.total)} sent, ${n(later.pending)} pending`
          : `none sent within ${values["invitation-wait"]} s (invitations queued earlier, by any landlord, go first)`),
    ];
  });

  const key = await step("API key created", async () => {
    const created = await json<{ secret: string }>(
      await admin.request("POST", "/api/integrations/api-keys", {
        name: "Walk housing system",
        scopes: ["homes:read", "cases:read", "cases:write"],
      }),
      201,
      "API key",
    );
    return [created.secret, "scopes homes:read, cases:read, cases:write"];
  });
  const withKey = (method: string, urlPath: string, body?: unknown) =>
    fetch(`${base}${urlPath}`, {
      method,
      headers: { authorization: `Bearer ${key}`, ...(body ? { "content-type": "application/json" } : {}) },
      body: body ? JSON.stringify(body) : undefined,
    });

  const firstHome = await step("homes read by key", async () => {
    const page = await json<Page>(await withKey("GET", "/api/v1/homes?pageSize=5"), 200, "GET /api/v1/homes");
    if (page.total !== HOMES) throw new Error(`the key sees ${page.total} homes`);
    return [page.items[0]!.id, `${n(page.total)} homes, first page of ${page.items.length}`];
  });

  const receiver = await startReceiver();
  try {
    const secret = await step("webhook registered", async () => {
      const created = await json<{ secret: string; endpoint: { id: number } }>(
        await admin.request("POST", "/api/webhooks", {
          url: receiver.url,
          description: "Walk receiver",
          eventTypes: ["case.created"],
        }),
        201,
        "webhook endpoint",
      );
      return [created.secret, `endpoint ${created.endpoint.id} → ${receiver.url}`];
    });

    await step("case by key delivered", async () => {
      const c = await json<{ id: number; reference: string }>(
        await withKey("POST", "/api/v1/cases", {
          propertyId: firstHome,
          channel: "email",
          awareAt: new Date().toISOString(),
          description: "Logged by the walk through the API: black spots on the bedroom ceiling.",
          locations: ["ceiling"],
          observations: ["mould-spots"],
        }),
        201,
        "POST /api/v1/cases",
      );
      const t0 = performance.now();
      const hook = await until(
        "the webhook delivery",
        async () => receiver.hooks.find((h) => h.eventType === "case.created" && h.body.includes(c.reference)),
        120_000,
        100,
      );
      if (!signedWith(secret, hook)) throw new Error("the delivery's signature does not verify with the endpoint's secret");
      return [
        undefined,
        `case ${c.reference}: case.created received ${((performance.now() - t0) / 1000).toFixed(1)} s later, signature verified`,
      ];
    });
  } finally {
    await receiver.close();
  }
  // Last, so the cases export holds the case the key created.
  for (const [table, list, exportPath] of [
    ["homes", "/api/properties?pageSize=1", "/api/properties/export"],
    ["people", "/api/users?pageSize=1", "/api/users/export"],
    ["cases", "/api/cases?pageSize=1", "/api/cases/export"],
    ["work orders", "/api/work-orders?pageSize=1", "/api/work-orders/export"],
  ] as const) {
    for (const format of ["csv", "xlsx"] as const) {
      await step(`export ${table} ${format}`, async () => {
        const { total } = await json<Page>(await admin.request("GET", list), 200, `${table} list`);
        const res = await ok(
          await admin.request("GET", `${exportPath}?format=${format}`, undefined, 600_000),
          200,
          `${table} export`,
        );
        const rows = format === "csv" ? await csvRows(res.body!) : await xlsxRows(res.body!);
        if (rows !== total) throw new Error(`${rows} rows exported, the list says ${total}`);
        return [undefined, `${n(rows)} rows (= the list's total)`];
      });
    }
  }

  console.log(`Walk done in ${((performance.now() - started) / 1000).toFixed(1)} s. Admin: ${adminEmail} / ${password}`);
} catch {
  process.exitCode = 1;
} finally {
  if (values.keep) console.log(`Files kept in ${work}`);
  else rmSync(work, { recursive: true, force: true });
}
