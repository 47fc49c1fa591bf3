// A 2 000-row tenancy file, stored in batches of 300 rows so that a tenant's two rows, a repeated
// reference and the invitations fall in different batches: every row's outcome is what the rules
// say row by row; a database error in the third batch leaves nothing of the file; a second import
// with a few rows changed changes those rows and nothing else.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Actor } from "../../server/lib/actor.js";
import { PendingInvitation } from "../../server/modules/auth/invitation-batch.entity.js";
import { Tenancy } from "../../server/modules/tenancies/tenancy.entity.js";
import { TenancyImport } from "../../server/modules/tenancy-import/tenancy-import.entity.js";
import { TenancyImportService } from "../../server/modules/tenancy-import/tenancy-import.service.js";
import { User } from "../../server/modules/users/user.entity.js";
import { makeLandlord, makeUser } from "../support/factories.js";
import { createTestApp, type TestApp } from "../support/test-app.js";
import { testClock } from "../support/test-clock.js";
import { mkdtemp, readFile, rm, writeFile } from "node:fs/promises";
import { tmpdir } from "node:os";
import path from "node:path";
import { In, Like } from "typeorm";

const ROWS = 2000;
const BATCH = 300;
const QUEUED = "Invitation queued: it goes out with the next batches.";
const ENDED = "The tenancy has ended: no invitation.";
const DISABLED = "This tenant's account is disabled: enable it under People, then import the row again.";
const STAFF = "This e-mail address belongs to a staff account at your organisation; a tenant needs their own address.";

let t: TestApp;
let dir: string;
let service: TenancyImportService;
let actor: Actor;
let ours: Awaited<ReturnType<typeof makeLandlord>>;
const tag = Math.random().toString(36).slice(2, 8);
const uprnBase = 300_000_000_000 + Math.floor(Math.random() * 1e6) * 10_000;
const uprn = (i: number) => String(uprnBase + i);
const mail = (i: number) => `b${i}.${tag}@test.example`;
const special: { cancelled?: string; disabled?: string; foreign?: string; staff?: string } = {};

beforeAll(async () => {
  t = await createTestApp();
  const ds = t.ctx.dataSource;
  ours = await makeLandlord(ds);
  const theirs = await makeLandlord(ds);
  // 2 000 homes at once (the factory's one-by-one homes would take longer than the import).
  await ds.query(
    `INSERT INTO properties (organisation_id, address_line1, town, postcode, uprn, estate, built_form, wall_type, glazing_type, heating_type)
     SELECT ?, CONCAT(s.seq, ' Batch Row ${tag}'), 'Testford', 'ZX1 1AA', CAST(? + s.seq AS CHAR), 'Test Estate', 'mid-terrace', 'solid-brick', 'single', 'gas-boiler'
       FROM seq_1_to_${ROWS} s`,
    [ours.org.id, uprnBase],
  );
  special.cancelled = (
    await makeUser(ds, ours.org, "tenant", { status: "cancelled", name: "Old Name", passwordHash: null })
  ).email;
  special.disabled = (await makeUser(ds, ours.org, "tenant", { status: "disabled" })).email;
  special.foreign = (await makeUser(ds, theirs.org, "tenant")).email;
  special.staff = ours.officer.email;
  const s = t.ctx.services;
  service = new TenancyImportService(ds, s.properties, s.tenancies, s.users, s.invitationBatches, testClock, {
    batchRows: BATCH,
  });
  actor = { id: ours.admin.id, email: ours.admin.email, name: ours.admin.name, role: "admin", organisationId: ours.org.id };
  dir = await mkdtemp(path.join(tmpdir(), "tenancy-bulk-"));
});
afterAll(async () => {
  await rm(dir, { recursive: true, force: true });
  await t.close();
});

/** What row i of the file holds, and so what the rules make of it. */
function rowOf(i: number, prefix: string, changed = false) {
  let who = i;
  let reference = `${prefix}-${i}`;
  let home = uprn(i);
  const ended = i % 10 === 0;
  // Every 97th row is the previous row's tenant with a second tenancy; row 1 999 is row 11's tenant.
  if (i % 97 === 0) who = i - 1;
  if (i === 1999) who = 11;
  let email = mail(who);
  const name = `Bulk ${who}`;
  if (i === 5) email = special.cancelled!;
  if (i === 6) email = special.disabled!;
  if (i === 7) email = special.foreign!;
  if (i === 8) email = special.staff!;
  if (i === 1500) reference = `${prefix}-3`;
  if (i === 1700) home = "999999999999";
  const phone = `07700 9${String(changed && i % 100 === 1 ? who + 50_000 : who).padStart(5, "0")}`;
  const end = ended ? "2020-12-31" : changed && i === 2 ? "2030-03-31" : "";
  return { email, name, reference, home, ended, phone, end };
}

async function fileOf(prefix: string, changed = false): Promise<string> {
  const lines = ["Reference,UPRN,Name,Email,Mobile,Start,End"];
  for (let i = 1; i <= ROWS; i++) {
    const r = rowOf(i, prefix, changed);
    lines.push([r.reference, r.home, r.name, r.email, r.phone, r.ended ? "2019-01-01" : "2024-01-01", r.end].join(","));
  }
  const file = path.join(dir, `${prefix}-${changed ? "changed" : "first"}.csv`);
  await writeFile(file, lines.join("\n") + "\n");
  return file;
}

/** Each row's outcome by the rules, one row after another (the file's first import). */
function expectedFirst(prefix: string) {
  const invited = new Set<string>();
  const out: [number, string, string, string, string[]][] = [];
  for (let i = 1; i <= ROWS; i++) {
    const r = rowOf(i, prefix);
    const row = i + 1;
    if (i === 6) out.push([row, r.reference, "rejected", "", [DISABLED]]);
    else if (i === 8) out.push([row, r.reference, "rejected", "", [STAFF]]);
    else if (i === 1500)
      out.push([
        row,
        r.reference,
        "rejected",
        "",
        [`The tenancy reference ${prefix}-3 is also on row 4; only that row was used.`],
      ]);
    else if (i === 1700)
      out.push([row, r.reference, "rejected", "", ["None of your homes has the UPRN 999999999999: add the home first."]]);
    else {
      const notes = r.ended ? [ENDED] : invited.has(r.email) ? [] : [QUEUED];
      if (!r.ended) invited.add(r.email);
      out.push([row, r.reference, "created", i === 5 ? "invitation renewed; name; phone" : "", notes]);
    }
  }
  return { out, invited };
}

const brief = (rows: { row: number; reference: string; outcome: string; changes: string[]; reasons: string[] }[]) =>
  rows.map((r) => [r.row, r.reference, r.outcome, r.changes.join("; "), r.reasons]);

describe("a 2 000-row tenancy file stored in batches", () => {
  it("gives every row the outcome the rules give it one row at a time", async () => {
    const ds = t.ctx.dataSource;
    const result = await service.import(actor, { path: await fileOf("B"), fileName: "bulk.csv" });
    const { out, invited } = expectedFirst("B");
    expect(brief(result.report)).toEqual(out);
    expect(result).toMatchObject({ rows: ROWS, created: ROWS - 4, updated: 0, unchanged: 0, rejected: 4 });

    // Accounts: invited, without a password; the tenant of two rows has one account; the cancelled one is renewed.
    const emails = [...new Set(out.filter((o) => o[2] === "created").map((o) => rowOf(o[0] - 1, "B").email))];
    const accounts = await ds.getRepository(User).find({ where: { email: In(emails) } });
    const ourAccounts = accounts.filter((a) => a.organisationId === ours.org.id);
    expect(ourAccounts).toHaveLength(emails.length - 1); // all but the other landlord's tenant
    expect(ourAccounts.every((a) => a.status === "invited" && a.passwordHash === null && a.role === "tenant")).toBe(true);
    const byEmail = new Map(accounts.map((a) => [a.email, a]));
    expect(byEmail.get(special.cancelled!)!.name).toBe("Bulk 5");
    expect(byEmail.get(mail(1234))).toMatchObject({ name: "Bulk 1234", phone: "07700901234" });
    expect(byEmail.get(special.foreign!)!.organisationId).not.toBe(ours.org.id);

    // Tenancies: one per created row, each to its tenant and home, the ended ones ended.
    const tenancies = await ds.getRepository(Tenancy).find({ where: { organisationId: ours.org.id, reference: Like("B-%") } });
    expect(tenancies).toHaveLength(ROWS - 5); // the other landlord's tenant gets none
    const homeIds = new Map(
      (
        (await ds.query("SELECT id, uprn FROM properties WHERE organisation_id = ?", [ours.org.id])) as {
          id: number;
          uprn: string;
        }[]
      ).map((h) => [Number(h.id), h.uprn]),
    );
    const idOf = new Map(accounts.map((a) => [a.id, a.email]));
    const stored = new Map(
      tenancies.map((x) => [x.reference, [homeIds.get(x.propertyId), idOf.get(x.tenantUserId), x.startDate, x.endDate]]),
    );
    for (const [row, reference, outcome] of out) {
      if (outcome !== "created" || row === 8) continue;
      const r = rowOf(row - 1, "B");
      expect(stored.get(reference)).toEqual([
        r.home,
        r.email,
        r.ended ? "2019-01-01" : "2024-01-01",
        r.ended ? "2020-12-31" : null,
      ]);
    }

    // Invitations: one per tenant whose tenancy runs, in file order, the other landlord's address without an account.
    const queued = await ds
      .getRepository(PendingInvitation)
      .find({ where: { batchId: result.invitations!.batchId }, order: { id: "ASC" } });
    expect(queued.map((q) => q.email)).toEqual([...invited]);
    expect(queued.every((q) => q.status === "pending")).toBe(true);
    expect(queued.find((q) => q.email === special.foreign)!.userId).toBeNull();
    expect(queued.filter((q) => q.email !== special.foreign).every((q) => byEmail.get(q.email)!.id === q.userId)).toBe(true);
    // Row 290's tenancy has ended, row 291 (the same tenant) runs: invited once, from row 291.
    expect(result.report.find((r) => r.row === 292)!.reasons).toEqual([QUEUED]);
    expect(invited.has(mail(10))).toBe(false);
  });

  it("leaves nothing of the file when the database refuses a row in the third batch", async () => {
    const ds = t.ctx.dataSource;
    const importsBefore = await ds.getRepository(TenancyImport).countBy({ organisationId: ours.org.id });
    const constraint = `chk_fail_${tag}`;
    // A real constraint of MariaDB's, refusing row 700's tenancy (batches 1 and 2 are stored by then).
    await ds.query(`ALTER TABLE tenancies ADD CONSTRAINT ${constraint} CHECK (reference IS NULL OR reference <> 'F-700')`);
    try {
      const file = await fileOf("F");
      // Fresh addresses, so the accounts would be new.
      await writeFile(file, (await readFile(file, "utf8")).replaceAll(`.${tag}@`, `.f${tag}@`));
      await expect(service.import(actor, { path: file, fileName: "fails.csv" })).rejects.toThrow(/constraint/i);
    } finally {
      await ds.query(`ALTER TABLE tenancies DROP CONSTRAINT ${constraint}`);
    }
    expect(await ds.getRepository(Tenancy).countBy({ organisationId: ours.org.id, reference: Like("F-%") })).toBe(0);
    expect(await ds.getRepository(User).countBy({ email: Like(`%.f${tag}@test.example`) })).toBe(0);
    expect(await ds.getRepository(PendingInvitation).countBy({ email: Like(`%.f${tag}@test.example`) })).toBe(0);
    expect(await ds.getRepository(User).findOneByOrFail({ email: special.cancelled! })).toMatchObject({ name: "Bulk 5" });
    expect(await ds.getRepository(TenancyImport).countBy({ organisationId: ours.org.id })).toBe(importsBefore);
  });

  it("changes only what changed when the file comes again with a few rows changed", async () => {
    const ds = t.ctx.dataSource;
    const snapshot = async () => {
      const users = await ds.getRepository(User).find({ where: { organisationId: ours.org.id } });
      const tenancies = await ds.getRepository(Tenancy).find({ where: { organisationId: ours.org.id } });
      return {
        users: new Map(users.map((u) => [u.email, JSON.stringify(u)])),
        tenancies: new Map(tenancies.map((x) => [x.reference, JSON.stringify(x)])),
      };
    };
    const before = await snapshot();
    const result = await service.import(actor, { path: await fileOf("B", true), fileName: "bulk-again.csv" });
    // Rows 1, 101, …, 1 901 have a new phone number (none of their tenants is on another row), row 2 an end date.
    const phoneRows = Array.from({ length: 20 }, (_, k) => k * 100 + 1);
    const changed = result.report.filter((r) => r.outcome === "updated");
    expect(changed.map((r) => [r.row - 1, r.changes])).toEqual(
      [[2, ["end date"]], ...phoneRows.map((i) => [i, ["phone"]])].sort((a, b) => (a[0] as number) - (b[0] as number)),
    );
    expect(result).toMatchObject({ created: 0, updated: 21, unchanged: ROWS - 4 - 21, rejected: 4, invitations: null });

    const after = await snapshot();
    const changedEmails = new Set(phoneRows.map((i) => rowOf(i, "B").email));
    for (const [email, was] of before.users) {
      if (changedEmails.has(email)) expect(after.users.get(email)).not.toBe(was);
      else expect(after.users.get(email)).toBe(was);
    }
    expect(after.users.size).toBe(before.users.size);
    for (const [reference, was] of before.tenancies) {
      if (reference === "B-2") expect(JSON.parse(after.tenancies.get(reference)!).endDate).toBe("2030-03-31");
      else expect(after.tenancies.get(reference)).toBe(was);
    }
    expect(after.tenancies.size).toBe(before.tenancies.size);
    const phone = await ds.getRepository(User).findOneByOrFail({ email: mail(101) });
    expect(phone.phone).toBe("07700950101");
  });

  it("reads every row's report back, and an import's report stored before compression alike", async () => {
    const ds = t.ctx.dataSource;
    const latest = await ds
      .getRepository(TenancyImport)
      .findOneOrFail({ where: { organisationId: ours.org.id }, order: { id: "DESC" } });
    expect((await service.report(actor, latest.id)).rows).toHaveLength(ROWS);
    const plain = [{ row: 2, reference: "OLD-1", outcome: "created", changes: [], reasons: [QUEUED] }];
    const { id: _latestId, ...copy } = latest;
    const older = await ds.getRepository(TenancyImport).save({ ...copy, fileName: "older.csv", report: JSON.stringify(plain) });
    expect(await service.report(actor, older.id)).toEqual({ fileName: "older.csv", rows: plain });
  });
});
