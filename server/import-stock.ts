// `npm run stock:import -- --admin-email ines@fenwold.example --file register.csv`: an asset register
// imported from the command line, for a register too large to upload from a browser or for a script.
// It runs the same StockImportService.import an admin's upload runs (the same checks, one transaction,
// the report kept with the import) as that admin, into their landlord's homes. Built, it runs as
// `node dist-server/server/import-stock.js …`, as production runs the server; `--json` answers one line
// of JSON with the outcome and this process's time, CPU time and peak memory (bench:stock reads it).
import { parseArgs } from "node:util";
import { performance } from "node:perf_hooks";
import path from "node:path";
import { createServices } from "./app-context.js";
import { loadConfig } from "./config/env.js";
import { createDataSource } from "./db/create-data-source.js";
import { AppError } from "./lib/errors.js";
import { createLogger } from "./lib/logger.js";
import { createMailer } from "./lib/mailer.js";
import { User } from "./modules/users/user.entity.js";

const USAGE =
  "Usage: npm run stock:import -- --admin-email admin@example.org --file register.csv [--mapping '{\"uprn\": 0}'] [--json]";

export interface StockImportRun {
  importId: number;
  created: number;
  updated: number;
  unchanged: number;
  refused: number;
  ms: number;
  /** CPU time of this process during the import (Node's share; the database's work is not in it). */
  cpuMs: number;
  /** This process's peak resident memory, and that peak before the import began. */
  maxRssMb: number;
  baseRssMb: number;
}

async function main(argv: string[]): Promise<number> {
  let values: { "admin-email"?: string; file?: string; mapping?: string; json?: boolean };
  try {
    ({ values } = parseArgs({
      args: argv,
      options: {
        "admin-email": { type: "string" },
        file: { type: "string" },
        mapping: { type: "string" },
        json: { type: "boolean" },
      },
    }));
  } catch (error) {
    console.error(`${(error as Error).message}\n${USAGE}`);
    return 2;
  }
  if (!values["admin-email"] || !values.file) {
    console.error(USAGE);
    return 2;
  }
  const config = loadConfig();
  const logger = createLogger(values.json ? "warn" : config.logLevel);
  const ds = createDataSource(config.db);
  await ds.initialize();
  try {
    const admin = await ds
      .getRepository(User)
      .findOneBy({ email: values["admin-email"].trim().toLowerCase(), role: "admin", status: "active" });
    if (!admin) {
      console.error(`No active administrator has the e-mail address ${values["admin-email"]}.`);
      return 1;
    }
    const stock = createServices(config, ds, createMailer(config), logger).stock;
    const baseRssMb = process.resourceUsage().maxRSS / 1024;
    const cpuBefore = process.cpuUsage();
    const start = performance.now();
    const saved = await stock.import(
      { id: admin.id, email: admin.email, name: admin.name, role: "admin", organisationId: admin.organisationId },
      { filePath: path.resolve(values.file), fileName: path.basename(values.file), mapping: values.mapping },
    );
    const ms = performance.now() - start;
    const cpu = process.cpuUsage(cpuBefore);
    const run: StockImportRun = {
      importId: saved.id,
      created: saved.created,
      updated: saved.updated,
      unchanged: saved.unchanged,
      refused: saved.refused,
      ms,
      cpuMs: (cpu.user + cpu.system) / 1000,
      maxRssMb: process.resourceUsage().maxRSS / 1024,
      baseRssMb,
    };
    if (values.json) console.log(JSON.stringify(run));
    else
      console.log(
        `Imported ${path.basename(values.file)} for landlord ${admin.organisationId} in ${(ms / 1000).toFixed(1)} s: ` +
          `${run.created} created, ${run.updated} updated, ${run.unchanged} unchanged, ${run.refused} refused. ` +
          `The per-row report is on the Stock import page (import ${run.importId}).`,
      );
    return 0;
  } catch (error) {
    if (!(error instanceof AppError)) throw error;
    console.error(error.message);
    return 1;
  } finally {
    await ds.destroy();
  }
}

process.exitCode = await main(process.argv.slice(2));
