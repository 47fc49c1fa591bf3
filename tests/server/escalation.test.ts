// "It's got worse" (POST /api/cases/:id/worse) and the rule that an overdue emergency comes first:
// the case is re-scored at once, the assignee (or, when nobody is assigned, the officers) is
// e-mailed with the tenant's words, and a closed, cancelled or monitored case is reopened with
// those words as the reason. The queue and the daily digest put an emergency past its deadline first.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Case } from "../../server/modules/cases/case.entity.js";
import { CaseEvent } from "../../server/modules/cases/case-event.entity.js";
import type { CaseStatus } from "../../src/lib/domain/case-workflow.js";
import { makeLandlord, makeUser, PASSWORD } from "../support/factories.js";
import { outboxCount } from "../support/outbox.js";
import { createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";
import { hoursAgo, testClock } from "../support/test-clock.js";

let t: TestApp;
let landlord: Awaited<ReturnType<typeof makeLandlord>>;
let officer: Client;
let tenant: Client;
const report = {
  description: "Black mould behind the bedroom wardrobe.",
  locations: ["behind-furniture"],
  observations: ["mould-spots"],
};

beforeAll(async () => {
  t = await createTestApp();
  landlord = await makeLandlord(t.ctx.dataSource);
  officer = await signedInClient(t.app, landlord.officer.email, PASSWORD);
  tenant = await signedInClient(t.app, landlord.tenant.email, PASSWORD);
});
afterAll(() => t.close());

const row = (id: number) => t.ctx.dataSource.getRepository(Case).findOneByOrFail({ id });

/** A tenant's case walked along the workflow through CaseService.transition, each move with a reason. */
async function caseAt(path: CaseStatus[], over: object = {}): Promise<{ id: number; reference: string }> {
  const c = (await tenant.post("/api/cases", { ...report, ...over }).expect(201)).body as { id: number; reference: string };
  await t.ctx.dataSource.transaction(async (m) => {
    for (const to of path)
      await t.ctx.services.cases.transition(m, c.id, to, "Set up for this test.", { id: landlord.officer.id });
  });
  return c;
}

describe("it's got worse", () => {
  it("reopens a closed case with the tenant's words, e-mails the officers and puts it back in the queue", async () => {
    const c = await caseAt(["triaged", "investigated", "closed"]);
    const note = "The mould has come back on the ceiling above the cot.";
    const res = await tenant.post(`/api/cases/${c.id}/worse`, { note }).expect(200);
    expect(res.body).toEqual({ status: "triaged", reopened: true, told: "officers" });
    expect((await row(c.id)).status).not.toBe("closed");

    const events = (await officer.get(`/api/cases/${c.id}/events`).expect(200)).body.events;
    const reopen = events.filter((e: { type: string }) => e.type === "status-changed").at(-1);
    expect(reopen.before.status).toBe("closed");
    expect(reopen.after).toEqual({ status: "triaged", reason: `The tenant says it has got worse: "${note}"` });

    // Nobody is assigned: every officer of the landlord is told, in the tenant's words.
    const mail = await t.mail.lastTo(landlord.officer.email);
    expect(mail.subject).toContain(c.reference);
    expect(mail.raw).toContain(note);
    expect(mail.raw).toMatch(/reopened/);

    const queue = (await officer.get("/api/cases?pageSize=200").expect(200)).body.items as { id: number; status: string }[];
    expect(queue.find((i) => i.id === c.id)?.status).toBe("triaged");
  });

  it("reopens a case being monitored", async () => {
    const c = await caseAt(["triaged", "investigated", "works-planned", "works-done", "monitoring"]);
    const res = await tenant
      .post(`/api/cases/${c.id}/worse`, { note: "Wet on the window sill every morning again." })
      .expect(200);
    expect(res.body).toMatchObject({ status: "triaged", reopened: true });
  });

  it("e-mails only the assignee when the case is assigned, and does not move an open case", async () => {
    const assignee = await makeUser(t.ctx.dataSource, landlord.org, "officer", { name: "Ines Assigned" });
    const c = await caseAt(["triaged"]);
    await officer.patch(`/api/cases/${c.id}`, { assigneeId: assignee.id }).expect(200);
    const res = await tenant.post(`/api/cases/${c.id}/worse`, { note: "Now on the wardrobe doors too." }).expect(200);
    expect(res.body).toEqual({ status: "triaged", reopened: false, told: "assignee" });
    expect(await outboxCount(t.ctx.dataSource, { to: assignee.email, template: "caseWorse", caseId: c.id })).toBe(1);
    expect(await outboxCount(t.ctx.dataSource, { to: landlord.officer.email, template: "caseWorse", caseId: c.id })).toBe(0);
    expect((await t.mail.lastTo(assignee.email)).raw).toContain("Now on the wardrobe doors too.");
  });

  it("raises the priority at once, in the request itself", async () => {
    const c = await caseAt([]);
    // Work the figures out now so the starting priority is stored and not stale.
    await t.ctx.services.triage.refresh(c.id);
    const before = await row(c.id);
    await tenant.post(`/api/cases/${c.id}/worse`, { note: "Spreading along the skirting board." }).expect(200);
    const after = await row(c.id);
    expect(after.priority).toBe(before.priority + 5);
    // Stored by the request, not left for the sweep: the stale mark is gone.
    expect(after.triageDueAt === null || after.triageDueAt.getTime() > testClock.now().getTime()).toBe(true);
    const breakdown = (await officer.get(`/api/cases/${c.id}/triage`).expect(200)).body;
    expect(breakdown.parts.find((p: { factor: string }) => p.factor === "reported-worse").points).toBe(5);
  });

  it("needs the tenant's words: 400 naming note, and nothing changes", async () => {
    const c = await caseAt(["triaged", "investigated", "closed"]);
    const eventsBefore = await t.ctx.dataSource.getRepository(CaseEvent).countBy({ caseId: c.id });
    const res = await tenant.post(`/api/cases/${c.id}/worse`, {}).expect(400);
    expect(res.body.error.details[0].field).toBe("note");
    await tenant.post(`/api/cases/${c.id}/worse`, { note: " " }).expect(400);
    expect((await row(c.id)).status).toBe("closed");
    expect(await t.ctx.dataSource.getRepository(CaseEvent).countBy({ caseId: c.id })).toBe(eventsBefore);
  });

  it("is the tenant's alone: staff get 403", async () => {
    const c = await caseAt([]);
    await officer.post(`/api/cases/${c.id}/worse`, { note: "Not mine to say." }).expect(403);
  });
});

describe("an overdue emergency comes first", () => {
  it("ranks an emergency past its make-safe above a case with more points due in days, in the queue", async () => {
    const other = await makeLandlord(t.ctx.dataSource);
    const otherOfficer = await signedInClient(t.app, other.officer.email, PASSWORD);
    const otherTenant = await signedInClient(t.app, other.tenant.email, PASSWORD);
    // Many points, no emergency: children at home, mould larger than a door, and it got worse today.
    const busy = (
      await otherTenant
        .post("/api/cases", { ...report, area: "larger", vulnerability: ["children-under-15", "over-65"] })
        .expect(201)
    ).body;
    await otherTenant.post(`/api/cases/${busy.id}/worse`, { note: "It has spread to the second bedroom." }).expect(200);
    // Few points, but an emergency the landlord became aware of 30 hours ago: make-safe was due 6 hours ago.
    const emergency = (
      await otherOfficer
        .post("/api/cases", {
          ...report,
          area: "hand",
          vulnerability: [],
          propertyId: other.home.id,
          channel: "phone",
          awareAt: hoursAgo(30).toISOString(),
        })
        .expect(201)
    ).body;
    await otherOfficer
      .patch(`/api/cases/${emergency.id}`, { hazardClass: "emergency", reason: "Water through the light fitting above the bed." })
      .expect(200);

    const items = (await otherOfficer.get("/api/cases?pageSize=50").expect(200)).body.items as {
      id: number;
      priority: number;
      overdue: boolean;
    }[];
    expect(items[0]).toMatchObject({ id: emergency.id, priority: 100, overdue: true });
    const busyItem = items.find((i) => i.id === busy.id)!;
    expect(busyItem.priority).toBeLessThan(100);
    // Without the rule the emergency would rank below: its ordinary points are fewer than the busy case's.
    const breakdown = (await otherOfficer.get(`/api/cases/${emergency.id}/triage`).expect(200)).body;
    const parts = breakdown.parts as { factor: string; points: number }[];
    expect(parts.at(-1)!.factor).toBe("emergency-overdue");
    const ordinary = parts.filter((p) => p.factor !== "emergency-overdue").reduce((sum, p) => sum + p.points, 0);
    expect(ordinary).toBeLessThan(busyItem.priority);
  });

  it("lists an emergency past its deadline first in the daily digest, above cases overdue for longer", async () => {
    const other = await makeLandlord(t.ctx.dataSource);
    const repo = t.ctx.dataSource.getRepository(Case);
    // Deadlines set on the rows (triage_due_at null: nothing recomputes them), as deadline-digest.test.ts does,
    // on Tuesday 4 March 2025 (GMT); the window ends on Thursday 6 March.
    const make = async (o: { hazardClass: "emergency" | "significant"; stage: "make-safe" | "investigate"; dueAt: string }) => {
      const saved = await repo.save(
        repo.create({
          organisationId: other.org.id,
          propertyId: other.home.id,
          reporterUserId: other.officer.id,
          channel: "phone",
          awareAt: new Date("2025-02-10T10:00:00Z"),
          description: "Mould on the bedroom wall.",
          locations: ["external-wall"],
          observations: ["mould-spots"],
          status: "triaged",
          hazardClass: o.hazardClass,
        }),
      );
      await repo.update(saved.id, {
        reference: `ES-${saved.id}`,
        nextStage: o.stage,
        nextDueAt: new Date(o.dueAt),
        triageDueAt: null,
      });
      return `ES-${saved.id}`;
    };
    const longOverdue = await make({ hazardClass: "significant", stage: "investigate", dueAt: "2025-02-24T23:59:59.999Z" });
    const dueTomorrow = await make({ hazardClass: "significant", stage: "investigate", dueAt: "2025-03-05T23:59:59.999Z" });
    const emergency = await make({ hazardClass: "emergency", stage: "make-safe", dueAt: "2025-03-04T06:00:00.000Z" });
    try {
      await t.ctx.services.digest.sendDue(new Date("2025-03-04T08:00:00Z"));
      const digest = await t.mail.lastTo(other.officer.email);
      const at = (reference: string) => digest.raw.indexOf(reference);
      expect(at(emergency)).toBeGreaterThan(-1);
      expect(at(emergency)).toBeLessThan(at(longOverdue));
      expect(at(longOverdue)).toBeLessThan(at(dueTomorrow));
    } finally {
      // Out of later digests of other files.
      await repo.update({ organisationId: other.org.id }, { status: "closed" });
    }
  });
});
