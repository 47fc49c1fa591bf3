// The monthly board report (GET /api/board-report?month=…, the admin's list, sending): the PDF read back
// with pdftotext and pdfinfo (poppler-utils), its sections, page numbers, the landlord's name and the
// month; the Category 1 hazard and the missed deadline of a constructed case; another landlord's case
// never in it; and the monthly e-mail going once.
import { execFile } from "node:child_process";
import type { Response } from "supertest";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { promisify } from "node:util";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { OutboxEmail } from "../../server/modules/mail/outbox-email.entity.js";
import { previousMonth } from "../../server/modules/board-report/board-report.service.js";
import { addWorkingDays, localDate } from "../../src/lib/domain/working-days.js";
import { makeLandlord, makeProperty, PASSWORD } from "../support/factories.js";
import { createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";
import { testClock } from "../support/test-clock.js";

const run = promisify(execFile);
let t: TestApp;
let dir: string;
let officer: Client;
let admin: Client;
let tenant: Client;
let orgName: string;
let orgId: number;
let month: string; // three months before the test clock's (London) month: every deadline in it has passed
let monthWords: string;
let ours: string; // the reference of our Category 1 case, its investigation never recorded
let oursId: number;
let theirs: string; // another landlord's case in the same month

/** A PDF answer as bytes (supertest's parser). */
const binary = (res: Response, cb: (err: Error | null, body: Buffer) => void) => {
  const chunks: Buffer[] = [];
  res.on("data", (c: Buffer) => chunks.push(c));
  res.on("end", () => cb(null, Buffer.concat(chunks)));
};

/** The text of a section: from its heading line to the next heading's line. */
function section(all: string, heading: string, next: string): string {
  const line = (h: string) => new RegExp(`^\\s*${h.replace(/[.*+?^${}()|[\]\\]/g, "\\$&")}\\s*$`, "m");
  const start = all.search(line(heading));
  const end = all.search(line(next));
  expect(start, `the heading "${heading}"`).toBeGreaterThanOrEqual(0);
  expect(end, `the heading "${next}"`).toBeGreaterThan(start);
  return all.slice(start, end);
}

/** The PDF's text in reading order (no layout), so a table cell's wrapped lines stay together. */
async function readPdfFlow(bytes: Buffer): Promise<string> {
  const file = path.join(dir, `flow-${Math.random().toString(36).slice(2)}.pdf`);
  writeFileSync(file, bytes);
  return (await run("pdftotext", [file, "-"])).stdout.replace(/\s+/g, " ");
}

async function readPdf(bytes: Buffer): Promise<{ pages: number; text: string[] }> {
  const file = path.join(dir, `report-${Math.random().toString(36).slice(2)}.pdf`);
  writeFileSync(file, bytes);
  const info = (await run("pdfinfo", [file])).stdout;
  const pages = Number(/Pages:\s+(\d+)/.exec(info)![1]);
  const text: string[] = [];
  for (let p = 1; p <= pages; p++)
    text.push((await run("pdftotext", ["-layout", "-f", String(p), "-l", String(p), file, "-"])).stdout);
  return { pages, text };
}

beforeAll(async () => {
  t = await createTestApp();
  dir = mkdtempSync(path.join(tmpdir(), "dewline-board-report-"));
  const ds = t.ctx.dataSource;
  const a = await makeLandlord(ds);
  const b = await makeLandlord(ds);
  orgName = a.org.name;
  orgId = a.org.id;
  officer = await signedInClient(t.app, a.officer.email, PASSWORD);
  admin = await signedInClient(t.app, a.admin.email, PASSWORD);
  tenant = await signedInClient(t.app, a.tenant.email, PASSWORD);
  const otherOfficer = await signedInClient(t.app, b.officer.email, PASSWORD);

  const [y, m] = localDate(testClock.now()).split("-").map(Number) as [number, number];
  month = new Date(Date.UTC(y, m - 4, 1)).toISOString().slice(0, 7);
  monthWords = new Intl.DateTimeFormat("en-GB", { month: "long", year: "numeric", timeZone: "UTC" }).format(
    new Date(`${month}-01T00:00:00Z`),
  );
  // Aware on the 2nd at 10:00 UTC: the investigation is due 10 working days later, by the 20th even with
  // the most bank holidays a fortnight can hold (Christmas, Boxing Day, New Year's Day), so inside the month.
  const awareAt = new Date(`${month}-02T10:00:00Z`);
  expect(localDate(addWorkingDays(awareAt, 10)).slice(0, 7)).toBe(month);

  const home = await makeProperty(ds, a.org, { estate: "Rowan" });
  const report = (propertyId: number) => ({
    propertyId,
    awareAt: awareAt.toISOString(),
    channel: "phone",
    description: "Mould across the back bedroom's outside wall and ceiling.",
    locations: ["external-wall"],
    observations: ["mould-spots"],
  });
  const created = (await officer.post("/api/cases", report(home.id)).expect(201)).body as { id: number; reference: string };
  ours = created.reference;
  oursId = created.id;
  // TRADE.md §4 check vector: L = 3, O = (0, 1.0, 10.0, 89.0) → score 1630, band C, Category 1.
  await officer
    .post(`/api/cases/${created.id}/assessments`, {
      likelihood: 3,
      spread: [0, 1.0, 10.0, 89.0],
      justification: "Extensive mould in a child's bedroom on a cold outside wall.",
    })
    .expect(201);
  const otherHome = await makeProperty(ds, b.org, { estate: "Elsewhere" });
  theirs = ((await otherOfficer.post("/api/cases", report(otherHome.id)).expect(201)).body as { reference: string }).reference;
});

afterAll(async () => {
  await t?.close();
  if (dir) rmSync(dir, { recursive: true, force: true });
});

describe("the board report", () => {
  it("lists the reason an officer gave for a missed stage; a stage not missed has nothing to explain", async () => {
    const put = (client: Client, stage: string, reason: string) =>
      client.agent.put(`/api/cases/${oursId}/deadlines/${stage}/missed-reason`).set("X-CSRF-Token", client.csrf).send({ reason });
    await put(officer, "summary", "Not missed at all.").expect(409);
    await put(officer, "investigate", "x").expect(400);
    await put(tenant, "investigate", "I would like to explain.").expect(403);
    await put(officer, "investigate", "The inspector was off sick; nobody covered the visit.").expect(204);
    const deadlines = (await officer.get(`/api/cases/${oursId}/deadlines`).expect(200)).body.deadlines as {
      stage: string;
      missedReason: { reason: string } | null;
    }[];
    expect(deadlines.find((d) => d.stage === "investigate")!.missedReason!.reason).toBe(
      "The inspector was off sick; nobody covered the visit.",
    );
    const res = await officer.agent.get(`/api/board-report?month=${month}`).buffer(true).parse(binary).expect(200);
    expect(await readPdfFlow(res.body as Buffer)).toContain("The inspector was off sick; nobody covered the visit.");
    const events = (await officer.get(`/api/cases/${oursId}/events`).expect(200)).body.events as { type: string }[];
    expect(events.some((e) => e.type === "missed-deadline-explained")).toBe(true);
  });

  it("is a PDF of the month with page numbers, the landlord's name, its Category 1 hazard and its missed deadline", async () => {
    const res = await officer.agent.get(`/api/board-report?month=${month}`).buffer(true).parse(binary).expect(200);
    expect(res.headers["content-type"]).toMatch(/application\/pdf/);
    expect(res.headers["content-disposition"]).toContain(`board-report-${month}.pdf`);
    const { pages, text } = await readPdf(res.body as Buffer);
    expect(pages).toBeGreaterThanOrEqual(1);
    text.forEach((page, i) => {
      expect(page).toContain(`Page ${i + 1} of ${pages}`);
      expect(page).toContain(orgName);
    });
    const all = text.join("\n");
    expect(all).toContain(`Damp and mould: board report, ${monthWords}`);
    for (const heading of [
      "Summary",
      "Deadlines: this month and the last 12 months",
      "Time to act",
      "Category 1 hazards open",
      `Deadlines missed in ${monthWords}`,
      `Complaints raised in ${monthWords}`,
      "Where cases cluster",
      "Workload now",
    ])
      expect(all).toContain(heading);
    const categoryOne = section(all, "Category 1 hazards open", `Deadlines missed in ${monthWords}`);
    expect(categoryOne).toContain(ours);
    const missed = section(all, `Deadlines missed in ${monthWords}`, `Complaints raised in ${monthWords}`);
    expect(missed).toContain(ours);
    expect(missed).toMatch(/Investigate/);
    expect(missed).toContain("Not yet done");
    expect(all).not.toContain(theirs);
  });

  it("refuses a month that is not one, or has not begun, and anyone but staff", async () => {
    await officer.get("/api/board-report?month=2026-13").expect(400);
    await officer.get("/api/board-report").expect(400);
    const [y] = localDate(testClock.now()).split("-").map(Number) as [number];
    await officer.get(`/api/board-report?month=${y + 1}-01`).expect(400);
    await tenant.get(`/api/board-report?month=${month}`).expect(403);
  });

  it("keeps the admin's list, refusing a bad address and changing nothing", async () => {
    await officer.agent.put("/api/board-report/settings").set("X-CSRF-Token", officer.csrf).send({ recipients: [] }).expect(403);
    const bad = await admin.agent
      .put("/api/board-report/settings")
      .set("X-CSRF-Token", admin.csrf)
      .send({ recipients: ["chair@board.example", "not an address"] })
      .expect(400);
    expect(bad.body.error.message ?? bad.body.message).toContain("not an address");
    expect((await admin.get("/api/board-report/settings").expect(200)).body).toEqual({ recipients: [], lastSent: null });
    const saved = await admin.agent
      .put("/api/board-report/settings")
      .set("X-CSRF-Token", admin.csrf)
      .send({ recipients: [" Chair@Board.example ", "treasurer@board.example", "chair@board.example"] })
      .expect(200);
    expect(saved.body.recipients).toEqual(["chair@board.example", "treasurer@board.example"]);
  });

  it("e-mails a month's report to the list with the PDF attached; the monthly run sends last month's once", async () => {
    const sent = await admin.post("/api/board-report/send", { month }).expect(200);
    expect(sent.body).toEqual({ month, emails: 2 });
    const outbox = t.ctx.dataSource.getRepository(OutboxEmail);
    const mails = await outbox.findBy({ organisationId: orgId, template: "boardReport" });
    expect(mails.map((m) => m.toAddress).sort()).toEqual(["chair@board.example", "treasurer@board.example"]);
    const attachment = mails[0]!.attachments![0]!;
    expect(attachment).toMatchObject({
      filename: `board-report-${month}.pdf`,
      contentType: "application/pdf",
      encoding: "base64",
    });
    const { text } = await readPdf(Buffer.from(attachment.content, "base64"));
    expect(text.join("\n")).toContain(ours);

    const now = testClock.now();
    const before = await outbox.countBy({ organisationId: orgId, template: "boardReport" });
    await t.ctx.services.boardReports.sendDue(now);
    await t.ctx.services.boardReports.sendDue(now);
    expect(await outbox.countBy({ organisationId: orgId, template: "boardReport" })).toBe(before + 2);
    const settings = (await admin.get("/api/board-report/settings").expect(200)).body;
    expect(settings.lastSent.month).toBe(previousMonth(now));
  });
});
