// Issue 13: the server killed (SIGKILL) in the middle of a stock import leaves none of that file's homes
// and no import record; started again, the same file imports in full. The real server entry runs as its
// own process (as in tests/server/shutdown.test.ts) on this run's throwaway MariaDB, and the test only
// speaks HTTP to it and reads the database, so it holds however the import writes its rows.
import { spawn, type ChildProcess } from "node:child_process";

import { mkdtempSync, openAsBlob, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, beforeAll, expect, inject, it } from "vitest";
import type { DataSource } from "typeorm";
import { loadConfig } from "../../server/config/env.js";
import { createDataSource } from "../../server/db/create-data-source.js";
import { Session } from "../../scripts/lib/http-load.js";
import { ensureAppDatabase, freePort, rootSql } from "../../scripts/lib/mariadb.js";
import { projectRoot } from "../../scripts/lib/paths.js";
import { waitUntilReady } from "../../scripts/lib/processes.js";
import { uprnOf, writeRegister } from "../../scripts/lib/stock-register.js";
import { makeOrganisation, makeUser, PASSWORD } from "../support/factories.js";

/** A register of this many homes is imported, killed just before its commit, and imported again. */
const HOMES = 40_000;
/** The server's own database account, so its transactions are told apart from other test files'. */
const SERVER_DB_USER = "dewline_kill_test";

const db = inject("testDb");
const work = mkdtempSync(path.join(tmpdir(), "dewline-stock-kill-"));
const register = path.join(work, "register.csv");
let ds: DataSource;
let server: ChildProcess | undefined;
let output = "";

beforeAll(async () => {
  ds = createDataSource(loadConfig().db);
  await ds.initialize();
  await ensureAppDatabase({ dir: db.dir, port: db.port }, { name: db.name, user: SERVER_DB_USER, password: "kill-test-only" });
  writeRegister(register, HOMES, 13);
});
afterAll(async () => {
  if (server && server.exitCode === null && server.signalCode === null) server.kill("SIGKILL");
  await ds?.destroy();
  rmSync(work, { recursive: true, force: true });
});

async function startServer(port: number, smtpPort: number): Promise<ChildProcess> {
  const child = spawn(process.execPath, ["--import", "tsx", "server/server.ts"], {
    cwd: projectRoot,
    env: {
      ...process.env,
      TSX_TSCONFIG_PATH: "server/tsconfig.json",
      NODE_ENV: "test",
      HOST: "127.0.0.1",
      PORT: String(port),
      LOG_LEVEL: "warn",
      SMTP_PORT: String(smtpPort),
      UPLOADS_DIR: path.join(work, "uploads"),
      DB_USER: SERVER_DB_USER,
      DB_PASSWORD: "kill-test-only",
    },
    stdio: ["ignore", "pipe", "pipe"],
  });
  child.stdout?.on("data", (d: Buffer) => (output += d.toString()));
  child.stderr?.on("data", (d: Buffer) => (output += d.toString()));
  await waitUntilReady(`http://127.0.0.1:${port}/api/health/ready`, 90_000).catch((error: Error) => {
    throw new Error(`${error.message}\nserver output:\n${output}`);
  });
  return child;
}

/** The server's open InnoDB transactions as MariaDB reports them (root: innodb_trx needs PROCESS). */
async function serverTransactions() {
  const rows = await rootSql(
    { dir: db.dir, port: db.port },
    `SELECT t.trx_mysql_thread_id, t.trx_state, t.trx_rows_modified, t.trx_rows_locked, t.trx_tables_locked,
            COALESCE(p.info LIKE 'INSERT INTO %stock_imports%', 0)
       FROM information_schema.innodb_trx t JOIN information_schema.processlist p ON p.id = t.trx_mysql_thread_id
      WHERE p.user = '${SERVER_DB_USER}'`,
  );
  return rows
    .trim()
    .split("\n")
    .filter(Boolean)
    .map((line) => {
      const [thread, state, modified, rowsLocked, tablesLocked, recording] = line.split("\t");
      return {
        thread: Number(thread),
        state: state!,
        rowsModified: Number(modified),
        rowsLocked: Number(rowsLocked),
        tablesLocked: Number(tablesLocked),
        /** Storing the import's own record: its last write, after every home. */
        recordingImport: recording === "1",
      };
    });
}

async function homesAndImports(organisationId: number) {
  const [row] = (await ds.query(
    `SELECT (SELECT COUNT(*) FROM properties WHERE organisation_id = ? AND uprn BETWEEN ? AND ?) AS homes,
            (SELECT COUNT(*) FROM properties WHERE organisation_id = ?) AS anyHomes,
            (SELECT COUNT(*) FROM stock_imports WHERE organisation_id = ?) AS imports`,
    [organisationId, uprnOf(0), uprnOf(HOMES - 1), organisationId, organisationId],
  )) as { homes: string; anyHomes: string; imports: string }[];
  return { homes: Number(row!.homes), anyHomes: Number(row!.anyHomes), imports: Number(row!.imports) };
}

async function upload(session: Session, urlPath: string, mapping?: unknown): Promise<Response> {
  const form = new FormData();
  form.set("file", await openAsBlob(register, { type: "text/csv" }), "register.csv");
  if (mapping !== undefined) form.set("mapping", JSON.stringify(mapping));
  return session.request("POST", urlPath, form, 300_000);
}

it(
  "a server killed mid-import leaves no home and no import record; restarted, the same file imports in full",
  { timeout: 300_000 },
  async () => {
    const org = await makeOrganisation(ds);
    const admin = await makeUser(ds, org, "admin");
    const port = await freePort();
    const smtpPort = await freePort();
    server = await startServer(port, smtpPort);
    const base = `http://127.0.0.1:${port}`;

    let session = await Session.signIn(base, admin.email, PASSWORD);
    const preview = await upload(session, "/api/stock-imports/preview");
    expect(preview.status).toBe(200);
    const { mapping, missing } = (await preview.json()) as { mapping: Record<string, number>; missing: string[] };
    expect(missing).toEqual([]);

    // A state, not a time: the test holds a locking read of this landlord's (empty) range of import
    // records, so the import, having written every home in its transaction, waits to store its own
    // record, its last write before the commit. Seen waiting there, the server process dies on the spot.
    const hold = ds.createQueryRunner();
    const peek = ds.createQueryRunner();
    await hold.connect();
    await hold.startTransaction();
    await hold.query("SELECT id FROM stock_imports WHERE organisation_id = ? FOR UPDATE", [org.id]);
    let answered = false;
    const answer = upload(session, "/api/stock-imports", mapping).then(
      (r) => `answered ${r.status}`,
      (error: Error) => `no answer (${error.message})`,
    );
    void answer.then(() => (answered = true));
    let seen: Awaited<ReturnType<typeof serverTransactions>>[number] | undefined;
    try {
      while (!seen && !answered) {
        seen = (await serverTransactions()).find((t) => t.recordingImport);
        // Each look starts a client process: a pause between looks keeps the machine free for the import.
        if (!seen) await new Promise((r) => setTimeout(r, 100));
      }
      expect(seen, `the import never reached its record (${answered ? await answer : "no answer"})\n${output}`).toBeDefined();
      // Every home is written, not yet committed: a read of uncommitted rows sees them all.
      await peek.query("SET SESSION TRANSACTION ISOLATION LEVEL READ UNCOMMITTED");
      const [dirty] = (await peek.query("SELECT COUNT(*) AS n FROM properties WHERE organisation_id = ?", [org.id])) as {
        n: string;
      }[];
      expect(Number(dirty!.n)).toBe(HOMES);
    } catch (error) {
      await hold.rollbackTransaction();
      await Promise.all([hold.release(), peek.release()]);
      throw error;
    }
    const exited = new Promise<void>((resolve) => server!.once("exit", () => resolve()));
    server.kill("SIGKILL");
    await exited;
    console.log(`killed with the import's transaction under way: ${JSON.stringify(seen)}; the upload: ${await answer}`);
    expect(await answer).toMatch(/^no answer/);
    await hold.rollbackTransaction();
    await Promise.all([hold.release(), peek.release()]);

    // MariaDB rolls the dead connection's transaction back; wait for that to finish (a state), then count.
    for (let i = 0; i < 3_000 && (await serverTransactions()).some((t) => t.thread === seen!.thread); i++)
      await new Promise((r) => setTimeout(r, 100));
    expect(await homesAndImports(org.id)).toEqual({ homes: 0, anyHomes: 0, imports: 0 });

    server = await startServer(port, smtpPort);
    session = await Session.signIn(base, admin.email, PASSWORD);
    const again = await upload(session, "/api/stock-imports", mapping);
    expect(again.status, await again.clone().text()).toBe(201);
    expect(await again.json()).toMatchObject({ created: HOMES, updated: 0, unchanged: 0, refused: 0 });
    expect(await homesAndImports(org.id)).toEqual({ homes: HOMES, anyHomes: HOMES, imports: 1 });
  },
);
