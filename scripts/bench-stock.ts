// Stock import benchmark (`npm run bench:stock`), on a throwaway MariaDB:
//  1. a child process generates a 100 000-home asset register (scripts/lib/stock-register.ts) in a
//     housing system's wording, beside it the same homes already converted to the `properties`
//     columns, and the register again with 1 % of the homes changed (their glazing);
//  2. MariaDB's own LOAD DATA LOCAL INFILE of those converted rows into `properties` (for a second
//     landlord, so the UPRNs do not collide) — only the statement is timed, run before and after ours,
//     the faster kept, each into a table holding the same number of rows;
//  3. StockImportService.import of the register in a child process of its own, compiled as production
//     runs it (the server is built first; `node dist-server/server/import-stock.js --json`, the
//     `npm run stock:import` command) — the whole call: reading, mapping, vocabulary, checks, LOAD DATA
//     of the new homes, the report, the commit — with that process's peak RSS
//     (process.resourceUsage().maxRSS), so the figure is the import's alone, not tsx's or the bench's;
//  4. the re-import of the 1 %-changed register, likewise in a child process.
// Targets: ours ≥ 80 % of LOAD DATA's rows/s; peak RSS < 300 MB. Rooms are left out of the register,
// since LOAD DATA of one table could not be compared with them.
import { spawn } from "node:child_process";
import { closeSync, openSync, writeSync } from "node:fs";
import path from "node:path";
import { performance } from "node:perf_hooks";
import { fileURLToPath } from "node:url";
import type mysql from "mysql2/promise";
import type { StockImportRun } from "../server/import-stock.js";
import { startBenchDatabase, type BenchDatabase } from "./lib/bench-database.js";
import { Organisation } from "../server/modules/organisations/organisation.entity.js";
import { User } from "../server/modules/users/user.entity.js";
import { convertStockRow, proposeStockMapping } from "../src/lib/domain/stock-register.js";
import { loadDataConnection } from "./lib/mariadb.js";
import { REGISTER_HEADER, writeRegister } from "./lib/stock-register.js";

const ROWS = Number(process.env.STOCK_ROWS ?? 100_000);
const SEED = 13;
const MB = 1024 * 1024;
const fmt = (x: number) => Math.round(x).toLocaleString("en-GB");

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");

/** Builds the server as `npm start` does (tsc → dist-server), so the import runs compiled, as in production. */
function buildServer(): Promise<void> {
  return new Promise((resolve, reject) => {
    const proc = spawn(process.execPath, ["node_modules/typescript/bin/tsc", "-p", "server/tsconfig.build.json"], {
      cwd: root,
      stdio: "inherit",
    });
    proc.on("error", reject);
    proc.on("exit", (code) => (code === 0 ? resolve() : reject(new Error(`building the server failed (${code})`))));
  });
}

/** One import by the built `import-stock` command in a process of its own; its JSON answer. */
function runImport(db: BenchDatabase["db"], adminEmail: string, file: string): Promise<StockImportRun> {
  return new Promise((resolve, reject) => {
    // STOCK_CPU_PROF=<folder> writes a CPU profile of each import there (open it in Chrome's DevTools).
    const profile = process.env.STOCK_CPU_PROF ? ["--cpu-prof", `--cpu-prof-dir=${process.env.STOCK_CPU_PROF}`] : [];
    const proc = spawn(
      process.execPath,
      [...profile, "dist-server/server/import-stock.js", "--admin-email", adminEmail, "--file", file, "--json"],
      {
        cwd: root,
        stdio: ["ignore", "pipe", "inherit"],
        env: {
          ...process.env,
          NODE_ENV: "development",
          DB_HOST: db.host,
          DB_PORT: String(db.port),
          DB_NAME: db.name,
          DB_USER: db.user,
          DB_PASSWORD: db.password,
          // Generous: on a busy machine the database watch would otherwise call a slow answer a stall.
          DB_STALL_CHECK_MS: "5000",
          DB_QUERY_TIMEOUT_MS: "300000",
          DB_ACQUIRE_TIMEOUT_MS: "60000",
          DB_CONNECT_TIMEOUT_MS: "10000",
        },
      },
    );
    let out = "";
    proc.stdout.setEncoding("utf8").on("data", (d: string) => (out += d));
    proc.on("error", reject);
    proc.on("exit", (code) => {
      const last = out.trim().split("\n").pop() ?? "";
      if (code === 0) resolve(JSON.parse(last) as StockImportRun);
      else reject(new Error(`the import exited with ${code}: ${out}`));
    });
  });
}

/** Runs this script again as a child (`mode` and a JSON argument); its last line of output is its JSON answer. */
function child<T>(mode: string, arg: unknown): Promise<T> {
  return new Promise((resolve, reject) => {
    const proc = spawn(process.execPath, [...process.execArgv, fileURLToPath(import.meta.url), mode, JSON.stringify(arg)], {
      stdio: ["ignore", "pipe", "inherit"],
    });
    let out = "";
    proc.stdout.setEncoding("utf8").on("data", (d: string) => (out += d));
    proc.on("error", reject);
    proc.on("exit", (code) => {
      const last = out.trim().split("\n").pop() ?? "";
      if (code === 0) resolve(JSON.parse(last) as T);
      else reject(new Error(`bench child "${mode}" exited with ${code}: ${out}`));
    });
  });
}

const LOAD_COLUMNS = [
  "organisation_id",
  "address_line1",
  "address_line2",
  "town",
  "postcode",
  "uprn",
  "estate",
  "block",
  "built_form",
  "wall_type",
  "glazing_type",
  "heating_type",
  "ventilation",
  "built_year",
  "age_band",
  "wall_insulation",
  "roof_insulation_mm",
  "heating_fuel",
  "has_extract_fans",
  "has_trickle_vents",
  "floor_area_m2",
  "epc_band",
];

async function main(): Promise<void> {
  const building = buildServer();
  const bench = await startBenchDatabase("stock");
  const { dir, db, ds } = bench;
  let loader: mysql.Connection | undefined;
  try {
    const ours = await ds.getRepository(Organisation).save({ name: "Bench Homes" });
    const theirs = await ds.getRepository(Organisation).save({ name: "Load Data Homes" });
    const admin = await ds.getRepository(User).save(
      ds.getRepository(User).create({
        organisationId: ours.id,
        email: "admin@bench.example",
        name: "Bench admin",
        role: "admin",
        status: "active",
        passwordHash: null,
      }),
    );

    // The register, the same homes converted for LOAD DATA, and the 1 %-changed register: in a child.
    const t0 = performance.now();
    const register = path.join(dir, "register.csv");
    const loadFile = path.join(dir, "load-data.tsv");
    const changedRegister = path.join(dir, "register-1pc-changed.csv");
    const bytes = await child<number>("generate", { register, loadFile, changedRegister, loadOrg: theirs.id });
    console.log(
      `Stock import benchmark — ${fmt(ROWS)} homes, ${(bytes / MB).toFixed(1)} MB of register CSV (the three files written in ${((performance.now() - t0) / 1000).toFixed(1)} s, in a child process)`,
    );

    await building;
    loader = await loadDataConnection(db);
    // The database's own speed: its LOAD DATA leaves the homes' search pieces to the background catch-up,
    // as the stock import does (migration HomeSearchPieces: no trigger work per home).
    await loader.query("SET @dewline_bulk_homes = 1");
    const loadData = async () => {
      await loader!.query("DELETE FROM properties WHERE organisation_id = ?", [theirs.id]);
      const start = performance.now();
      const [result] = await loader!.query({
        sql: `LOAD DATA LOCAL INFILE ? INTO TABLE properties FIELDS TERMINATED BY '\\t' LINES TERMINATED BY '\\n' (${LOAD_COLUMNS.join(", ")})`,
        values: [loadFile],
      });
      const ms = performance.now() - start;
      await loader!.query("DELETE FROM properties WHERE organisation_id = ?", [theirs.id]);
      return { ms, rows: (result as { affectedRows: number }).affectedRows };
    };

    // Each timed step starts once InnoDB has purged what the steps before it deleted: the DELETE of
    // LOAD DATA's 100 000 homes left their index entries to the purge threads, which otherwise ran
    // beside the next step (on 2 cores, beside the import's parsing and its own LOAD DATA).
    const purged = async () => {
      const start = performance.now();
      for (;;) {
        const [rows] = await loader!.query("SHOW GLOBAL STATUS LIKE 'Innodb_history_list_length'");
        if (!(Number((rows as { Value?: string }[])[0]?.Value) > 0) || performance.now() - start > 60_000) return;
        await new Promise((resolve) => setTimeout(resolve, 100));
      }
    };

    // LOAD DATA into an empty table, then ours into an empty table; LOAD DATA again beside our homes
    // is slower (a larger table), so the faster run is the one compared.
    await purged();
    const loadBefore = await loadData();
    await purged();
    const first = await runImport(db, admin.email, register);
    await purged();
    const loadAfter = await loadData();
    await purged();
    const load = loadBefore.ms <= loadAfter.ms ? loadBefore : loadAfter;
    const oursRate = (ROWS / first.ms) * 1000;
    const loadRate = (ROWS / load.ms) * 1000;
    const ratio = oursRate / loadRate;
    const r = first;
    console.log(
      `  StockImportService.import     ${(first.ms / 1000).toFixed(2).padStart(6)} s   ${fmt(oursRate).padStart(9)} rows/s   ` +
        `(created ${fmt(r.created)}, updated ${r.updated}, unchanged ${r.unchanged}, refused ${r.refused}; Node CPU ${(r.cpuMs / 1000).toFixed(2)} s)`,
    );
    console.log(
      `  LOAD DATA LOCAL INFILE        ${(load.ms / 1000).toFixed(2).padStart(6)} s   ${fmt(loadRate).padStart(9)} rows/s   ` +
        `(the statement alone, pre-converted rows; faster of ${(loadBefore.ms / 1000).toFixed(2)} s into an empty table and ${(loadAfter.ms / 1000).toFixed(2)} s beside our homes; ${fmt(load.rows)} rows)`,
    );
    console.log(
      `  ratio ours / LOAD DATA        ${(ratio * 100).toFixed(0)} %   (target ≥ 80 %) ${ratio >= 0.8 ? "PASS" : "FAIL"}`,
    );

    const again = await runImport(db, admin.email, changedRegister);
    console.log(
      `  re-import, 1 % changed        ${(again.ms / 1000).toFixed(2).padStart(6)} s   ${fmt((ROWS / again.ms) * 1000).padStart(9)} rows/s   ` +
        `(created ${again.created}, updated ${fmt(again.updated)}, unchanged ${fmt(again.unchanged)}, refused ${again.refused}; Node CPU ${(again.cpuMs / 1000).toFixed(2)} s)`,
    );
    const [{ n }] = await ds.query("SELECT COUNT(*) AS n FROM properties WHERE organisation_id = ?", [ours.id]);
    console.log(`  homes of the landlord after both imports: ${fmt(Number(n))}`);
    const rssOk = Math.max(first.maxRssMb, again.maxRssMb) < 300;
    console.log(
      `  peak RSS of the import        ${first.maxRssMb.toFixed(0)} MB first import, ${again.maxRssMb.toFixed(0)} MB re-import (each in a process of its own, ${first.baseRssMb.toFixed(0)} and ${again.baseRssMb.toFixed(0)} MB of it before the import began: Node and the app's modules)   (target < 300 MB) ${rssOk ? "PASS" : "FAIL"}`,
    );
    if (ratio < 0.8 || !rssOk || again.updated !== ROWS / 100 || Number(n) !== ROWS) process.exitCode = 1;
  } finally {
    await loader?.end().catch(() => undefined);
    await bench.stop();
  }
}

/** Child: the three files; answers the register's size in bytes. */
function generateChild(job: { register: string; loadFile: string; changedRegister: string; loadOrg: number }): number {
  const mapping = proposeStockMapping(REGISTER_HEADER);
  const fd = openSync(job.loadFile, "w");
  let lines: string[] = [];
  const year = new Date().getUTCFullYear();
  const v = (x: unknown) => (x === null || x === undefined ? "\\N" : x === true ? "1" : x === false ? "0" : String(x));
  const bytes = writeRegister(job.register, ROWS, SEED, {
    each: (cells) => {
      const row = convertStockRow(cells, mapping, REGISTER_HEADER, year);
      if (!row.ok) throw new Error(`generated row refused: ${row.reasons.join(" ")}`);
      const h = row.home;
      lines.push(
        [
          job.loadOrg,
          h.addressLine1,
          h.addressLine2,
          h.town,
          h.postcode,
          h.uprn,
          h.estate,
          h.block,
          h.builtForm,
          h.wallType,
          h.glazingType,
          h.heatingType,
          h.ventilation ?? "not-recorded",
          h.builtYear,
          h.ageBand,
          h.wallInsulation,
          h.roofInsulationMm,
          h.heatingFuel,
          h.hasExtractFans,
          h.hasTrickleVents,
          h.floorAreaM2,
          h.epcBand,
        ]
          .map(v)
          .join("\t"),
      );
      if (lines.length >= 5_000) {
        writeSync(fd, lines.join("\n") + "\n");
        lines = [];
      }
    },
  });
  if (lines.length) writeSync(fd, lines.join("\n") + "\n");
  closeSync(fd);
  writeRegister(job.changedRegister, ROWS, SEED, { changeEvery: 100 });
  return bytes;
}

const [mode, arg] = process.argv.slice(2);
if (mode === "generate") console.log(JSON.stringify(generateChild(JSON.parse(arg!) as Parameters<typeof generateChild>[0])));
else await main();
