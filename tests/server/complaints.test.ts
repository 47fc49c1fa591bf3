// Formal complaints, end to end against MariaDB: a tenant raises one about their own case, staff take it
// through stage 1 (with its one extension) and stage 2, with the letters in the outbox and on the case's
// timeline. "Now" is the app's clock, set by the test to chosen days, so every due date is worked out by
// hand below (the same calendar as tests/domain/complaint-clocks.test.ts: bank holidays from the holiday
// package's data, TRADE.md §5 timeframes [M, from memory], day 0 = the day of the event, due at the end
// of the London day).
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Clock } from "../../server/lib/clock.js";
import { complaintListResponse, complaintPolicyResponse } from "../../src/lib/contracts/complaints.js";
import { makeLandlord, makeProperty, makeTenant, PASSWORD } from "../support/factories.js";
import { outboxRows } from "../support/outbox.js";
import { createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";

/** The app's "now", set by the test. */
class SetClock implements Clock {
  private at = new Date("2026-12-21T10:00:00Z");
  now(): Date {
    return new Date(this.at);
  }
  set(iso: string): void {
    this.at = new Date(iso);
  }
}

const clock = new SetClock();
let t: TestApp;
let landlord: Awaited<ReturnType<typeof makeLandlord>>;
let tenant: Client;
let otherTenant: Client;
let officer: Client;
let operative: Client;
let caseId: number;
let complaintId: number;

const STAFF_NOTE = "STAFFNOTE-K3X9";

async function newCase(client: Client): Promise<number> {
  const home = (await client.get("/api/me/home").expect(200)).body.property;
  const created = await client
    .post("/api/cases", {
      description: "Black mould on the bedroom ceiling above the window.",
      locations: ["ceiling"],
      observations: ["mould-spots"],
      roomIds: [home.rooms[0].id],
    })
    .expect(201);
  return created.body.id;
}

const put = (client: Client, url: string, body: object) => client.agent.put(url).set("X-CSRF-Token", client.csrf).send(body);
const stage = (body: { stages: unknown[] }, n: 1 | 2) => body.stages[n - 1] as Record<string, unknown>;
const letters = () => outboxRows(t.ctx.dataSource, { to: landlord.tenant.email, template: "complaintLetter", caseId });
const tenantEvents = async (type: string) =>
  (
    (await tenant.get(`/api/cases/${caseId}/events`).expect(200)).body.events as {
      type: string;
      after: Record<string, unknown>;
    }[]
  ).filter((e) => e.type === type);

beforeAll(async () => {
  t = await createTestApp({}, undefined, clock);
  const ds = t.ctx.dataSource;
  landlord = await makeLandlord(ds);
  const otherHome = await makeProperty(ds, landlord.org);
  const other = await makeTenant(ds, landlord.org, otherHome);
  tenant = await signedInClient(t.app, landlord.tenant.email, PASSWORD);
  otherTenant = await signedInClient(t.app, other.email, PASSWORD);
  officer = await signedInClient(t.app, landlord.officer.email, PASSWORD);
  operative = await signedInClient(t.app, landlord.maintenance.email, PASSWORD);
  caseId = await newCase(tenant);
});
afterAll(() => t.close());

describe("a complaint through both stages", () => {
  it("is raised by the tenant in their words, with stage 1's clocks across Christmas", async () => {
    clock.set("2026-12-21T10:00:00Z"); // Monday 21 December 2026
    const res = await tenant
      .post(`/api/cases/${caseId}/complaints`, { description: "Nobody came to look at the mould for three weeks." })
      .expect(201);
    complaintId = res.body.id;
    expect(res.body).toMatchObject({ status: "stage-1-received", version: 1, onBehalf: false, staffNote: null });
    // Acknowledge within 5 working days: Tue 22, Wed 23, Thu 24, [Fri 25 Christmas, weekend, Mon 28
    // Boxing Day substitute], Tue 29, Wed 30 December.
    expect(stage(res.body, 1).acknowledgeDueAt).toBe("2026-12-30T23:59:59.999Z");
    // Until acknowledged, respond by 10 working days after Wed 30: Thu 31, [Fri 1 New Year's Day],
    // Mon 4 … Fri 8 (6), Mon 11 … Thu 14 January 2027 (10).
    expect(stage(res.body, 1).respondDueAt).toBe("2027-01-14T23:59:59.999Z");
    expect(stage(res.body, 2)).toMatchObject({ acknowledge: "not-started", acknowledgeDueAt: null });
    expect((await tenantEvents("complaint-raised"))[0]?.after).toMatchObject({ complaintId, onBehalf: false });
    // Nobody is assigned, so every officer is told, with the day the acknowledgement is due.
    const told = await outboxRows(t.ctx.dataSource, { to: landlord.officer.email, template: "complaintRaised", caseId });
    expect(told.map((m) => m.subject)).toEqual([
      expect.stringMatching(/^Formal complaint about DW-\d{4}-\d{5}: acknowledge by Wednesday 30 December 2026$/),
    ]);
  });

  it("allows one open complaint per case", async () => {
    await tenant.post(`/api/cases/${caseId}/complaints`, { description: "And another thing." }).expect(409);
    await officer.post(`/api/cases/${caseId}/complaints`, { description: "Phoned in: the same again." }).expect(409);
    expect((await tenant.get(`/api/cases/${caseId}/complaints`).expect(200)).body.complaints).toHaveLength(1);
  });

  it("is not there for another home's tenant (404) and not for the operatives (403)", async () => {
    await otherTenant.get(`/api/cases/${caseId}/complaints`).expect(404);
    await otherTenant.post(`/api/cases/${caseId}/complaints`, { description: "Me too." }).expect(404);
    await otherTenant.post(`/api/complaints/${complaintId}/escalate`, { version: 1, reason: "Not happy." }).expect(404);
    await operative.get(`/api/cases/${caseId}/complaints`).expect(403);
    await operative.post(`/api/complaints/${complaintId}/acknowledge`, { version: 1 }).expect(403);
    await tenant.post(`/api/complaints/${complaintId}/acknowledge`, { version: 1 }).expect(403);
  });

  it("is acknowledged once: the letter goes to the outbox and the timeline; the same move again is a 409 that changes nothing", async () => {
    clock.set("2026-12-30T15:00:00Z"); // Wednesday 30 December, in time
    const [a, b] = await Promise.all([
      officer.post(`/api/complaints/${complaintId}/acknowledge`, { version: 1, note: `${STAFF_NOTE} ack` }),
      officer.post(`/api/complaints/${complaintId}/acknowledge`, { version: 1 }),
    ]);
    expect([a.status, b.status].sort()).toEqual([200, 409]);
    const done = a.status === 200 ? a.body : b.body;
    expect(done).toMatchObject({ status: "stage-1-acknowledged", version: 2 });
    expect(stage(done, 1)).toMatchObject({ acknowledge: "met", respondDueAt: "2027-01-14T23:59:59.999Z" });

    const eventsBefore = (await officer.get(`/api/cases/${caseId}/events`).expect(200)).body.events.length;
    const stale = await officer.post(`/api/complaints/${complaintId}/acknowledge`, { version: 1 }).expect(409);
    expect(stale.body.error.message).toMatch(/changed since you opened it/);
    expect((await officer.get(`/api/cases/${caseId}/events`).expect(200)).body.events).toHaveLength(eventsBefore);

    const sent = await letters();
    expect(sent).toHaveLength(1);
    expect(sent[0]!.subject).toMatch(/received your complaint about DW-\d{4}-\d{5} \(stage 1\)/);
    expect(sent[0]!.textBody).toContain("Nobody came to look at the mould for three weeks.");
    expect(sent[0]!.textBody).toContain("Thursday 14 January 2027");
    const [ack] = await tenantEvents("complaint-acknowledged");
    expect(ack?.after).toMatchObject({ complaintId, stage: 1, letter: { subject: sent[0]!.subject } });
    expect(ack?.after).not.toHaveProperty("note");
  });

  it("is extended once, up to the policy's maximum, and the tenant sees the reason", async () => {
    clock.set("2027-01-12T10:00:00Z");
    const reason = "We are waiting for the roofer's report on the leak above the window.";
    const tooLong = await officer
      .post(`/api/complaints/${complaintId}/extend`, { version: 2, workingDays: 11, reason })
      .expect(400);
    expect(tooLong.body.error.message).toMatch(/at most 10 working days/);
    const res = await officer
      .post(`/api/complaints/${complaintId}/extend`, { version: 2, workingDays: 10, reason, note: `${STAFF_NOTE} ext` })
      .expect(200);
    // 10 working days after Thu 14 January: Fri 15, Mon 18 … Fri 22 (6), Mon 25 … Thu 28 January (10).
    expect(stage(res.body, 1)).toMatchObject({ respondDueAt: "2027-01-28T23:59:59.999Z", extensionWorkingDays: 10 });
    await officer.post(`/api/complaints/${complaintId}/extend`, { version: 3, workingDays: 2, reason }).expect(409);

    const mine = (await tenant.get(`/api/cases/${caseId}/complaints`).expect(200)).body.complaints[0];
    expect(stage(mine, 1)).toMatchObject({ extensionReason: reason, respondDueAt: "2027-01-28T23:59:59.999Z" });
    expect(JSON.stringify(mine)).not.toContain(STAFF_NOTE);
    const [extended] = await tenantEvents("complaint-extended");
    expect(extended?.after).toMatchObject({ reason, workingDays: 10 });
    const letter = (await letters()).at(-1)!;
    expect(letter.textBody).toContain(reason);
    expect(letter.textBody).toContain("Thursday 28 January 2027");
  });

  it("records the remedy in pence and sends the stage 1 response with it", async () => {
    clock.set("2027-01-20T11:00:00Z");
    const remedy = await put(officer, `/api/complaints/${complaintId}/remedy`, {
      version: 3,
      apology: true,
      apologyText: "We are sorry that nobody came for three weeks.",
      putRight: "A surveyor will inspect the roof and we will wash and treat the ceiling.",
      compensationOfferedPence: 15_050,
      compensationOfferedOn: "2027-01-20",
      note: `${STAFF_NOTE} remedy`,
    }).expect(200);
    expect(remedy.body.remedy).toMatchObject({ apology: true, compensationOfferedPence: 15_050, compensationPaidPence: null });
    await put(officer, `/api/complaints/${complaintId}/remedy`, {
      version: 4,
      apology: false,
      compensationPaidPence: 100,
    })
      .expect(400)
      .then((r) => expect(r.body.error.message).toMatch(/compensationPaidOn/));

    const res = await officer
      .post(`/api/complaints/${complaintId}/respond`, {
        version: 4,
        response: "We should have inspected within our timeframe. We have booked the surveyor.",
      })
      .expect(200);
    expect(res.body.status).toBe("stage-1-responded");
    expect(stage(res.body, 1)).toMatchObject({ respond: "met" });
    const letter = (await letters()).at(-1)!;
    expect(letter.subject).toMatch(/response to your complaint .* \(stage 1\)/);
    expect(letter.textBody).toContain("We are sorry that nobody came for three weeks.");
    expect(letter.textBody).toContain("£150.50");
  });

  it("is escalated by the tenant, with stage 2's clocks across Easter and the change to BST", async () => {
    clock.set("2027-03-23T09:00:00Z"); // Tuesday 23 March 2027
    const res = await tenant
      .post(`/api/complaints/${complaintId}/escalate`, { version: 5, reason: "The ceiling is still black." })
      .expect(200);
    expect(res.body).toMatchObject({ status: "stage-2-received", escalationReason: "The ceiling is still black." });
    // 5 working days: Wed 24, Thu 25, [Fri 26 Good Friday, weekend, Mon 29 Easter Monday], Tue 30,
    // Wed 31, Thu 1 April, ending 23:59:59.999 BST.
    expect(stage(res.body, 2).acknowledgeDueAt).toBe("2027-04-01T22:59:59.999Z");

    clock.set("2027-03-25T12:00:00Z"); // acknowledged Thursday 25 March
    const acked = await officer.post(`/api/complaints/${complaintId}/acknowledge`, { version: 6 }).expect(200);
    // 20 working days after Thu 25 March: Tue 30 (1) … Fri 23 April (19), Mon 26 April (20), BST.
    expect(stage(acked.body, 2)).toMatchObject({ acknowledge: "met", respondDueAt: "2027-04-26T22:59:59.999Z" });
  });

  it("closes with the final response, which tells the escalation route; a new complaint may then be raised", async () => {
    clock.set("2027-04-20T10:00:00Z");
    const res = await officer
      .post(`/api/complaints/${complaintId}/respond`, { version: 7, response: "The roof is repaired and the ceiling treated." })
      .expect(200);
    expect(res.body).toMatchObject({ status: "closed", closedAt: "2027-04-20T10:00:00.000Z" });
    const letter = (await letters()).at(-1)!;
    expect(letter.subject).toMatch(/final response/);
    expect(letter.textBody).toContain("Housing Ombudsman");
    expect((await tenantEvents("complaint-responded")).map((e) => e.after.final)).toEqual([false, true]);
    await tenant.post(`/api/complaints/${complaintId}/escalate`, { version: 8, reason: "Still unhappy." }).expect(409);
    await tenant.post(`/api/cases/${caseId}/complaints`, { description: "The mould has come back." }).expect(201);

    // Nothing staff-only reached the tenant, in the replies or in the letters.
    const seen = [
      (await tenant.get(`/api/cases/${caseId}/complaints`).expect(200)).text,
      (await tenant.get(`/api/cases/${caseId}/events`).expect(200)).text,
      ...(await letters()).map((l) => `${l.subject}\n${l.textBody}`),
    ].join("\n");
    expect(seen).not.toContain(STAFF_NOTE);
    expect((await officer.get(`/api/cases/${caseId}/events`).expect(200)).text).toContain(STAFF_NOTE);
  });

  it("gives the figures other modules read: counts by stage, on time or late, extensions, compensation", async () => {
    const figures = await t.ctx.services.complaints.figures(
      landlord.org.id,
      new Date("2026-12-01T00:00:00Z"),
      new Date("2027-05-01T00:00:00Z"),
    );
    expect(figures).toMatchObject({ raised: 2, open: 1, closed: 1, escalated: 1, closedAtStage1: 0, apologies: 1 });
    expect(figures.stage1).toMatchObject({ reached: 2, acknowledgedOnTime: 1, respondedOnTime: 1, extensions: 1 });
    expect(figures.stage2).toMatchObject({ reached: 1, acknowledgedOnTime: 1, respondedOnTime: 1, extensions: 0 });
    expect(figures.compensation).toEqual({ offeredCount: 1, offeredPence: 15_050, acceptedCount: 0, paidCount: 0, paidPence: 0 });
    // The dashboard shows the same figures, by stage, and exports them.
    const dashboard = (await officer.get("/api/insight/dashboard?from=2026-12-01&to=2027-04-30").expect(200)).body;
    expect(dashboard.complaints).toMatchObject({
      raised: 2,
      open: 1,
      closed: 1,
      escalated: 1,
      apologies: 1,
      compensationOfferedPence: 15_050,
    });
    expect(dashboard.complaints.stages).toMatchObject([
      { stage: 1, reached: 2, acknowledgedOnTime: 1, respondedOnTime: 1, extensions: 1 },
      { stage: 2, reached: 1, acknowledgedOnTime: 1, respondedOnTime: 1, extensions: 0 },
    ]);
    const csv = (await officer.get("/api/insight/export?table=complaints&from=2026-12-01&to=2027-04-30").expect(200)).text;
    expect(csv).toContain("Acknowledged on time");
    const history = await t.ctx.services.complaints.historyOfCase(caseId);
    expect(history.map((h) => h.complaint.status)).toEqual(["stage-1-received", "closed"]);
  });
});

describe("the replies", () => {
  it("fit the API contract exactly, for staff and for the tenant", async () => {
    for (const client of [officer, tenant]) {
      const body = (await client.get(`/api/cases/${caseId}/complaints`).expect(200)).body;
      expect(complaintListResponse.parse(body)).toEqual(body);
    }
    const policy = (await officer.get("/api/policy/complaints").expect(200)).body;
    expect(complaintPolicyResponse.parse(policy)).toEqual(policy);
    expect(policy.letters.map((l: { kind: string }) => l.kind)).toEqual([
      "acknowledgement",
      "extension",
      "stage-response",
      "final-response",
    ]);
  });
});

describe("a landlord's own complaint policy", () => {
  it("changes the clocks, and a final response must keep the escalation route", async () => {
    const other = await makeLandlord(t.ctx.dataSource);
    const admin = await signedInClient(t.app, other.admin.email, PASSWORD);
    const theirTenant = await signedInClient(t.app, other.tenant.email, PASSWORD);
    const policy = {
      stage1AcknowledgeWorkingDays: 2,
      stage1RespondWorkingDays: 3,
      stage2AcknowledgeWorkingDays: 5,
      stage2RespondWorkingDays: 20,
      extensionMaxWorkingDays: 5,
    };
    const refused = await put(admin, "/api/policy/complaints", {
      ...policy,
      letters: { "final-response": { subject: "Final", body: "{{response}} Goodbye." } },
    }).expect(400);
    expect(refused.body.error.message).toMatch(/\{\{escalationRoute\}\}/);
    const set = await put(admin, "/api/policy/complaints", {
      ...policy,
      escalationRoute: "Write to the Housing Ombudsman Service if you are still unhappy.",
      letters: { acknowledgement: { subject: "Complaint {{reference}} received", body: "Due by {{respondBy}}." } },
    }).expect(200);
    expect(set.body).toMatchObject({ source: "landlord", stage1AcknowledgeWorkingDays: 2 });

    clock.set("2026-12-21T10:00:00Z"); // Monday 21 December 2026
    const theirCase = await newCase(theirTenant);
    const raised = await theirTenant
      .post(`/api/cases/${theirCase}/complaints`, { description: "The fan was never fitted." })
      .expect(201);
    // 2 working days: Tue 22, Wed 23 December.
    expect(stage(raised.body, 1).acknowledgeDueAt).toBe("2026-12-23T23:59:59.999Z");
    // 3 working days after Wed 23: Thu 24, [Fri 25 … Mon 28], Tue 29, Wed 30 December.
    expect(stage(raised.body, 1).respondDueAt).toBe("2026-12-30T23:59:59.999Z");

    const officerThere = await signedInClient(t.app, other.officer.email, PASSWORD);
    await officerThere.post(`/api/complaints/${raised.body.id}/acknowledge`, { version: 1 }).expect(200);
    const [letter] = await outboxRows(t.ctx.dataSource, { to: other.tenant.email, template: "complaintLetter" });
    expect(letter?.subject).toMatch(/^Complaint DW-\d{4}-\d{5} received$/);
    // Respond by 3 working days after Mon 21 (acknowledged that day): Tue 22, Wed 23, Thu 24 December.
    expect(letter?.textBody).toContain("Due by Thursday 24 December 2026.");
    await officerThere
      .post(`/api/complaints/${raised.body.id}/extend`, { version: 2, workingDays: 6, reason: "Waiting for parts." })
      .expect(400);

    // Back to the default: the next complaint runs on TRADE.md §5's 5 working days again.
    await admin.agent.delete("/api/policy/complaints").set("X-CSRF-Token", admin.csrf).expect(200);
    expect((await officerThere.get("/api/policy/complaints").expect(200)).body).toMatchObject({
      source: "default",
      stage1AcknowledgeWorkingDays: 5,
    });
  });

  it("is for officers to read and admins to change", async () => {
    await operative.get("/api/policy/complaints").expect(403);
    await put(officer, "/api/policy/complaints", {}).expect(403);
  });
});
