// Export benchmark (`npm run bench:export`), on a throwaway MariaDB: 100 000 homes (one INSERT … SELECT
// from MariaDB's sequence engine), then GET /api/properties/export as CSV and as .xlsx through the
// real app, listening on a loopback port, downloaded by fetch in the same process and thrown away as
// it arrives. Prints the time, the size and the process's peak RSS during each download (sampled
// every 20 ms, and the kernel's lifetime maximum). Target: peak RSS < 300 MB.
import { mkdtempSync, rmSync } from "node:fs";
import type { AddressInfo } from "node:net";
import { tmpdir } from "node:os";
import path from "node:path";
import { performance } from "node:perf_hooks";
import type { DataSource } from "typeorm";
import { createApp } from "../server/app.js";
import { createAppContext, type AppContext } from "../server/app-context.js";
import { loadConfig } from "../server/config/env.js";
import { createDataSource } from "../server/db/create-data-source.js";
import { hashPassword } from "../server/modules/auth/passwords.js";
import { Organisation } from "../server/modules/organisations/organisation.entity.js";
import { User } from "../server/modules/users/user.entity.js";
import { ensureAppDatabase, freePort, startMariaDb, stopMariaDb } from "./lib/mariadb.js";

const HOMES = 100_000;
const MB = 1024 * 1024;
const PASSWORD = "bench-export-password";

async function seed(ds: DataSource): Promise<string> {
  const org = await ds.getRepository(Organisation).save({ name: "Bench Homes" });
  const admin = await ds.getRepository(User).save(
    ds.getRepository(User).create({
      organisationId: org.id,
      email: "admin@bench.example",
      name: "Bench Admin",
      role: "admin",
      status: "active",
      passwordHash: await hashPassword(PASSWORD),
    }),
  );
  await ds.query(
    `INSERT INTO properties (organisation_id, address_line1, address_line2, town, postcode, uprn, estate, block,
                             built_form, wall_type, glazing_type, heating_type, ventilation)
     SELECT ?, CONCAT('Flat ', seq MOD 40 + 1, ', ', seq DIV 40 + 1, ' Heron Walk'), NULL, 'Testford',
            CONCAT('ZX', seq MOD 9 + 1, ' ', seq MOD 10, 'AB'), LPAD(seq, 12, '0'), CONCAT('Estate ', seq MOD 50),
            CONCAT('Block ', seq DIV 40 + 1), 'flat', 'filled-cavity', 'modern-double', 'gas-boiler', 'extract-fans'
     FROM seq_1_to_${HOMES}`,
    [org.id],
  );
  return admin.email;
}

async function signIn(url: string, email: string): Promise<string> {
  const cookieOf = (res: Response) =>
    res.headers
      .getSetCookie()
      .map((c) => c.split(";")[0]!)
      .find((c) => c.startsWith("dewline.sid="));
  const first = await fetch(`${url}/api/auth/csrf`);
  const { csrfToken } = (await first.json()) as { csrfToken: string };
  const res = await fetch(`${url}/api/auth/login`, {
    method: "POST",
    headers: { "content-type": "application/json", "x-csrf-token": csrfToken, cookie: cookieOf(first) ?? "" },
    body: JSON.stringify({ email, password: PASSWORD }),
  });
  const cookie = cookieOf(res);
  if (res.status !== 200 || !cookie) throw new Error(`Sign-in failed: ${res.status} ${await res.text()}`);
  return cookie;
}

async function download(url: string, cookie: string) {
  let peak = process.memoryUsage().rss;
  const timer = setInterval(() => {
    peak = Math.max(peak, process.memoryUsage().rss);
  }, 20);
  try {
    const start = performance.now();
    const res = await fetch(url, { headers: { cookie } });
    if (res.status !== 200 || !res.body) throw new Error(`Export failed: ${res.status} ${await res.text()}`);
    let bytes = 0;
    let firstByteMs = 0;
    for await (const chunk of res.body) {
      if (!bytes) firstByteMs = performance.now() - start;
      bytes += (chunk as Uint8Array).byteLength;
    }
    return { ms: performance.now() - start, firstByteMs, bytes, peakMb: Math.max(peak, process.memoryUsage().rss) / MB };
  } finally {
    clearInterval(timer);
  }
}

async function main(): Promise<void> {
  const dir = mkdtempSync(path.join(tmpdir(), "dewline-bench-export-"));
  const instance = { dir: path.join(dir, "mariadb"), port: await freePort() };
  const db = { host: "127.0.0.1", port: instance.port, name: "dewline_bench", user: "dewline_bench", password: "bench-only" };
  let ds: DataSource | undefined;
  let ctx: AppContext | undefined;
  let server: ReturnType<ReturnType<typeof createApp>["listen"]> | undefined;
  try {
    await startMariaDb(instance);
    await ensureAppDatabase(instance, db);
    ds = createDataSource(db);
    await ds.initialize();
    await ds.runMigrations({ transaction: "each" });
    const t0 = performance.now();
    const email = await seed(ds);
    await ds.destroy();
    ds = undefined;
    console.log(
      `Export benchmark — ${HOMES.toLocaleString("en-GB")} homes (inserted in ${((performance.now() - t0) / 1000).toFixed(1)} s)`,
    );

    const config = loadConfig({
      ...process.env,
      NODE_ENV: "test",
      LOG_LEVEL: "error",
      DB_HOST: db.host,
      DB_PORT: String(db.port),
      DB_NAME: db.name,
      DB_USER: db.user,
      DB_PASSWORD: db.password,
    });
    ctx = await createAppContext(config);
    server = createApp(ctx).listen(0, "127.0.0.1");
    await new Promise((r) => server!.once("listening", r));
    const url = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
    const cookie = await signIn(url, email);
    global.gc?.();
    console.log(
      `  RSS before the exports: ${(process.memoryUsage().rss / MB).toFixed(0)} MB (app, database pool and this client)`,
    );

    for (const format of ["csv", "xlsx"] as const) {
      const r = await download(`${url}/api/properties/export?format=${format}`, cookie);
      console.log(
        `  ${format.padEnd(4)} ${(r.ms / 1000).toFixed(2).padStart(6)} s   first bytes after ${r.firstByteMs.toFixed(0).padStart(4)} ms   ` +
          `${(r.bytes / MB).toFixed(1).padStart(5)} MB   ${Math.round((HOMES / r.ms) * 1000).toLocaleString("en-GB")} rows/s   ` +
          `peak RSS ${r.peakMb.toFixed(0)} MB (target < 300 MB)`,
      );
    }
    console.log(`  Lifetime maximum RSS of this process (kernel): ${(process.resourceUsage().maxRSS / 1024).toFixed(0)} MB`);
  } finally {
    if (server) {
      server.closeAllConnections();
      await new Promise((r) => server!.close(r));
    }
    await ctx?.close();
    await ds?.destroy().catch(() => undefined);
    await stopMariaDb(instance.dir).catch(() => undefined);
    rmSync(dir, { recursive: true, force: true });
  }
}

main().catch((error: unknown) => {
  console.error(error);
  process.exitCode = 1;
});
