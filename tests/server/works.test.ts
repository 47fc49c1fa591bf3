// Work orders: double-booking refused by the database and the API, the tenant's answer, calendar
// files, case status following its orders, completion evidence and the monitoring reminders.
import ICAL from "ical.js";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Case } from "../../server/modules/cases/case.entity.js";
import { OperativeSlot } from "../../server/modules/works/operative-slot.entity.js";
import { appointmentIcs } from "../../server/modules/works/appointment.js";
import { makeLandlord, makeProperty, makeTenant, makeUser, PASSWORD } from "../support/factories.js";
import { jpegWithGps } from "../support/images.js";
import { outboxCount } from "../support/outbox.js";
import { createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";
import { localDate } from "../../src/lib/domain/working-days.js";
import { hoursAgo, msAgo, testClock, workingDayAhead, workingDaysAhead } from "../support/test-clock.js";

let t: TestApp;
let landlord: Awaited<ReturnType<typeof makeLandlord>>;
let officer: Client;
let lead: Client;
let tenant: Client;
let neighbour: Client;
let operative2Id: number;
const report = {
  description: "Black mould on the bathroom ceiling and the window.",
  locations: ["ceiling"],
  observations: ["mould-spots"],
};
const inspection = {
  inspectedAt: hoursAgo(1).toISOString(),
  cause: "condensation",
  mouldExtent: "under-1-m2",
  findings: "Extract fan not working; condensation mould on the ceiling above the bath.",
  roomReadings: [],
};

/** Today's London date on the test clock: the day the work is recorded as done. */
const today = () => localDate(testClock.now());

/** A London working day at least `days` days ahead of the test clock. */
const futureDate = (days: number) => workingDayAhead(days);

async function investigatedCase(): Promise<number> {
  const c = (await tenant.post("/api/cases", report).expect(201)).body;
  await officer
    .patch(`/api/cases/${c.id}`, {
      status: "triaged",
      hazardClass: "significant",
      reason: "Mould in the bathroom, child at home.",
    })
    .expect(200);
  await officer.post(`/api/cases/${c.id}/inspections`, inspection).expect(201);
  return c.id;
}

const status = async (caseId: number) => (await officer.get(`/api/cases/${caseId}`).expect(200)).body.status as string;

beforeAll(async () => {
  t = await createTestApp();
  landlord = await makeLandlord(t.ctx.dataSource);
  officer = await signedInClient(t.app, landlord.officer.email, PASSWORD);
  lead = await signedInClient(t.app, landlord.maintenance.email, PASSWORD);
  tenant = await signedInClient(t.app, landlord.tenant.email, PASSWORD);
  const other = await makeProperty(t.ctx.dataSource, landlord.org);
  neighbour = await signedInClient(t.app, (await makeTenant(t.ctx.dataSource, landlord.org, other)).email, PASSWORD);
  operative2Id = (await makeUser(t.ctx.dataSource, landlord.org, "maintenance", { name: "Second Operative" })).id;
});
afterAll(() => t.close());

describe("double-booking", () => {
  it("is refused by the database itself: one operative, one half-day, one booking", async () => {
    const repo = t.ctx.dataSource.getRepository(OperativeSlot);
    await repo.insert({ userId: operative2Id, slotDate: "2030-03-04", half: "am", bookingId: 999_001 });
    await expect(repo.insert({ userId: operative2Id, slotDate: "2030-03-04", half: "am", bookingId: 999_002 })).rejects.toThrow(
      /Duplicate entry/,
    );
    // The other half of the day is free.
    await repo.insert({ userId: operative2Id, slotDate: "2030-03-04", half: "pm", bookingId: 999_003 });
  });

  it("is a 409 with a clear message from the API, all-day clashing with a morning, and nothing changes", async () => {
    const caseId = await investigatedCase();
    const a = (
      await officer
        .post(`/api/cases/${caseId}/work-orders`, {
          type: "extractor-fan",
          description: "Replace the dead bathroom extract fan.",
        })
        .expect(201)
    ).body;
    const b = (
      await officer
        .post(`/api/cases/${caseId}/work-orders`, { type: "mould-wash", description: "Wash the ceiling with fungicide." })
        .expect(201)
    ).body;
    const date = futureDate(9);
    await lead
      .patch(`/api/work-orders/${a.id}`, { assigneeId: landlord.maintenance.id, slot: { date, window: "am" } })
      .expect(200);
    const clash = await lead
      .patch(`/api/work-orders/${b.id}`, { assigneeId: landlord.maintenance.id, slot: { date, window: "all-day" } })
      .expect(409);
    expect(clash.body.error.code).toBe("double_booked");
    expect(clash.body.error.message).toMatch(/already booked/);
    expect(clash.body.error.message).toMatch(/Choose another slot or operative/);
    expect(
      (await lead.get(`/api/cases/${caseId}/work-orders`)).body.workOrders.find((w: { id: number }) => w.id === b.id),
    ).toMatchObject({ status: "unscheduled", slot: null });
    // The afternoon is free, and another operative can take the morning.
    await lead
      .patch(`/api/work-orders/${b.id}`, { assigneeId: landlord.maintenance.id, slot: { date, window: "pm" } })
      .expect(200);
    await lead.patch(`/api/work-orders/${b.id}`, { assigneeId: operative2Id, slot: { date, window: "am" } }).expect(200);
  });

  it("frees the old slot on rescheduling and keeps the old booking in the history", async () => {
    const caseId = await investigatedCase();
    const wo = (
      await officer
        .post(`/api/cases/${caseId}/work-orders`, { type: "trickle-vents", description: "Free the painted-over trickle vents." })
        .expect(201)
    ).body;
    // Two different working days: "16 and 17 days ahead" fell on the same Monday from a Thursday or a Friday.
    const [first, second] = workingDaysAhead(16, 2);
    await lead
      .patch(`/api/work-orders/${wo.id}`, { assigneeId: landlord.maintenance.id, slot: { date: first, window: "pm" } })
      .expect(200);
    const moved = (
      await lead
        .patch(`/api/work-orders/${wo.id}`, { assigneeId: landlord.maintenance.id, slot: { date: second, window: "pm" } })
        .expect(200)
    ).body;
    expect(moved.bookings.map((x: { date: string; state: string }) => [x.date, x.state])).toEqual([
      [first, "replaced"],
      [second, "active"],
    ]);
    // The first slot can be booked again.
    const other = (
      await officer
        .post(`/api/cases/${caseId}/work-orders`, { type: "door-undercut", description: "Undercut the bathroom door by 10 mm." })
        .expect(201)
    ).body;
    await lead
      .patch(`/api/work-orders/${other.id}`, { assigneeId: landlord.maintenance.id, slot: { date: first, window: "pm" } })
      .expect(200);
  });

  it("cancelling a booked visit frees the slot and takes it out of both calendars", async () => {
    const caseId = await investigatedCase();
    const wo = (
      await officer
        .post(`/api/cases/${caseId}/work-orders`, { type: "mould-wash", description: "Fungicidal wash of the bedroom wall." })
        .expect(201)
    ).body;
    const date = futureDate(25);
    await lead.patch(`/api/work-orders/${wo.id}`, { assigneeId: operative2Id, slot: { date, window: "all-day" } }).expect(200);
    await lead
      .patch(`/api/work-orders/${wo.id}`, { cancel: { reason: "The tenant had the wall washed under the contents insurance." } })
      .expect(200);
    const mail = await t.mail.lastTo(landlord.tenant.email);
    expect(mail.subject).toMatch(/^Cancelled/);
    const ics = /BEGIN:VCALENDAR[\s\S]*END:VCALENDAR/.exec(mail.raw)![0];
    const calendar = new ICAL.Component(ICAL.parse(ics));
    expect(calendar.getFirstPropertyValue("method")).toBe("CANCEL");
    expect(new ICAL.Event(calendar.getFirstSubcomponent("vevent")!).uid).toBe(`work-order-${wo.id}@dewline`);
    // The operative's day is free again.
    const other = (
      await officer
        .post(`/api/cases/${caseId}/work-orders`, { type: "heating", description: "Bleed and balance the radiators." })
        .expect(201)
    ).body;
    await lead.patch(`/api/work-orders/${other.id}`, { assigneeId: operative2Id, slot: { date, window: "am" } }).expect(200);
  });

  it("refuses a day in the past and someone who is not an operative", async () => {
    const caseId = await investigatedCase();
    const wo = (
      await officer
        .post(`/api/cases/${caseId}/work-orders`, { type: "heating", description: "Repair the radiator valve." })
        .expect(201)
    ).body;
    await lead
      .patch(`/api/work-orders/${wo.id}`, { assigneeId: landlord.maintenance.id, slot: { date: "2020-01-06", window: "am" } })
      .expect(400);
    const res = await lead
      .patch(`/api/work-orders/${wo.id}`, { assigneeId: landlord.officer.id, slot: { date: futureDate(20), window: "am" } })
      .expect(400);
    expect(res.body.error.message).toMatch(/operative/);
  });
});

describe("the tenant's answer and the calendar file", () => {
  it("e-mails tenant and operative an RFC 5545 invitation with the right start and end in UTC, and records the answer", async () => {
    const caseId = await investigatedCase();
    const wo = (
      await officer
        .post(`/api/cases/${caseId}/work-orders`, {
          type: "extractor-fan",
          description: "Fit a humidity-controlled extract fan.",
        })
        .expect(201)
    ).body;
    const date = futureDate(12);
    await lead
      .patch(`/api/work-orders/${wo.id}`, { assigneeId: landlord.maintenance.id, slot: { date, window: "am" } })
      .expect(200);
    const mailToTenant = await t.mail.lastTo(landlord.tenant.email);
    expect(mailToTenant.subject).toMatch(/Proposed appointment/);
    const ics = /BEGIN:VCALENDAR[\s\S]*END:VCALENDAR/.exec(mailToTenant.raw)?.[0];
    expect(ics).toBeDefined();
    const event = new ICAL.Event(new ICAL.Component(ICAL.parse(ics!)).getFirstSubcomponent("vevent")!);
    // 8am to 12 noon London time: UTC in winter, an hour earlier in summer.
    const offsetHours =
      new Date(`${date}T12:00:00Z`).toLocaleString("en-GB", { timeZone: "Europe/London", hour: "2-digit", hour12: false }) ===
      "13"
        ? 1
        : 0;
    expect(event.startDate.toJSDate().toISOString()).toBe(`${date}T${String(8 - offsetHours).padStart(2, "0")}:00:00.000Z`);
    expect(event.endDate.toJSDate().toISOString()).toBe(`${date}T${String(12 - offsetHours).padStart(2, "0")}:00:00.000Z`);
    expect(event.uid).toBe(`work-order-${wo.id}@dewline`);
    expect((await t.mail.lastTo(landlord.maintenance.email)).subject).toMatch(/^Booked/);

    // Another tenant cannot answer it; staff cannot answer for the tenant.
    await neighbour.post(`/api/work-orders/${wo.id}/booking-response`, { response: "confirm" }).expect(404);
    await lead.post(`/api/work-orders/${wo.id}/booking-response`, { response: "confirm" }).expect(403);
    await tenant.post(`/api/work-orders/${wo.id}/booking-response`, { response: "another-slot" }).expect(400);
    const asked = (
      await tenant
        .post(`/api/work-orders/${wo.id}/booking-response`, {
          response: "another-slot",
          reason: "I work mornings; any afternoon next week is fine.",
        })
        .expect(200)
    ).body;
    expect(asked).toMatchObject({
      status: "change-requested",
      booking: { response: "change-requested", reason: "I work mornings; any afternoon next week is fine." },
    });
    expect((await t.mail.lastTo(landlord.maintenance.email)).subject).toMatch(/Another slot wanted/);
    await lead
      .patch(`/api/work-orders/${wo.id}`, { assigneeId: landlord.maintenance.id, slot: { date, window: "pm" } })
      .expect(200);
    const confirmed = (await tenant.post(`/api/work-orders/${wo.id}/booking-response`, { response: "confirm" }).expect(200)).body;
    expect(confirmed).toMatchObject({ status: "confirmed", booking: { response: "confirmed" } });
    const types = (await tenant.get(`/api/cases/${caseId}/events`)).body.events.map((e: { type: string }) => e.type);
    expect(types).toEqual(
      expect.arrayContaining(["work-order-created", "work-order-scheduled", "booking-change-requested", "booking-confirmed"]),
    );
  });

  it("writes the window in UTC for a summer and a winter date (independent parser)", () => {
    const parse = (date: string) => {
      const ev = new ICAL.Event(
        new ICAL.Component(
          ICAL.parse(
            appointmentIcs({
              workOrderId: 1,
              sequence: 2,
              date,
              window: "all-day",
              title: "Fan",
              description: "Fit a fan",
              location: "1 Test Street",
              organiserEmail: "no-reply@dewline.example",
            }),
          ),
        ).getFirstSubcomponent("vevent")!,
      );
      return [ev.startDate.toJSDate().toISOString(), ev.endDate.toJSDate().toISOString(), ev.sequence];
    };
    // 8am–5pm London: GMT in January, BST (UTC+1) in July.
    expect(parse("2027-01-12")).toEqual(["2027-01-12T08:00:00.000Z", "2027-01-12T17:00:00.000Z", 2]);
    expect(parse("2027-07-13")).toEqual(["2027-07-13T07:00:00.000Z", "2027-07-13T16:00:00.000Z", 2]);
  });
});

describe("the case follows its orders", () => {
  it("works-planned when booked, works-done then monitoring when the last order is done, closed when the fix worked", async () => {
    const caseId = await investigatedCase();
    const fan = (
      await officer
        .post(`/api/cases/${caseId}/work-orders`, {
          type: "extractor-fan",
          description: "New continuous extract fan in the bathroom.",
        })
        .expect(201)
    ).body;
    const wash = (
      await officer
        .post(`/api/cases/${caseId}/work-orders`, { type: "mould-wash", description: "Fungicidal wash of the ceiling." })
        .expect(201)
    ).body;
    // The target date defaults from the safety-work deadline (5 working days after the inspection).
    const deadlines = (await officer.get(`/api/cases/${caseId}/deadlines`)).body.deadlines;
    const safety = deadlines.find((d: { stage: string }) => d.stage === "safety-work");
    expect(fan.targetDate).toBe(new Date(safety.dueAt).toLocaleDateString("en-CA", { timeZone: "Europe/London" }));
    expect(await status(caseId)).toBe("investigated");
    await lead
      .patch(`/api/work-orders/${fan.id}`, { assigneeId: landlord.maintenance.id, slot: { date: futureDate(3), window: "am" } })
      .expect(200);
    expect(await status(caseId)).toBe("works-planned");

    await lead.patch(`/api/work-orders/${fan.id}`, { complete: { note: "" } }).expect(400);
    await lead
      .patch(`/api/work-orders/${fan.id}`, {
        complete: {
          note: "Fitted a continuous extract fan with humidistat boost; tested.",
          materials: "Fan, 100 mm duct, fused spur",
          minutesOnSite: 150,
          doneOn: today(),
          earlyReason: "A cancellation freed the operative today and the tenant was at home.",
        },
      })
      .expect(200);
    expect(await status(caseId)).toBe("works-planned");
    const photo = await lead.agent
      .post(`/api/work-orders/${wash.id}/photos`)
      .set("X-CSRF-Token", lead.csrf)
      .attach("photos", await jpegWithGps(1600, 1200), "after.jpg")
      .expect(201);
    expect(photo.body.photos[0].workOrderId).toBe(wash.id);
    await lead
      .patch(`/api/work-orders/${wash.id}`, {
        complete: {
          note: "Washed the ceiling with fungicide and let it dry.",
          doneOn: today(),
        },
      })
      .expect(200);
    expect(await status(caseId)).toBe("monitoring");
    // Work has begun: the safety-work and supplementary-work clocks have stopped, in time.
    const after = Object.fromEntries(
      (await officer.get(`/api/cases/${caseId}/deadlines`)).body.deadlines.map((d: { stage: string }) => [d.stage, d]),
    );
    expect(after["safety-work"]).toMatchObject({ state: "met" });
    expect(after["supplementary-work"]).toMatchObject({ state: "met" });
    expect(after["safety-work"].doneAt).not.toBeNull();
    const events = (await officer.get(`/api/cases/${caseId}/events`)).body.events;
    const moves = events
      .filter((e: { type: string }) => e.type === "status-changed")
      .map((e: { after: { status: string } }) => e.after.status);
    expect(moves.slice(-3)).toEqual(["works-planned", "works-done", "monitoring"]);
    expect((await t.mail.lastTo(landlord.tenant.email)).subject).toMatch(/Checking the repair worked/);
    const view = (await tenant.get(`/api/cases/${caseId}/verification`).expect(200)).body;
    expect(view).toMatchObject({ state: "monitoring", monitoringDays: 21 });
    expect(Date.parse(view.monitoringEndsAt) - Date.parse(view.worksDoneAt)).toBe(21 * 86_400_000);

    await tenant.post(`/api/cases/${caseId}/verification`, { effective: true, note: "Dry" }).expect(403);
    // Day 0 of monitoring: no readings after the works, so "fix effective" needs an override with a reason.
    expect(view.enoughReadings).toBe(false);
    const early = await lead
      .post(`/api/cases/${caseId}/verification`, { effective: true, note: "Looks dry to me." })
      .expect(409);
    expect(early.body.error.code).toBe("not_enough_readings");
    expect(early.body.error.details).toEqual([expect.objectContaining({ field: "override.reason" })]);
    expect(await status(caseId)).toBe("monitoring");
    await lead
      .post(`/api/cases/${caseId}/verification`, { effective: true, note: "Dry.", override: { reason: "short" } })
      .expect(400);
    const told = { to: landlord.tenant.email, template: "fixConfirmed", caseId };
    expect(await outboxCount(t.ctx.dataSource, told)).toBe(0);
    await lead
      .post(`/api/cases/${caseId}/verification`, {
        effective: true,
        note: "Surface humidity down from the mid-90s to about 60 %.",
        override: { reason: "The tenant's own logger showed dry readings; they cannot add them to Dewline." },
      })
      .expect(200);
    expect(await status(caseId)).toBe("closed");
    // The override's reason is on the staff timeline and in the verdict, never the tenant's.
    const verdict = (await officer.get(`/api/cases/${caseId}/events`)).body.events.find(
      (e: { type: string }) => e.type === "fix-verified",
    );
    expect(verdict.after.override).toMatch(/own logger/);
    expect((await lead.get(`/api/cases/${caseId}/verification`)).body.outcome.override).toMatch(/own logger/);
    expect(JSON.stringify((await tenant.get(`/api/cases/${caseId}/events`)).body)).not.toMatch(/own logger/);
    expect((await tenant.get(`/api/cases/${caseId}/verification`)).body.outcome.override).toBeNull();
    // The lead's screen says the tenant is told: they are, by e-mail.
    expect(await outboxCount(t.ctx.dataSource, told)).toBe(1);
    expect((await t.mail.lastTo(landlord.tenant.email)).subject).toMatch(/The repair worked/);
    await lead.post(`/api/cases/${caseId}/verification`, { effective: true, note: "Again" }).expect(409);
  });

  it("sends the case back to investigated with a new order when the fix did not work", async () => {
    const caseId = await investigatedCase();
    const wo = (
      await officer
        .post(`/api/cases/${caseId}/work-orders`, { type: "trickle-vents", description: "Open the trickle vents." })
        .expect(201)
    ).body;
    await lead
      .patch(`/api/work-orders/${wo.id}`, { complete: { note: "Trickle vents freed and opened.", doneOn: today() } })
      .expect(200);
    expect(await status(caseId)).toBe("monitoring");
    await lead
      .post(`/api/cases/${caseId}/verification`, {
        effective: false,
        note: "Still over 80 % most nights.",
        workOrder: { type: "piv-unit", description: "Fit a positive input ventilation unit in the loft." },
      })
      .expect(200);
    expect(await status(caseId)).toBe("investigated");
    const orders = (await officer.get(`/api/cases/${caseId}/work-orders`)).body.workOrders;
    expect(orders.map((o: { type: string; status: string }) => [o.type, o.status])).toEqual([
      ["trickle-vents", "done"],
      ["piv-unit", "unscheduled"],
    ]);
  });

  it("refuses a work order before the investigation", async () => {
    const c = (await tenant.post("/api/cases", report).expect(201)).body;
    const res = await officer
      .post(`/api/cases/${c.id}/work-orders`, { type: "mould-wash", description: "Wash the mould off." })
      .expect(409);
    expect(res.body.error.message).toMatch(/inspection/);
    await tenant.post(`/api/cases/${c.id}/work-orders`, { type: "mould-wash", description: "Wash the mould off." }).expect(403);
    await neighbour.get(`/api/cases/${c.id}/work-orders`).expect(404);
  });
});

describe("the end of the monitoring period", () => {
  it("reminds the tenant to add readings and tells the lead to decide, once", async () => {
    const caseId = await investigatedCase();
    const wo = (
      await officer.post(`/api/cases/${caseId}/work-orders`, { type: "mould-wash", description: "Wash the mould." }).expect(201)
    ).body;
    await lead.patch(`/api/work-orders/${wo.id}`, { complete: { note: "Washed with fungicide.", doneOn: today() } }).expect(200);
    await t.ctx.dataSource.getRepository(Case).update(caseId, { monitoringEndsAt: msAgo(60_000) });
    const before = t.mail.mails.length;
    expect(await t.ctx.services.verification.sendDueReminders()).toBeGreaterThanOrEqual(1);
    const sent = t.mail.mails.slice(before);
    expect(sent.some((m) => m.to.includes(landlord.tenant.email) && /Please add readings/.test(m.subject))).toBe(true);
    expect(sent.some((m) => m.to.includes(landlord.maintenance.email) && /decide if the fix worked/.test(m.subject))).toBe(true);
    expect((await tenant.get(`/api/cases/${caseId}/verification`)).body.state).toBe("ended");
    const again = t.mail.mails.length;
    await t.ctx.services.verification.sendDueReminders();
    expect(t.mail.mails.slice(again).filter((m) => m.raw.includes(`/cases/${caseId}`))).toEqual([]);
  });
});
