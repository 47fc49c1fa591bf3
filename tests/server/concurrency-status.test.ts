// Status moves made at the same moment (issue 16: read-modify-write safe on Galera). Two attempts at
// once on separate connections: one wins and the other is told 409, or both are legal and both
// stand; either way the final state is consistent. "Another Galera node" is played by swapping the
// row-lock read for a plain read held at a barrier until both attempts have read: on a cluster a
// lock taken on one node is not seen on another, so the conditional UPDATE must keep the loser out.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { CaseEvent } from "../../server/modules/cases/case-event.entity.js";
import { Case } from "../../server/modules/cases/case.entity.js";
import { WorkOrderBooking } from "../../server/modules/works/booking.entity.js";
import { OperativeSlot } from "../../server/modules/works/operative-slot.entity.js";
import { WorkOrder } from "../../server/modules/works/work-order.entity.js";
import { makeLandlord, makeUser, PASSWORD } from "../support/factories.js";
import { createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";
import { localDate } from "../../src/lib/domain/working-days.js";
import { hoursAgo, testClock, workingDayAhead } from "../support/test-clock.js";

let t: TestApp;
let landlord: Awaited<ReturnType<typeof makeLandlord>>;
let officer: Client;
let secondOfficer: Client;
let lead: Client;
let tenant: Client;

const report = {
  description: "Mould spreading along the bedroom window reveal.",
  locations: ["window"],
  observations: ["mould-spots"],
};

const triage = { status: "triaged", hazardClass: "significant", reason: "Mould by a child's bed." };

beforeAll(async () => {
  t = await createTestApp();
  landlord = await makeLandlord(t.ctx.dataSource);
  officer = await signedInClient(t.app, landlord.officer.email, PASSWORD);
  const other = await makeUser(t.ctx.dataSource, landlord.org, "officer");
  secondOfficer = await signedInClient(t.app, other.email, PASSWORD);
  lead = await signedInClient(t.app, landlord.maintenance.email, PASSWORD);
  tenant = await signedInClient(t.app, landlord.tenant.email, PASSWORD);
});
afterAll(() => t.close());

/** Resolves every arrival once `n` have arrived; later arrivals pass at once. */
function barrier(n: number): () => Promise<void> {
  let arrived = 0;
  let open!: () => void;
  const opened = new Promise<void>((resolve) => (open = resolve));
  return async () => {
    arrived += 1;
    if (arrived >= n) open();
    await opened;
  };
}

/** Runs `work` with the case row's lock read swapped for a plain read held until two have read. */
async function withoutCaseLock<T>(work: () => Promise<T>): Promise<T> {
  const cases = t.ctx.services.cases;
  const original = cases.lockRow;
  const bothRead = barrier(2);
  cases.lockRow = async (m, caseId) => {
    const c = await m.getRepository(Case).findOneByOrFail({ id: caseId });
    await bothRead();
    return c;
  };
  try {
    return await work();
  } finally {
    cases.lockRow = original;
  }
}

/** Runs `work` with the work order's lock read swapped for a plain read held until two have read. */
async function withoutOrderLock<T>(work: () => Promise<T>): Promise<T> {
  const works = t.ctx.services.works;
  const original = works.getForActor;
  const bothRead = barrier(2);
  works.getForActor = async (actor, id, m, lock) => {
    const wo = await original.call(works, actor, id, m, false);
    if (lock) await bothRead();
    return wo;
  };
  try {
    return await work();
  } finally {
    works.getForActor = original;
  }
}

const statusChanges = (caseId: number) => t.ctx.dataSource.getRepository(CaseEvent).findBy({ caseId, type: "status-changed" });

async function investigatedCase(): Promise<number> {
  const c = (await tenant.post("/api/cases", report).expect(201)).body;
  await officer
    .patch(`/api/cases/${c.id}`, { status: "triaged", hazardClass: "significant", reason: "Mould by a child's bed." })
    .expect(200);
  await officer
    .post(`/api/cases/${c.id}/inspections`, {
      inspectedAt: hoursAgo(1).toISOString(),
      cause: "condensation",
      mouldExtent: "under-1-m2",
      findings: "Cold window reveal; condensation mould along it.",
      roomReadings: [],
    })
    .expect(201);
  return c.id;
}

describe("a case's status moved twice at once", () => {
  it("the same move by two officers: it is made once, both are answered 200", async () => {
    const c = (await tenant.post("/api/cases", report).expect(201)).body;
    const answers = await Promise.all([
      officer.patch(`/api/cases/${c.id}`, triage),
      secondOfficer.patch(`/api/cases/${c.id}`, triage),
    ]);
    expect(answers.map((a) => a.status)).toEqual([200, 200]);
    expect(answers.map((a) => a.body.status)).toEqual(["triaged", "triaged"]);
    expect(await statusChanges(c.id)).toHaveLength(1);
  });

  it("two different moves judged from the same status, the lock not seen: one wins, the other is a 409 and leaves nothing", async () => {
    const c = (await tenant.post("/api/cases", report).expect(201)).body;
    const answers = await withoutCaseLock(() =>
      Promise.all([
        officer.patch(`/api/cases/${c.id}`, triage),
        secondOfficer.patch(`/api/cases/${c.id}`, { status: "cancelled", reason: "Reported twice by mistake." }),
      ]),
    );
    expect(answers.map((a) => a.status).sort()).toEqual([200, 409]);
    const loser = answers.find((a) => a.status === 409)!;
    expect(loser.body.error.message).toMatch(/Someone else changed this case's status a moment ago/);
    const winner = answers.find((a) => a.status === 200)!;
    const stored = await t.ctx.dataSource.getRepository(Case).findOneByOrFail({ id: c.id });
    expect(stored.status).toBe(winner.body.status);
    // Only the winner's move is on the timeline: the loser's event rolled back with it.
    const changes = await statusChanges(c.id);
    expect(changes.map((e) => e.after?.status)).toEqual([winner.body.status]);
  });
});

describe("a work order changed twice at once", () => {
  it("two bookings of one order for one operative and one slot: one stands, the slot is held once", async () => {
    const caseId = await investigatedCase();
    const wo = (
      await officer.post(`/api/cases/${caseId}/work-orders`, { type: "mould-wash", description: "Wash the reveal." }).expect(201)
    ).body;
    const slot = { date: workingDayAhead(8), window: "am" };
    const answers = await withoutOrderLock(() =>
      Promise.all([
        lead.patch(`/api/work-orders/${wo.id}`, { assigneeId: landlord.maintenance.id, slot }),
        lead.patch(`/api/work-orders/${wo.id}`, { assigneeId: landlord.maintenance.id, slot }),
      ]),
    );
    expect(answers.map((a) => a.status).sort()).toContain(200);
    for (const a of answers) expect([200, 409]).toContain(a.status);
    const active = await t.ctx.dataSource.getRepository(WorkOrderBooking).findBy({ workOrderId: wo.id, state: "active" });
    expect(active).toHaveLength(1);
    const slots = await t.ctx.dataSource
      .getRepository(OperativeSlot)
      .findBy({ userId: landlord.maintenance.id, slotDate: slot.date });
    expect(slots.map((s) => s.bookingId)).toEqual([active[0]!.id]);
    const stored = await t.ctx.dataSource.getRepository(WorkOrder).findOneByOrFail({ id: wo.id });
    const all = await t.ctx.dataSource.getRepository(WorkOrderBooking).countBy({ workOrderId: wo.id });
    // The booking version counts the bookings that stand on record, no more, no fewer.
    expect(stored.scheduleCount).toBe(all);
  });

  it("two orders booked at once into one operative's slot: one is booked, the other is a 409 double_booked", async () => {
    const caseId = await investigatedCase();
    const a = (
      await officer.post(`/api/cases/${caseId}/work-orders`, { type: "mould-wash", description: "Wash the reveal." }).expect(201)
    ).body;
    const b = (
      await officer
        .post(`/api/cases/${caseId}/work-orders`, { type: "extractor-fan", description: "Fit a bedroom extract fan." })
        .expect(201)
    ).body;
    const slot = { date: workingDayAhead(11), window: "pm" };
    const answers = await Promise.all([
      lead.patch(`/api/work-orders/${a.id}`, { assigneeId: landlord.maintenance.id, slot }),
      lead.patch(`/api/work-orders/${b.id}`, { assigneeId: landlord.maintenance.id, slot }),
    ]);
    expect(answers.map((r) => r.status).sort()).toEqual([200, 409]);
    expect(answers.find((r) => r.status === 409)!.body.error.code).toBe("double_booked");
    const slots = await t.ctx.dataSource
      .getRepository(OperativeSlot)
      .findBy({ userId: landlord.maintenance.id, slotDate: slot.date });
    expect(slots).toHaveLength(1);
  });

  it("cancelled and completed at once, the lock not seen: one wins, the other is a 409", async () => {
    const caseId = await investigatedCase();
    const wo = (
      await officer.post(`/api/cases/${caseId}/work-orders`, { type: "mould-wash", description: "Wash the reveal." }).expect(201)
    ).body;
    const answers = await withoutOrderLock(() =>
      Promise.all([
        lead.patch(`/api/work-orders/${wo.id}`, { cancel: { reason: "Tenant washed it already." } }),
        lead.patch(`/api/work-orders/${wo.id}`, {
          // Today in London: an hour ago was yesterday between midnight and one, before the report.
          complete: { doneOn: localDate(testClock.now()), note: "Washed." },
        }),
      ]),
    );
    const codes = answers.map((r) => r.status).sort();
    expect(codes, JSON.stringify(answers.map((r) => r.body))).toEqual([200, 409]);
    const stored = await t.ctx.dataSource.getRepository(WorkOrder).findOneByOrFail({ id: wo.id });
    expect(stored.status).toBe(answers.find((r) => r.status === 200)!.body.status);
  });
});
