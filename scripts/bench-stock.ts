// Stock import benchmark (`npm run bench:stock`), on a throwaway MariaDB:
//  1. generates a 100 000-home asset register (scripts/lib/stock-register.ts) in a housing system's
//     wording, and beside it the same homes already converted to the `properties` columns;
//  2. MariaDB's own LOAD DATA LOCAL INFILE of those converted rows into `properties` (for a second
//     landlord, so the UPRNs do not collide) — only the statement is timed, run before and after ours,
//     the faster kept, each into a table holding the same number of rows;
//  3. StockImportService.import of the register — the whole call: reading, mapping, vocabulary,
//     checks, the upsert batches, the report, the commit — with this process's peak RSS;
//  4. a re-import of the register with 1 % of the homes changed (their glazing).
// Targets: ours ≥ 80 % of LOAD DATA's rows/s; peak RSS < 300 MB. Rooms are left out of the register,
// since LOAD DATA of one table could not be compared with them.
import { closeSync, mkdtempSync, openSync, rmSync, writeSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { performance } from "node:perf_hooks";
import type mysql from "mysql2/promise";
import type { DataSource } from "typeorm";
import { createServices } from "../server/app-context.js";
import { loadConfig } from "../server/config/env.js";
import { createDataSource } from "../server/db/create-data-source.js";
import { createLogger } from "../server/lib/logger.js";
import { createMailer } from "../server/lib/mailer.js";
import { Organisation } from "../server/modules/organisations/organisation.entity.js";
import { User } from "../server/modules/users/user.entity.js";
import { convertStockRow, proposeStockMapping } from "../src/lib/domain/stock-register.js";
import { ensureAppDatabase, freePort, loadDataConnection, startMariaDb, stopMariaDb } from "./lib/mariadb.js";
import { REGISTER_HEADER, writeRegister } from "./lib/stock-register.js";

const ROWS = Number(process.env.STOCK_ROWS ?? 100_000);
const SEED = 13;
const MB = 1024 * 1024;
const fmt = (x: number) => Math.round(x).toLocaleString("en-GB");

/** Peak RSS while `run` runs, sampled every 20 ms, and the process's lifetime maximum after it. */
async function withRss<T>(run: () => Promise<T>): Promise<{ result: T; sampledPeakMb: number; maxRssMb: number }> {
  let peak = process.memoryUsage().rss;
  const timer = setInterval(() => {
    peak = Math.max(peak, process.memoryUsage().rss);
  }, 20);
  try {
    const result = await run();
    peak = Math.max(peak, process.memoryUsage().rss);
    return { result, sampledPeakMb: peak / MB, maxRssMb: process.resourceUsage().maxRSS / 1024 };
  } finally {
    clearInterval(timer);
  }
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
  const dir = mkdtempSync(path.join(tmpdir(), "dewline-bench-stock-"));
  const instance = { dir: path.join(dir, "mariadb"), port: await freePort() };
  const db = { host: "127.0.0.1", port: instance.port, name: "dewline_bench", user: "dewline_bench", password: "bench-only" };
  let ds: DataSource | undefined;
  let loader: mysql.Connection | undefined;
  try {
    await startMariaDb(instance);
    await ensureAppDatabase(instance, db);
    ds = createDataSource(db);
    await ds.initialize();
    await ds.runMigrations({ transaction: "each" });
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

    // The register, and the same homes converted for LOAD DATA (tab-separated, \N for NULL).
    const t0 = performance.now();
    const register = path.join(dir, "register.csv");
    const loadFile = path.join(dir, "load-data.tsv");
    const mapping = proposeStockMapping(REGISTER_HEADER);
    const fd = openSync(loadFile, "w");
    let lines: string[] = [];
    const year = new Date().getUTCFullYear();
    const bytes = writeRegister(register, ROWS, SEED, {
      each: (cells) => {
        const row = convertStockRow(cells, mapping, REGISTER_HEADER, year);
        if (!row.ok) throw new Error(`generated row refused: ${row.reasons.join(" ")}`);
        const h = row.home;
        const v = (x: unknown) => (x === null || x === undefined ? "\\N" : x === true ? "1" : x === false ? "0" : String(x));
        lines.push(
          [
            theirs.id,
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
    const changedRegister = path.join(dir, "register-1pc-changed.csv");
    writeRegister(changedRegister, ROWS, SEED, { changeEvery: 100 });
    console.log(
      `Stock import benchmark — ${fmt(ROWS)} homes, ${(bytes / MB).toFixed(1)} MB of register CSV (both files written in ${((performance.now() - t0) / 1000).toFixed(1)} s)`,
    );

    loader = await loadDataConnection(db);
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

    // LOAD DATA into an empty table, then ours into an empty table; LOAD DATA again beside our homes
    // is slower (a larger table), so the faster run is the one compared.
    const loadBefore = await loadData();
    const config = loadConfig({ ...process.env, NODE_ENV: "test" });
    const service = createServices(config, ds, createMailer(config), createLogger("silent")).stock;
    const actor = { id: admin.id, email: admin.email, name: admin.name, role: "admin" as const, organisationId: ours.id };
    const rssBefore = process.memoryUsage().rss / MB;
    const first = await withRss(async () => {
      const start = performance.now();
      const r = await service.import(actor, { filePath: register, fileName: "register.csv" });
      return { r, ms: performance.now() - start };
    });
    const loadAfter = await loadData();
    const load = loadBefore.ms <= loadAfter.ms ? loadBefore : loadAfter;
    const oursRate = (ROWS / first.result.ms) * 1000;
    const loadRate = (ROWS / load.ms) * 1000;
    const ratio = oursRate / loadRate;
    const { r } = first.result;
    console.log(
      `  StockImportService.import     ${(first.result.ms / 1000).toFixed(2).padStart(6)} s   ${fmt(oursRate).padStart(9)} rows/s   ` +
        `(created ${fmt(r.created)}, updated ${r.updated}, unchanged ${r.unchanged}, refused ${r.refused})`,
    );
    console.log(
      `  LOAD DATA LOCAL INFILE        ${(load.ms / 1000).toFixed(2).padStart(6)} s   ${fmt(loadRate).padStart(9)} rows/s   ` +
        `(the statement alone, pre-converted rows; faster of ${(loadBefore.ms / 1000).toFixed(2)} s into an empty table and ${(loadAfter.ms / 1000).toFixed(2)} s beside our homes; ${fmt(load.rows)} rows)`,
    );
    console.log(
      `  ratio ours / LOAD DATA        ${(ratio * 100).toFixed(0)} %   (target ≥ 80 %) ${ratio >= 0.8 ? "PASS" : "FAIL"}`,
    );

    const again = await withRss(async () => {
      const start = performance.now();
      const r2 = await service.import(actor, { filePath: changedRegister, fileName: "register-1pc-changed.csv" });
      return { r: r2, ms: performance.now() - start };
    });
    console.log(
      `  re-import, 1 % changed        ${(again.result.ms / 1000).toFixed(2).padStart(6)} s   ${fmt((ROWS / again.result.ms) * 1000).padStart(9)} rows/s   ` +
        `(created ${again.result.r.created}, updated ${fmt(again.result.r.updated)}, unchanged ${fmt(again.result.r.unchanged)}, refused ${again.result.r.refused})`,
    );
    const [{ n }] = await ds.query("SELECT COUNT(*) AS n FROM properties WHERE organisation_id = ?", [ours.id]);
    console.log(`  homes of the landlord after both imports: ${fmt(Number(n))}`);
    const rssOk = again.maxRssMb < 300;
    console.log(
      `  peak RSS of this process      ${again.maxRssMb.toFixed(0)} MB (process maximum over both imports; sampled during the first ${first.sampledPeakMb.toFixed(0)} MB, the re-import ${again.sampledPeakMb.toFixed(0)} MB, ${rssBefore.toFixed(0)} MB just before)   (target < 300 MB) ${rssOk ? "PASS" : "FAIL"}`,
    );
    if (ratio < 0.8 || !rssOk || again.result.r.updated !== ROWS / 100 || Number(n) !== ROWS) process.exitCode = 1;
  } finally {
    await loader?.end().catch(() => undefined);
    if (ds?.isInitialized) await ds.destroy().catch(() => undefined);
    await stopMariaDb(instance.dir).catch(() => undefined);
    rmSync(dir, { recursive: true, force: true });
  }
}

await main();
