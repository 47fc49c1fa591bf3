// Text messages to tenants: through the official SDK to the local stand-in (started here, in-process),
// by the text outbox and its relay, onto the case timeline; only to tenants who turned texts on.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { startSmsStandIn, type SmsStandIn } from "../../scripts/lib/sms-stand-in.js";
import { loadConfig } from "../../server/config/env.js";
import { OutboxSms } from "../../server/modules/sms/outbox-sms.entity.js";
import { makeLandlord, makeProperty, makeTenant, PASSWORD } from "../support/factories.js";
import { createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";
import { hoursAgo, workingDayAhead } from "../support/test-clock.js";

let t: TestApp;
let phone: SmsStandIn;
let landlord: Awaited<ReturnType<typeof makeLandlord>>;
let officer: Client;
let lead: Client;
let tenant: Client;
let quietTenant: Client;
let quietTenantId: number;

const report = {
  description: "Mould on the bedroom wall behind the wardrobe.",
  locations: ["ceiling"],
  observations: ["mould-spots"],
};
const inspection = {
  inspectedAt: hoursAgo(1).toISOString(),
  cause: "condensation",
  mouldExtent: "under-1-m2",
  findings: "Condensation mould on a cold outside wall.",
  roomReadings: [],
};

async function caseOf(client: Client): Promise<number> {
  const c = (await client.post("/api/cases", report).expect(201)).body;
  await officer
    .patch(`/api/cases/${c.id}`, { status: "triaged", hazardClass: "significant", reason: "Mould in a bedroom." })
    .expect(200);
  await officer.post(`/api/cases/${c.id}/inspections`, inspection).expect(201);
  return c.id as number;
}

async function book(caseId: number, date = workingDayAhead(10)): Promise<number> {
  const wo = (
    await officer
      .post(`/api/cases/${caseId}/work-orders`, { type: "extractor-fan", description: "Fit an extract fan." })
      .expect(201)
  ).body;
  await lead
    .patch(`/api/work-orders/${wo.id}`, { assigneeId: landlord.maintenance.id, slot: { date, window: "am" } })
    .expect(200);
  return wo.id as number;
}

const settled = () => t.ctx.services.sms.relay.idle();
const textsTo = (n: string) => phone.messages().filter((m) => m.to === n);
const rowsOf = (caseId: number) =>
  t.ctx.dataSource.getRepository(OutboxSms).find({ where: { relatedType: "case", relatedId: caseId }, order: { id: "ASC" } });
const timeline = async (caseId: number, who: Client = officer) =>
  (await who.get(`/api/cases/${caseId}/events`).expect(200)).body.events as {
    type: string;
    after: Record<string, unknown>;
    text?: { status: string; providerId: string | null } | null;
  }[];

const NUMBER = "07700 900123";
const E164 = "+447700900123";

beforeAll(async () => {
  const defaults = loadConfig({});
  phone = await startSmsStandIn({ apiKey: defaults.sms.apiKey, templateId: defaults.sms.templateId });
  t = await createTestApp({ SMS_BASE_URL: phone.url });
  landlord = await makeLandlord(t.ctx.dataSource);
  officer = await signedInClient(t.app, landlord.officer.email, PASSWORD);
  lead = await signedInClient(t.app, landlord.maintenance.email, PASSWORD);
  tenant = await signedInClient(t.app, landlord.tenant.email, PASSWORD);
  const other = await makeProperty(t.ctx.dataSource, landlord.org);
  const quiet = await makeTenant(t.ctx.dataSource, landlord.org, other);
  quietTenantId = quiet.id;
  quietTenant = await signedInClient(t.app, quiet.email, PASSWORD);
});
afterAll(async () => {
  await t?.close();
  await phone?.close();
});

describe("the tenant's choice", () => {
  it("is off until the tenant turns it on, refuses a number that is not a UK mobile in plain words, and staff can see it", async () => {
    expect((await tenant.get("/api/me/texts").expect(200)).body).toEqual({ mobileNumber: null, textsOn: false });
    const landline = await tenant.agent
      .put("/api/me/texts")
      .set("X-CSRF-Token", tenant.csrf)
      .send({ mobileNumber: "020 7946 0000", textsOn: true });
    expect(landline.status).toBe(400);
    expect(JSON.stringify(landline.body)).toMatch(/starts with 07/);
    const none = await tenant.agent
      .put("/api/me/texts")
      .set("X-CSRF-Token", tenant.csrf)
      .send({ mobileNumber: null, textsOn: true });
    expect(none.status).toBe(400);
    expect(JSON.stringify(none.body)).toMatch(/Enter your mobile number/);
    expect((await tenant.get("/api/me/texts").expect(200)).body).toEqual({ mobileNumber: null, textsOn: false });
    const on = await tenant.agent
      .put("/api/me/texts")
      .set("X-CSRF-Token", tenant.csrf)
      .send({ mobileNumber: NUMBER, textsOn: true });
    expect(on.status).toBe(200);
    expect(on.body).toEqual({ mobileNumber: E164, textsOn: true });
  });
});

describe("texts about a case", () => {
  it("an offered appointment texts an opted-in tenant once, through the outbox, with a valid token, and shows on the timeline", async () => {
    const caseId = await caseOf(tenant);
    const before = textsTo(E164).length;
    await book(caseId);
    await settled();
    const texts = textsTo(E164).slice(before);
    expect(texts).toHaveLength(1);
    expect(texts[0]!.body).toMatch(/We can come/);
    expect(texts[0]!.body).toContain(`http://dewline.test/cases/${caseId}`);
    expect(phone.checkedTokens().every((x) => x.valid)).toBe(true);
    const rows = await rowsOf(caseId);
    expect(rows).toHaveLength(1);
    expect(rows[0]).toMatchObject({ kind: "appointment-offered", status: "sent", providerId: texts[0]!.id, toNumber: E164 });
    const staffView = (await timeline(caseId)).filter((e) => e.type === "text-queued");
    expect(staffView).toHaveLength(1);
    expect(staffView[0]!.text).toMatchObject({ status: "sent", providerId: texts[0]!.id });
    // The tenant sees the same entry, with what the text said, and no delivery details.
    const tenantView = (await timeline(caseId, tenant)).filter((e) => e.type === "text-queued");
    expect(tenantView[0]!.after.body).toBe(texts[0]!.body);
    expect(tenantView[0]!.text ?? null).toBeNull();
  });

  it("an opted-out tenant gets no text, and the timeline says e-mail only", async () => {
    const caseId = await caseOf(quietTenant);
    const before = phone.messages().length;
    await book(caseId, workingDayAhead(14));
    await settled();
    // Other test files share the database (and so the outbox): only texts about this case count.
    expect(
      phone
        .messages()
        .slice(before)
        .filter((m) => m.body.includes(`/cases/${caseId}`)),
    ).toHaveLength(0);
    expect(await rowsOf(caseId)).toHaveLength(0);
    const entries = (await timeline(caseId, quietTenant)).filter((e) => e.type.startsWith("text-"));
    expect(entries).toEqual([
      expect.objectContaining({ type: "text-not-sent", after: { kind: "appointment-offered", reason: "texts-off" } }),
    ]);
    expect(quietTenantId).toBeGreaterThan(0);
  });

  it("a failing provider leaves the text queued and retried, not lost", async () => {
    const caseId = await caseOf(tenant);
    phone.failWith(500);
    try {
      await officer.post(`/api/cases/${caseId}/messages`, { body: "We have booked a surveyor.", internal: false }).expect(201);
      await settled();
    } finally {
      phone.failWith(null);
    }
    const [row] = await rowsOf(caseId);
    expect(row).toMatchObject({ kind: "landlord-replied", status: "pending", attempts: 1 });
    expect(row!.error).toMatch(/500/);
    expect(row!.nextAttemptAt!.getTime()).toBeGreaterThan(t.ctx.clock.now().getTime());
    // The retry comes due (as time passes), and goes.
    await t.ctx.dataSource.getRepository(OutboxSms).update(row!.id, { nextAttemptAt: t.ctx.clock.now() });
    await t.ctx.services.sms.relay.drain();
    const [after] = await rowsOf(caseId);
    expect(after).toMatchObject({ status: "sent", attempts: 2, error: null });
    const sent = phone.messages().filter((m) => m.id === after!.providerId);
    expect(sent).toHaveLength(1);
    expect(sent[0]!.body).toMatch(/We have sent you a message about your report/);
    // The text says a message is waiting, never the message itself.
    expect(sent[0]!.body).not.toContain("surveyor");
  });

  it("a replayed message (same Idempotency-Key) texts once", async () => {
    const caseId = await caseOf(tenant);
    const send = () =>
      officer.agent
        .post(`/api/cases/${caseId}/messages`)
        .set("X-CSRF-Token", officer.csrf)
        .set("Idempotency-Key", `sms-test-${caseId}`)
        .send({ body: "Thank you for the photos.", internal: false });
    expect((await send()).status).toBe(201);
    expect((await send()).status).toBe(201);
    await settled();
    expect(await rowsOf(caseId)).toHaveLength(1);
  });

  it("the written summary is texted", async () => {
    const caseId = await caseOf(tenant);
    await officer.post(`/api/cases/${caseId}/summary`, { body: "We found condensation mould. We will fit a fan." }).expect(201);
    await settled();
    const rows = await rowsOf(caseId);
    expect(rows.map((r) => [r.kind, r.status])).toEqual([["summary-sent", "sent"]]);
    expect(rows[0]!.body).toMatch(/written summary/);
  });

  it("reminds the day before by the clock it is given, once per booking", async () => {
    const caseId = await caseOf(tenant);
    const date = workingDayAhead(20);
    await book(caseId, date);
    await settled();
    const dayBefore = new Date(`${date}T12:00:00Z`);
    dayBefore.setUTCDate(dayBefore.getUTCDate() - 1);
    const twoDaysBefore = new Date(dayBefore.getTime() - 86_400_000);
    await t.ctx.services.works.textDueReminders(twoDaysBefore);
    await t.ctx.services.works.textDueReminders(dayBefore);
    await t.ctx.services.works.textDueReminders(dayBefore);
    await settled();
    const reminders = (await rowsOf(caseId)).filter((r) => r.kind === "appointment-reminder");
    expect(reminders).toHaveLength(1);
    expect(reminders[0]).toMatchObject({ status: "sent" });
    expect(reminders[0]!.body).toMatch(/coming tomorrow/);
  });
});
