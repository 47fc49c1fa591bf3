// An admin brings in a landlord's tenancy file: a messy CSV (BOM, CRLF, semicolons, a blank line,
// odd headers, bad and repeated rows) with exact per-row outcomes; the same file again changes
// nothing; an .xlsx works alike; a failure half-way leaves nothing; invitations go out in batches of
// at most N per tick, each exactly once; another landlord is never reached.
import { parse as parseCsv } from "csv-parse/sync";
import ExcelJS from "exceljs";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { PendingInvitation } from "../../server/modules/auth/invitation-batch.entity.js";
import { OutboxEmail } from "../../server/modules/mail/outbox-email.entity.js";
import { Tenancy } from "../../server/modules/tenancies/tenancy.entity.js";
import { User } from "../../server/modules/users/user.entity.js";
import { makeLandlord, makeProperty, makeUser, PASSWORD } from "../support/factories.js";
import { anonymousClient, createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";

const PER_BATCH = 2;
let t: TestApp;
let ours: Awaited<ReturnType<typeof makeLandlord>>;
let theirs: Awaited<ReturnType<typeof makeLandlord>>;
let admin: Client;
let otherAdmin: Client;
const tag = Math.random().toString(36).slice(2, 8);
const uprnBase = 200_000_000_000 + Math.floor(Math.random() * 1e9) * 100;
const uprn = (n: number) => String(uprnBase + n);
const mail = (who: string) => `${who}.${tag}@test.example`;
let foreignEmail: string;
let staffEmail: string;

beforeAll(async () => {
  t = await createTestApp({ INVITATIONS_PER_BATCH: String(PER_BATCH) });
  const ds = t.ctx.dataSource;
  ours = await makeLandlord(ds);
  theirs = await makeLandlord(ds);
  for (const n of [1, 2, 3]) await makeProperty(ds, ours.org, { uprn: uprn(n) });
  await makeProperty(ds, theirs.org, { uprn: uprn(9) });
  foreignEmail = (await makeUser(ds, theirs.org, "tenant")).email;
  staffEmail = ours.officer.email;
  admin = await signedInClient(t.app, ours.admin.email, PASSWORD);
  otherAdmin = await signedInClient(t.app, theirs.admin.email, PASSWORD);
});
afterAll(() => t.close());

const upload = (client: Client, url: string, file: Buffer, name: string, fields: Record<string, string> = {}) => {
  let req = client.agent.post(url).set("X-CSRF-Token", client.csrf);
  for (const [k, v] of Object.entries(fields)) req = req.field(k, v);
  return req.attach("file", file, name);
};

/** The messy file: UTF-8 BOM, CRLF, semicolons, headers as a housing system might write them. */
function messyFile(overrides: Record<string, string> = {}): Buffer {
  const lines = [
    "Tenancy Ref;Property UPRN;Tenant Name;E-mail Address;Mobile;Tenancy Start;Tenancy End;Preferred Language;Access Needs;Vulnerability;Consent",
    `T-1;${uprn(1)};${overrides.t1Name ?? "Ada Mould"};${mail("ada")};07700 900123;2024-04-01;${overrides.t1End ?? ""};en;Wheelchair user;;Yes`,
    `T-2;${uprn(2)};Ben Vent;${mail("ben")};;01/05/2024;;cy;Deaf: text first;Child under five;no`,
    `T-3;12AB;Cal Damp;${mail("cal")};;2024-01-01;;;;;`,
    `T-1;${uprn(1)};Ada Again;${mail("ada2")};;2024-01-01;;;;;`,
    `T-4;${uprn(9)};Dee Elsewhere;${mail("dee")};;2024-01-01;;;;;`,
    `T-5;${uprn(3)};Eve Nomail;not-an-address;;2024-01-01;;;;;`,
    `T-6;${uprn(3)};Fay Former;${mail("fay")};;01/02/2019;2020-12-31;;;;`,
    `T-7;${uprn(2)};Gus Known;${foreignEmail};;2024-06-01;;;;;`,
    "",
    `T-8;${uprn(3)};Hal Backwards;${mail("hal")};;2024-06-01;2024-01-01;;;;`,
    `T-9;${uprn(3)};Ida Staff;${staffEmail};;2024-06-01;;;;;`,
    `T-10;${uprn(3)};Jo Phone;${mail("jo")};call me;2024-06-01;;Klingon!;;;`,
    `=HYPERLINK("x");bad;Kit Formula;${mail("kit")};;2024-06-01;;;;;`,
  ];
  return Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), Buffer.from(lines.join("\r\n") + "\r\n")]);
}

type Row = { row: number; reference: string; outcome: string; changes: string[]; reasons: string[] };
const brief = (rows: Row[]) => rows.map((r) => [r.row, r.reference, r.outcome, r.changes.join("; ")]);
const QUEUED = "Invitation queued: it goes out with the next batches.";

let firstImportId: number;

describe("importing a tenancy file", () => {
  it("previews the columns it found, for the admin to correct", async () => {
    const res = await upload(admin, "/api/tenancy-imports/preview", messyFile(), "tenancies.csv").expect(200);
    expect(res.body.fileKind).toBe("csv");
    expect(res.body.headers[0]).toBe("Tenancy Ref");
    expect(res.body.mapping).toMatchObject({ reference: 0, uprn: 1, name: 2, email: 3, phone: 4, startDate: 5, endDate: 6 });
    expect(res.body.mapping).toMatchObject({ language: 7, accessNeeds: 8, vulnerability: 9, consent: 10 });
    expect(res.body.missing).toEqual([]);
    expect(res.body.rows).toBe(12);
  });

  it("reports each row's outcome exactly, and stores only what the rules allow", async () => {
    const res = await upload(admin, "/api/tenancy-imports", messyFile(), "tenancies.csv").expect(201);
    firstImportId = res.body.id;
    expect(brief(res.body.notable)).toEqual([
      [2, "T-1", "created", ""],
      [3, "T-2", "created", ""],
      [4, "T-3", "rejected", ""],
      [5, "T-1", "rejected", ""],
      [6, "T-4", "rejected", ""],
      [7, "T-5", "rejected", ""],
      [8, "T-6", "created", ""],
      [9, "T-7", "created", ""],
      [11, "T-8", "rejected", ""],
      [12, "T-9", "rejected", ""],
      [13, "T-10", "created", ""],
      [14, '=HYPERLINK("x")', "rejected", ""],
    ]);
    const reasons = Object.fromEntries((res.body.notable as Row[]).map((r) => [r.row, r.reasons]));
    expect(reasons[2]).toEqual([QUEUED]);
    expect(reasons[3]).toEqual([
      "Access needs and household vulnerability not stored: the file does not record the household's consent.",
      QUEUED,
    ]);
    expect(reasons[4]).toEqual(['"12AB" is not a UPRN (a number of up to 12 digits).']);
    expect(reasons[5]).toEqual(["The tenancy reference T-1 is also on row 2; only that row was used."]);
    expect(reasons[6]).toEqual([`None of your homes has the UPRN ${uprn(9)}: add the home first.`]);
    expect(reasons[7]).toEqual(['"not-an-address" is not an e-mail address.']);
    expect(reasons[8]).toEqual(["The tenancy has ended: no invitation."]);
    // Another landlord's address reads exactly like a new tenant's.
    expect(reasons[9]).toEqual([QUEUED]);
    expect(reasons[11]).toEqual(["The end date is before the start date."]);
    expect(reasons[12]).toEqual([
      "This e-mail address belongs to a staff account at your organisation; a tenant needs their own address.",
    ]);
    expect(reasons[13]).toEqual([
      'Phone not stored: "call me" is not a phone number.',
      'Language not stored: "Klingon!" is not a language code such as en or cy.',
      QUEUED,
    ]);
    expect(res.body).toMatchObject({ rows: 12, created: 5, updated: 0, unchanged: 0, rejected: 7 });
    expect(res.body.invitations).toMatchObject({ total: 4, sent: 0, pending: 4, state: "sending" });

    const ds = t.ctx.dataSource;
    const tenancies = await ds.getRepository(Tenancy).find({ where: { organisationId: ours.org.id }, order: { id: "ASC" } });
    expect(tenancies.map((x) => [x.reference, x.startDate, x.endDate, x.accessNeeds, x.householdVulnerability])).toEqual([
      ["T-1", "2024-04-01", null, "Wheelchair user", null],
      ["T-2", "2024-05-01", null, null, null],
      ["T-6", "2019-02-01", "2020-12-31", null, null],
      ["T-10", "2024-06-01", null, null, null],
    ]);
    const ada = await ds.getRepository(User).findOneByOrFail({ email: mail("ada") });
    expect(ada).toMatchObject({
      role: "tenant",
      status: "invited",
      passwordHash: null,
      phone: "07700900123",
      preferredLanguage: "en",
    });
    expect((await ds.getRepository(User).findOneByOrFail({ email: mail("ben") })).preferredLanguage).toBe("cy");
    // The other landlord's tenant is untouched and has no tenancy of ours.
    const foreign = await ds.getRepository(User).findOneByOrFail({ email: foreignEmail });
    expect(foreign.organisationId).toBe(theirs.org.id);
    expect(await ds.getRepository(Tenancy).countBy({ tenantUserId: foreign.id, organisationId: ours.org.id })).toBe(0);
    // Nothing is e-mailed by the import itself.
    expect(await ds.getRepository(OutboxEmail).countBy({ toAddress: mail("ada") })).toBe(0);
  });

  it("gives the same file a second time with no change and no new invitation", async () => {
    const ds = t.ctx.dataSource;
    const before = await ds.getRepository(User).countBy({ organisationId: ours.org.id });
    const res = await upload(admin, "/api/tenancy-imports", messyFile(), "tenancies.csv").expect(201);
    expect(res.body).toMatchObject({ created: 0, updated: 0, unchanged: 5, rejected: 7, invitations: null });
    expect(await ds.getRepository(User).countBy({ organisationId: ours.org.id })).toBe(before);
    expect(await ds.getRepository(Tenancy).countBy({ organisationId: ours.org.id })).toBe(4);
  });

  it("updates what changed and says what", async () => {
    const res = await upload(
      admin,
      "/api/tenancy-imports",
      messyFile({ t1End: "2026-12-31", t1Name: "Ada Mould-Jones" }),
      "tenancies.csv",
    ).expect(201);
    const t1 = (res.body.notable as Row[]).find((r) => r.row === 2)!;
    expect(t1).toMatchObject({ outcome: "updated", changes: ["name", "end date"] });
    // The answer holds the rows worth a look, not every row: unchanged rows without a note are only in the CSV.
    const notable = res.body.notable as Row[];
    expect(notable.every((r) => r.outcome !== "unchanged" || r.reasons.length > 0)).toBe(true);
    expect(res.body.notableTotal).toBe(notable.length);
    expect(notable.length).toBeLessThan(res.body.rows);
    expect(res.body).toMatchObject({ created: 0, updated: 1, unchanged: 4 });
    const ds = t.ctx.dataSource;
    expect((await ds.getRepository(Tenancy).findOneByOrFail({ organisationId: ours.org.id, reference: "T-1" })).endDate).toBe(
      "2026-12-31",
    );
  });

  it("reads tenancy references as the database compares them: t-2 is T-2, and N-1 then n-1 is a repeat", async () => {
    const lines = [
      "Tenancy Ref;Property UPRN;Tenant Name;E-mail Address;Mobile;Tenancy Start;Tenancy End;Preferred Language;Access Needs;Vulnerability;Consent",
      `t-2;${uprn(2)};Ben Vent;${mail("ben")};;01/05/2024;;cy;Deaf: text first;Child under five;no`,
      `N-1;${uprn(3)};Nia New;${mail("nia")};;2024-06-01;;;;;`,
      `n-1;${uprn(3)};Ned New;${mail("ned")};;2024-06-01;;;;;`,
    ];
    const res = await upload(admin, "/api/tenancy-imports", Buffer.from(lines.join("\n")), "tenancies.csv").expect(201);
    expect(brief(res.body.notable)).toEqual([
      [2, "t-2", "unchanged", ""],
      [3, "N-1", "created", ""],
      [4, "n-1", "rejected", ""],
    ]);
    expect((res.body.notable as Row[])[2]!.reasons).toEqual([
      "The tenancy reference n-1 is also on row 3; only that row was used.",
    ]);
    const ds = t.ctx.dataSource;
    expect(await ds.getRepository(Tenancy).countBy({ organisationId: ours.org.id, reference: "T-2" })).toBe(1);
    expect(await ds.getRepository(User).countBy({ email: mail("ned") })).toBe(0);
  });

  it("answers with the first 200 rows worth a look and how many there are; the CSV has every row", async () => {
    const lines = ["Tenancy Ref;Property UPRN;Tenant Name;E-mail Address;Tenancy Start"];
    for (let i = 1; i <= 250; i++) lines.push(`R-${i};not-a-uprn;Ann ${i};ann${i}@example.org;2024-01-01`);
    const res = await upload(admin, "/api/tenancy-imports", Buffer.from(lines.join("\n")), "many.csv").expect(201);
    expect(res.body).toMatchObject({ rows: 250, rejected: 250, notableTotal: 250 });
    expect((res.body.notable as Row[]).map((r) => r.row)).toEqual(Array.from({ length: 200 }, (_, i) => i + 2));
    const csv = await admin.get(`/api/tenancy-imports/${res.body.id}/report.csv`).expect(200);
    expect(csv.text.trim().split("\n")).toHaveLength(251);
  });

  it("offers the report as CSV with formula-like cells neutralised (read back with csv-parse)", async () => {
    const res = await admin.get(`/api/tenancy-imports/${firstImportId}/report.csv`).expect(200);
    expect(res.headers["content-type"]).toMatch(/text\/csv/);
    const rows = parseCsv(res.text, { bom: true, columns: true }) as Record<string, string>[];
    expect(rows).toHaveLength(12);
    expect(rows[0]).toMatchObject({ row: "2", "tenancy reference": "T-1", outcome: "created" });
    expect(rows.at(-1)!["tenancy reference"]).toBe(`'=HYPERLINK("x")`);
    await otherAdmin.get(`/api/tenancy-imports/${firstImportId}/report.csv`).expect(404);
  });

  it("reads an .xlsx workbook alike: date cells, linked e-mail addresses, names in two columns", async () => {
    const wb = new ExcelJS.Workbook();
    const ws = wb.addWorksheet("Tenancies");
    ws.addRow(["Reference", "UPRN", "Forename", "Surname", "Email", "Start date"]);
    ws.addRow([
      "X-1",
      Number(uprn(3)),
      "Lou",
      "Sheet",
      { text: mail("lou"), hyperlink: `mailto:${mail("lou")}` },
      new Date(Date.UTC(2024, 8, 2)),
    ]);
    const file = Buffer.from(await wb.xlsx.writeBuffer());
    const res = await upload(admin, "/api/tenancy-imports", file, "tenancies.xlsx").expect(201);
    expect(brief(res.body.notable)).toEqual([[2, "X-1", "created", ""]]);
    const lou = await t.ctx.dataSource.getRepository(User).findOneByOrFail({ email: mail("lou") });
    expect(lou.name).toBe("Lou Sheet");
    const tenancy = await t.ctx.dataSource.getRepository(Tenancy).findOneByOrFail({ tenantUserId: lou.id });
    expect(tenancy.startDate).toBe("2024-09-02");
  });

  it("leaves nothing of a file when it fails half-way", async () => {
    const ds = t.ctx.dataSource;
    const lines = ["Ref,UPRN,Name,Email,Start"];
    for (let i = 1; i <= 5; i++) lines.push(`H-${i},${uprn(1)},Half ${i},${mail(`half${i}`)},2024-01-01`);
    // MariaDB refuses the fourth row's tenancy (a constraint of its own), after the accounts are written.
    await ds.query("ALTER TABLE tenancies ADD CONSTRAINT chk_half_way CHECK (reference IS NULL OR reference <> 'H-4')");
    try {
      await upload(admin, "/api/tenancy-imports", Buffer.from(lines.join("\n")), "half.csv").expect(500);
    } finally {
      await ds.query("ALTER TABLE tenancies DROP CONSTRAINT chk_half_way");
    }
    expect(await ds.getRepository(Tenancy).countBy({ organisationId: ours.org.id, reference: "H-1" })).toBe(0);
    expect(await ds.getRepository(User).countBy({ email: mail("half1") })).toBe(0);
  });

  it("refuses a file without the columns it needs, and changes nothing", async () => {
    const file = Buffer.from("Ref,Name\nZ-1,Nobody\n");
    const res = await upload(admin, "/api/tenancy-imports", file, "short.csv").expect(400);
    expect(res.body.error.message).toMatch(/UPRN/);
    expect(await t.ctx.dataSource.getRepository(Tenancy).countBy({ organisationId: ours.org.id, reference: "Z-1" })).toBe(0);
  });
});

describe("queued invitations", () => {
  const batchOf = async (importId: number) => {
    const list = await admin.get("/api/tenancy-imports").expect(200);
    return list.body.items.find((i: { id: number }) => i.id === importId).invitations;
  };

  it("go out at most N per tick until every one is sent exactly once", async () => {
    const ds = t.ctx.dataSource;
    const seen: number[] = [];
    for (let tick = 0; tick < 10; tick++) {
      const released = await t.ctx.services.invitationBatches.releaseDue();
      expect(released).toBeLessThanOrEqual(PER_BATCH);
      const progress = await batchOf(firstImportId);
      seen.push(progress.sent);
      if (progress.state === "done") break;
      expect(progress.nextReleaseAt).not.toBeNull();
    }
    expect(seen.slice(0, 2)).toEqual([2, 4]);
    expect(await batchOf(firstImportId)).toMatchObject({ total: 4, sent: 4, pending: 0, state: "done", nextReleaseAt: null });
    for (const who of ["ada", "ben", "jo"]) {
      expect(await ds.getRepository(OutboxEmail).countBy({ toAddress: mail(who), template: "invitation" })).toBe(1);
    }
    // The address another landlord uses is told it is in use, once, and is invited to nothing.
    expect(await ds.getRepository(OutboxEmail).countBy({ toAddress: foreignEmail, template: "invitationAddressInUse" })).toBe(1);
    expect(await ds.getRepository(OutboxEmail).countBy({ toAddress: foreignEmail, template: "invitation" })).toBe(0);
    // The ended tenancy's tenant is not invited.
    expect(await ds.getRepository(OutboxEmail).countBy({ toAddress: mail("fay") })).toBe(0);
  });

  it("lets the invited tenant accept, sign in and see their home", async () => {
    const raw = (await t.mail.lastTo(mail("ada"))).raw;
    const token = /\/invitation\/([A-Za-z0-9_-]{43})/.exec(raw)?.[1];
    expect(token).toBeDefined();
    const anon = await anonymousClient(t.app);
    await anon.post("/api/auth/invitations/accept", { token, password: "a long new password" }).expect(204);
    const ada = await signedInClient(t.app, mail("ada"), "a long new password");
    const home = await ada.get("/api/me/home").expect(200);
    expect(home.body.property.uprn).toBe(uprn(1));
  });

  it("never sends one invitation twice when two ticks run at once, and holds a paused batch", async () => {
    const ds = t.ctx.dataSource;
    const lines = ["Ref,UPRN,Name,Email,Start"];
    for (let i = 1; i <= 6; i++) lines.push(`C-${i},${uprn(2)},Con ${i},${mail(`con${i}`)},2024-01-01`);
    const res = await upload(admin, "/api/tenancy-imports", Buffer.from(lines.join("\n")), "more.csv").expect(201);
    const id: number = res.body.id;

    await admin.post(`/api/tenancy-imports/${id}/invitations/pause`).expect(204);
    await t.ctx.services.invitationBatches.releaseDue();
    expect(await batchOf(id)).toMatchObject({ sent: 0, pending: 6, state: "paused", nextReleaseAt: null });
    await otherAdmin.post(`/api/tenancy-imports/${id}/invitations/resume`).expect(404);
    await admin.post(`/api/tenancy-imports/${id}/invitations/resume`).expect(204);

    const released = await Promise.all([
      t.ctx.services.invitationBatches.releaseDue(),
      t.ctx.services.invitationBatches.releaseDue(),
    ]);
    expect(released[0] + released[1]).toBeLessThanOrEqual(2 * PER_BATCH);
    const sentNow = (await batchOf(id)).sent;
    expect(sentNow).toBeGreaterThan(0);
    await admin.post(`/api/tenancy-imports/${id}/invitations/cancel`).expect(204);
    expect(await batchOf(id)).toMatchObject({ sent: sentNow, cancelled: 6 - sentNow, pending: 0, state: "cancelled" });
    await t.ctx.services.invitationBatches.releaseDue();
    let total = 0;
    for (let i = 1; i <= 6; i++) {
      const n = await ds.getRepository(OutboxEmail).countBy({ toAddress: mail(`con${i}`), template: "invitation" });
      expect(n).toBeLessThanOrEqual(1);
      total += n;
    }
    expect(total).toBe(sentNow);
    expect(await ds.getRepository(PendingInvitation).countBy({ organisationId: theirs.org.id })).toBe(0);
  });

  it("are picked up by a new server process after a restart, none lost and none sent twice", async () => {
    const ds = t.ctx.dataSource;
    const lines = ["Ref,UPRN,Name,Email,Start"];
    for (let i = 1; i <= 3; i++) lines.push(`R-${i},${uprn(3)},Re ${i},${mail(`restart${i}`)},2024-01-01`);
    const res = await upload(admin, "/api/tenancy-imports", Buffer.from(lines.join("\n")), "restart.csv").expect(201);
    expect(res.body.invitations).toMatchObject({ total: 3, pending: 3 });
    // Another process on the same database, as after a restart: the queue is in MariaDB, not in memory.
    const again = await createTestApp({ INVITATIONS_PER_BATCH: String(PER_BATCH) });
    try {
      for (let tick = 0; tick < 5 && (await batchOf(res.body.id)).pending > 0; tick++) {
        await again.ctx.services.invitationBatches.releaseDue();
      }
      await again.mail.settle();
    } finally {
      await again.close();
    }
    expect(await batchOf(res.body.id)).toMatchObject({ sent: 3, pending: 0, state: "done" });
    for (let i = 1; i <= 3; i++) {
      expect(await ds.getRepository(OutboxEmail).countBy({ toAddress: mail(`restart${i}`), template: "invitation" })).toBe(1);
    }
  });

  it("shows another landlord none of it", async () => {
    const list = await otherAdmin.get("/api/tenancy-imports").expect(200);
    expect(list.body.items).toEqual([]);
    await otherAdmin.post(`/api/tenancy-imports/${firstImportId}/invitations/cancel`).expect(404);
  });
});
