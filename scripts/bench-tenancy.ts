// Tenancy import benchmark (`npm run bench:tenancy`), on a throwaway MariaDB:
//  1. a fresh landlord with TENANCY_ROWS homes (100 000 by default) put straight into `properties`
//     (one INSERT … SELECT over MariaDB's sequence engine: the homes are not what is measured);
//  2. a tenancy file of one tenancy per home (a new tenant each, every 20th tenancy already ended),
//     and the same file with 1 % of the rows changed (a new phone number);
//  3. TenancyImportService.import of the file — the whole call: reading, the row rules, the accounts,
//     tenancies and queued invitations, the report, the commit — in a child process of its own, so its
//     peak RSS is the import's alone (the child's getrusage maxRSS);
//  4. the re-import of the changed file, in another child.
// Prints rows/s of each and the peak RSS; exits 1 when an import's counts are not what the file says.
import { spawn } from "node:child_process";
import { writeFileSync } from "node:fs";
import path from "node:path";
import { performance } from "node:perf_hooks";
import { fileURLToPath } from "node:url";
import { createServices } from "../server/app-context.js";
import { loadConfig } from "../server/config/env.js";
import { createDataSource } from "../server/db/create-data-source.js";
import { startBenchDatabase } from "./lib/bench-database.js";
import { createLogger } from "../server/lib/logger.js";
import { createMailer } from "../server/lib/mailer.js";
import { Organisation } from "../server/modules/organisations/organisation.entity.js";
import { User } from "../server/modules/users/user.entity.js";

const ROWS = Number(process.env.TENANCY_ROWS ?? 100_000);
const MB = 1024 * 1024;
const UPRN_BASE = 100_000_000_000;
const fmt = (x: number) => Math.round(x).toLocaleString("en-GB");

interface Db {
  host: string;
  port: number;
  name: string;
  user: string;
  password: string;
}
interface ChildJob {
  db: Db;
  actor: { id: number; email: string; name: string; role: "admin"; organisationId: number };
  file: string;
}
interface ChildResult {
  ms: number;
  maxRssMb: number;
  /** The child's RSS just before the import (Node, tsx, TypeORM and the app's modules loaded). */
  rssBeforeMb: number;
  created: number;
  updated: number;
  unchanged: number;
  rejected: number;
  invitations: number;
}

/** The tenancy file: one row per home; `changeEvery` rows get a new phone number. */
function tenancyFile(rows: number, changeEvery = 0): string {
  const out = ["Tenancy reference,UPRN,Tenant name,Email,Mobile,Start date,End date,Language,Consent,Access needs"];
  for (let i = 1; i <= rows; i++) {
    const changed = changeEvery > 0 && i % changeEvery === 0;
    const phone = `07700${String(changed ? 900_000 + (i % 99_999) : i % 1_000_000).padStart(6, "0")}`;
    const ended = i % 20 === 0;
    out.push(
      [
        `BT-${String(i).padStart(6, "0")}`,
        String(UPRN_BASE + i),
        `Tenant ${i}`,
        `tenant${i}@bench.example`,
        phone,
        ended ? "2018-09-01" : "2023-04-01",
        ended ? "2020-08-31" : "",
        i % 7 === 0 ? "cy" : "en",
        i % 3 === 0 ? "yes" : "no",
        i % 3 === 0 ? "Step-free access" : "",
      ].join(","),
    );
  }
  return out.join("\n") + "\n";
}

/** In the child: one import, timed, with this process's own peak RSS. */
async function child(job: ChildJob): Promise<void> {
  const ds = createDataSource(job.db);
  await ds.initialize();
  try {
    const config = loadConfig({ ...process.env, NODE_ENV: "test" });
    const service = createServices(config, ds, createMailer(config), createLogger("silent")).tenancyImports;
    const rssBeforeMb = process.memoryUsage().rss / MB;
    const start = performance.now();
    const r = await service.import(job.actor, { path: job.file, fileName: path.basename(job.file) });
    const ms = performance.now() - start;
    const result: ChildResult = {
      ms,
      maxRssMb: process.resourceUsage().maxRSS / 1024,
      rssBeforeMb,
      created: r.created,
      updated: r.updated,
      unchanged: r.unchanged,
      rejected: r.rejected,
      invitations: r.invitations?.total ?? 0,
    };
    process.stdout.write(`\n${JSON.stringify(result)}\n`);
  } finally {
    await ds.destroy();
  }
}

function runChild(job: ChildJob): Promise<ChildResult> {
  return new Promise((resolve, reject) => {
    const p = spawn(process.execPath, [...process.execArgv, fileURLToPath(import.meta.url), "--child", JSON.stringify(job)], {
      stdio: ["ignore", "pipe", "inherit"],
    });
    let out = "";
    p.stdout.on("data", (d: Buffer) => (out += d.toString()));
    p.on("error", reject);
    p.on("exit", (code) => {
      const last = out.trim().split("\n").at(-1) ?? "";
      if (code !== 0) reject(new Error(`the import's child process exited with ${code}: ${last}`));
      else resolve(JSON.parse(last) as ChildResult);
    });
  });
}

async function main(): Promise<void> {
  const bench = await startBenchDatabase("tenancy");
  const { dir, db, ds } = bench;
  try {
    const org = await ds.getRepository(Organisation).save({ name: "Bench Lettings" });
    const admin = await ds.getRepository(User).save(
      ds.getRepository(User).create({
        organisationId: org.id,
        email: "admin@bench.example",
        name: "Bench admin",
        role: "admin",
        status: "active",
        passwordHash: null,
      }),
    );
    const t0 = performance.now();
    await ds.query(
      `INSERT INTO properties (organisation_id, address_line1, town, postcode, uprn, estate, built_form, wall_type, glazing_type, heating_type)
       SELECT ?, CONCAT(s.seq, ' Bench Street'), 'Benchford', 'ZX1 1AA', CAST(? + s.seq AS CHAR), 'Bench Estate', 'mid-terrace', 'solid-brick', 'double', 'gas-boiler'
         FROM seq_1_to_${ROWS} s`,
      [org.id, UPRN_BASE],
    );
    const file = path.join(dir, "tenancies.csv");
    const changed = path.join(dir, "tenancies-1pc-changed.csv");
    const text = tenancyFile(ROWS);
    writeFileSync(file, text);
    writeFileSync(changed, tenancyFile(ROWS, 100));
    console.log(
      `Tenancy import benchmark — ${fmt(ROWS)} homes and tenancies, ${(Buffer.byteLength(text) / MB).toFixed(1)} MB of CSV (homes and files ready in ${((performance.now() - t0) / 1000).toFixed(1)} s)`,
    );
    const actor = { id: admin.id, email: admin.email, name: admin.name, role: "admin" as const, organisationId: org.id };
    const line = (label: string, r: ChildResult) =>
      console.log(
        `  ${label.padEnd(28)} ${(r.ms / 1000).toFixed(2).padStart(7)} s ${fmt((ROWS / r.ms) * 1000).padStart(8)} rows/s   peak RSS ${r.maxRssMb.toFixed(0)} MB (${r.rssBeforeMb.toFixed(0)} MB before it)   ` +
          `(created ${fmt(r.created)}, updated ${fmt(r.updated)}, unchanged ${fmt(r.unchanged)}, rejected ${r.rejected}, invitations ${fmt(r.invitations)})`,
      );
    const first = await runChild({ db, actor, file });
    line("new tenancies", first);
    const again = await runChild({ db, actor, file: changed });
    line("re-import, 1 % changed", again);
    const [{ n }] = (await ds.query("SELECT COUNT(*) AS n FROM tenancies WHERE organisation_id = ?", [org.id])) as {
      n: string;
    }[];
    console.log(`  tenancies of the landlord after both imports: ${fmt(Number(n))}`);
    const invited = ROWS - Math.floor(ROWS / 20);
    if (
      first.created !== ROWS ||
      first.invitations !== invited ||
      again.updated !== Math.floor(ROWS / 100) ||
      again.unchanged !== ROWS - Math.floor(ROWS / 100) ||
      again.invitations !== 0 ||
      Number(n) !== ROWS
    )
      process.exitCode = 1;
  } finally {
    await bench.stop();
  }
}

if (process.argv[2] === "--child") await child(JSON.parse(process.argv[3]!) as ChildJob);
else await main();
