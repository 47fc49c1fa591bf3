// Work orders: double-booking refused by the database and the API, the tenant's answer, calendar
// files, case status following its orders, completion evidence and the monitoring reminders.
import ICAL from "ical.js";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Case } from "../../server/modules/cases/case.entity.js";
import { OperativeSlot } from "../../server/modules/works/operative-slot.entity.js";
import { appointmentIcs } from "../../server/modules/works/appointment.js";
import { makeLandlord, makeProperty, makeTenant, makeUser, PASSWORD } from "../support/factories.js";
import { jpegWithGps } from "../support/images.js";
import { mailSettled, outboxCount, outboxRows } from "../support/outbox.js";
import { createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";
import { bankHolidayDates, localDate } from "../../src/lib/domain/working-days.js";
import { daysAgo, daysAhead, hoursAgo, msAgo, testClock, workingDayAhead, workingDaysAhead } from "../support/test-clock.js";

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
  it("writes the tenant's calendar entry in Welsh for a tenant who reads Welsh, and the operative's in English", async () => {
    // A landlord of its own, so the shared tenant's language (and the English subjects the other tests read) is untouched.
    const wales = await makeLandlord(t.ctx.dataSource);
    const walesOfficer = await signedInClient(t.app, wales.officer.email, PASSWORD);
    const walesLead = await signedInClient(t.app, wales.maintenance.email, PASSWORD);
    const walesTenant = await signedInClient(t.app, wales.tenant.email, PASSWORD);
    await walesTenant.agent.put("/api/me/language").set("X-CSRF-Token", walesTenant.csrf).send({ language: "cy" }).expect(200);
    const c = (await walesTenant.post("/api/cases", report).expect(201)).body;
    await walesOfficer
      .patch(`/api/cases/${c.id}`, { status: "triaged", hazardClass: "significant", reason: "Mould in the bathroom." })
      .expect(200);
    await walesOfficer.post(`/api/cases/${c.id}/inspections`, inspection).expect(201);
    const wo = (
      await walesOfficer
        .post(`/api/cases/${c.id}/work-orders`, { type: "mould-wash", description: "Fungicidal wash, operative's note only." })
        .expect(201)
    ).body;
    await walesLead
      .patch(`/api/work-orders/${wo.id}`, { assigneeId: wales.maintenance.id, slot: { date: futureDate(14), window: "am" } })
      .expect(200);
    const eventIn = (raw: string) =>
      new ICAL.Event(
        new ICAL.Component(ICAL.parse(/BEGIN:VCALENDAR[\s\S]*END:VCALENDAR/.exec(raw)![0])).getFirstSubcomponent("vevent")!,
      );
    const proposed = eventIn((await t.mail.lastTo(wales.tenant.email)).raw);
    expect(proposed.summary).toBe(`Ymweliad: golchi llwydni a thriniaeth ffwngladdol (${c.reference})`);
    expect(proposed.description).toMatch(/^Ymweliad ar gyfer golchi llwydni .*Gallwch ei gadarnhau neu ofyn am amser arall/);
    expect(proposed.description).not.toContain("operative's note");
    // The operative's copy stays English, with their own note.
    const operative = eventIn((await t.mail.lastTo(wales.maintenance.email)).raw);
    expect(operative.summary).toBe(`mould wash and fungicidal treatment (${c.reference})`);
    expect(operative.description).toContain("operative's note only");
    // Confirming sends the tenant the calendar file again, still in Welsh.
    await walesTenant.post(`/api/work-orders/${wo.id}/booking-response`, { response: "confirm" }).expect(200);
    const confirmed = eventIn((await t.mail.lastTo(wales.tenant.email)).raw);
    expect(confirmed.summary).toBe(`Ymweliad: golchi llwydni a thriniaeth ffwngladdol (${c.reference})`);
  });

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
    // The tenant reads English (no language chosen): the work and the report, never the operative's note.
    expect(event.summary).toMatch(/^Visit: extractor fan fitting or repair \(/);
    expect(event.description).toMatch(/^A visit for extractor fan fitting or repair \(report /);
    expect(event.description).not.toContain("humidity-controlled extract fan");
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
    const early = await lead.post(`/api/cases/${caseId}/verification`, { effective: true, note: "Looks dry to me." }).expect(409);
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
    await mailSettled(t);
    const sent = t.mail.mails.slice(before);
    expect(sent.some((m) => m.to.includes(landlord.tenant.email) && /Please add readings/.test(m.subject))).toBe(true);
    expect(sent.some((m) => m.to.includes(landlord.maintenance.email) && /decide if the fix worked/.test(m.subject))).toBe(true);
    expect((await tenant.get(`/api/cases/${caseId}/verification`)).body.state).toBe("ended");
    const again = t.mail.mails.length;
    await t.ctx.services.verification.sendDueReminders();
    await mailSettled(t);
    expect(t.mail.mails.slice(again).filter((m) => m.raw.includes(`/cases/${caseId}`))).toEqual([]);
  });
});

describe("booking days, completion dates and follow-on work", () => {
  /** The first Saturday at least `min` days ahead, and the first England-and-Wales bank holiday on a weekday ahead. */
  const saturdayAhead = (min: number) => {
    for (let d = min; ; d++) {
      const date = localDate(daysAhead(d));
      if (new Date(`${date}T12:00:00Z`).getUTCDay() === 6) return date;
    }
  };
  const bankHolidayAhead = () => {
    const from = today();
    const year = Number(from.slice(0, 4));
    return [...bankHolidayDates(year), ...bankHolidayDates(year + 1)].find(
      (d) => d > from && ![0, 6].includes(new Date(`${d}T12:00:00Z`).getUTCDay()),
    )!;
  };

  async function order(caseId: number, type = "mould-wash", description = "Fungicidal wash of the bathroom ceiling.") {
    return (await officer.post(`/api/cases/${caseId}/work-orders`, { type, description }).expect(201)).body as {
      id: number;
    };
  }

  it("refuses a Saturday, a Sunday and a bank holiday, naming slot.date, and books nothing", async () => {
    const caseId = await investigatedCase();
    const wo = await order(caseId);
    const saturday = saturdayAhead(3);
    const sunday = localDate(new Date(Date.parse(`${saturday}T12:00:00Z`) + 86_400_000));
    for (const date of [saturday, sunday, bankHolidayAhead()]) {
      const res = await lead
        .patch(`/api/work-orders/${wo.id}`, { assigneeId: landlord.maintenance.id, slot: { date, window: "am" } })
        .expect(400);
      expect(res.body.error.details).toEqual([expect.objectContaining({ field: "slot.date" })]);
      expect(res.body.error.message).toMatch(/not a working day/);
    }
    const orders = (await lead.get(`/api/cases/${caseId}/work-orders`)).body.workOrders;
    expect(orders[0]).toMatchObject({ status: "unscheduled", slot: null });
    expect(await status(caseId)).toBe("investigated");
  });

  it("asks for the actual date of the work, never a day to come, and a reason when it is before the booked day", async () => {
    const caseId = await investigatedCase();
    const wo = await order(caseId);
    const booked = futureDate(8);
    await lead
      .patch(`/api/work-orders/${wo.id}`, { assigneeId: landlord.maintenance.id, slot: { date: booked, window: "pm" } })
      .expect(200);
    const note = "Washed the ceiling with fungicide.";
    const missing = await lead.patch(`/api/work-orders/${wo.id}`, { complete: { note } }).expect(400);
    expect(missing.body.error.details).toEqual([expect.objectContaining({ field: "complete.doneOn" })]);
    const future = await lead
      .patch(`/api/work-orders/${wo.id}`, { complete: { note, doneOn: localDate(daysAhead(1)) } })
      .expect(400);
    expect(future.body.error.details).toEqual([expect.objectContaining({ field: "complete.doneOn" })]);
    const early = await lead.patch(`/api/work-orders/${wo.id}`, { complete: { note, doneOn: today() } }).expect(400);
    expect(early.body.error.details).toEqual([expect.objectContaining({ field: "complete.earlyReason" })]);
    expect(early.body.error.message).toMatch(/booked for/);
    // Nothing changed: the order is still booked and the case still planned.
    const still = (await lead.get(`/api/cases/${caseId}/work-orders`)).body.workOrders[0];
    expect(still).toMatchObject({ status: "scheduled", completion: null });

    // The work was done yesterday (the tenant rang: the operative had a gap), recorded today.
    await t.ctx.dataSource.getRepository(Case).update(caseId, { awareAt: daysAgo(10) });
    const yesterday = localDate(daysAgo(1));
    const done = (
      await lead
        .patch(`/api/work-orders/${wo.id}`, {
          complete: { note, doneOn: yesterday, earlyReason: "The operative had a gap and the tenant asked for it sooner." },
        })
        .expect(200)
    ).body;
    expect(done.completion).toMatchObject({ doneOn: yesterday, earlyReason: expect.stringMatching(/had a gap/) });
    // The work is dated on that day (London), not on the moment it was typed in.
    expect(localDate(new Date(done.completion.at))).toBe(yesterday);
    const view = (await lead.get(`/api/cases/${caseId}/verification`)).body;
    expect(localDate(new Date(view.worksDoneAt))).toBe(yesterday);
    // The tenant sees the date but not the staff's reason.
    const mine = (await tenant.get(`/api/cases/${caseId}/work-orders`)).body.workOrders[0];
    expect(mine.completion).toMatchObject({ doneOn: yesterday, earlyReason: null });
  });

  it("raises follow-on work found as a new order, so the case stays open for it", async () => {
    const caseId = await investigatedCase();
    const wo = await order(caseId);
    await lead
      .patch(`/api/work-orders/${wo.id}`, {
        complete: {
          note: "Washed the ceiling with fungicide.",
          doneOn: today(),
          followOn: "The bathroom needs repainting with mould-resistant paint once dry.",
          followOnType: "mould-resistant-decoration",
        },
      })
      .expect(200);
    const orders = (await lead.get(`/api/cases/${caseId}/work-orders`)).body.workOrders;
    expect(orders.map((o: { type: string; status: string }) => [o.type, o.status])).toEqual([
      ["mould-wash", "done"],
      ["mould-resistant-decoration", "unscheduled"],
    ]);
    expect(orders[1].description).toMatch(/repainting/);
    // Not into monitoring while the follow-on work is open; it cannot be judged "fixed" yet.
    expect(await status(caseId)).not.toBe("monitoring");
    await lead
      .post(`/api/cases/${caseId}/verification`, { effective: true, note: "Dry", override: { reason: "x".repeat(12) } })
      .expect(409);
    const completed = (await lead.get(`/api/cases/${caseId}/events`)).body.events.find(
      (e: { type: string }) => e.type === "work-order-completed",
    );
    expect(completed.after.followOnWorkOrderId).toBe(orders[1].id);
  });

  it("records fix effective without an override once the readings after the works cover a day", async () => {
    const caseId = await investigatedCase();
    await t.ctx.dataSource.getRepository(Case).update(caseId, { awareAt: daysAgo(10) });
    const wo = await order(caseId);
    const doneOn = localDate(daysAgo(4));
    await lead.patch(`/api/work-orders/${wo.id}`, { complete: { note: "Washed the ceiling.", doneOn } }).expect(200);
    const c = (await tenant.get(`/api/cases/${caseId}`)).body;
    const roomId = c.homeRooms[0].id;
    const worksAt = Date.parse((await lead.get(`/api/cases/${caseId}/verification`)).body.worksDoneAt);
    const at = (ms: number) => new Date(ms).toISOString();
    const hour = 3_600_000;
    // Before: 20 °C, 80 % (damp); after: 20 °C, 50 %, for 30 hours.
    await tenant
      .post(`/api/cases/${caseId}/readings`, [
        ...Array.from({ length: 24 }, (_, h) => ({
          roomId,
          takenAt: at(worksAt - (30 - h) * hour),
          airTemperatureC: 20,
          relativeHumidityPct: 80,
        })),
        ...Array.from({ length: 31 }, (_, h) => ({
          roomId,
          takenAt: at(worksAt + (h + 1) * hour),
          airTemperatureC: 20,
          relativeHumidityPct: 50,
        })),
      ])
      .expect(201);
    const view = (await lead.get(`/api/cases/${caseId}/verification`)).body;
    if (!view.enoughReadings) throw new Error(`expected enough readings: ${JSON.stringify(view.rooms)}`);
    await lead
      .post(`/api/cases/${caseId}/verification`, { effective: true, note: "Surface humidity down to about 60 %." })
      .expect(200);
    expect(await status(caseId)).toBe("closed");
  });

  it("e-mails the tenant when a visit is booked and again when it moves, with no operative description in either", async () => {
    const caseId = await investigatedCase();
    const secret = "Operative only: bring the long ladder, loft hatch is stiff.";
    const wo = await order(caseId, "extractor-fan", secret);
    // An operative of its own: near bank holidays the dates other tests book can fall on the same days.
    const operative = await makeUser(t.ctx.dataSource, landlord.org, "maintenance", { name: "Visiting Operative" });
    const [first, second] = workingDaysAhead(18, 2);
    await lead.patch(`/api/work-orders/${wo.id}`, { assigneeId: operative.id, slot: { date: first, window: "am" } }).expect(200);
    await lead.patch(`/api/work-orders/${wo.id}`, { assigneeId: operative.id, slot: { date: second, window: "pm" } }).expect(200);
    const rows = await outboxRows(t.ctx.dataSource, { to: landlord.tenant.email, template: "appointmentProposed", caseId });
    expect(rows.map((r) => r.subject)).toEqual([
      expect.stringMatching(/^Proposed appointment/),
      expect.stringMatching(/^New time proposed/),
    ]);
    const mail = await t.mail.lastTo(landlord.tenant.email);
    expect(mail.subject).toMatch(/^New time proposed/);
    expect(mail.raw).not.toContain("long ladder");
    // The operative's copy carries the description in the calendar file.
    const toOperative = await t.mail.lastTo(operative.email);
    expect(toOperative.raw.replace(/\r?\n[ \t]/g, "")).toContain("long ladder");
  });
});
