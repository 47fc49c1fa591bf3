// The per-room sensor watch against MariaDB: readings stored in `sensor_readings` (as the ingest stores
// them) are handed to the watch as the ingest's listener would, and the test waits for its queue to
// drain (a state, not a time). Alerts are raised at the hour their rule first held, worked out by hand
// below from the constructed series; the app clock is set by the test and never decides an alert's hour.
import type { DataSource } from "typeorm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { homesAtRiskResponse, proactiveCaseResponse } from "../../src/lib/contracts/sensor-watch.js";
import { sensorAlertPolicyResponse } from "../../src/lib/contracts/policy.js";
import { Sensor } from "../../server/modules/sensors/sensor.entity.js";
import { SensorAlert } from "../../server/modules/sensor-watch/sensor-alert.entity.js";
import { SensorRoomFigures } from "../../server/modules/sensor-watch/sensor-room-figures.entity.js";
import type { Property } from "../../server/modules/properties/property.entity.js";
import type { Clock } from "../../server/lib/clock.js";
import { makeLandlord, makeProperty, makeTenant, makeUser, PASSWORD } from "../support/factories.js";
import { outboxRows } from "../support/outbox.js";
import { createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";

const H = 3_600_000;
// Monday 2 November 2026, 00:00 UTC; London is on GMT from 25 October, so London days are UTC days.
const T0 = Date.UTC(2026, 10, 2);
/** The app's "now": fixed at 22 November 2026, after every reading; it never decides an alert's hour. */
const clock: Clock = { now: () => new Date(T0 + 20 * 24 * H) };

let t: TestApp;
let ds: DataSource;
let landlord: Awaited<ReturnType<typeof makeLandlord>>;
let officer: Client;
let secondOfficer: Client;
let admin: Client;
let tenant: Client;
let serial = 0;

async function fitSensor(
  home: Property,
  roomName = "Bedroom",
  placement = "external wall, 1 m above the floor",
): Promise<{ id: number; roomId: number }> {
  const [room] = (await ds.query("SELECT id FROM rooms WHERE property_id = ? AND name = ?", [home.id, roomName])) as {
    id: number;
  }[];
  serial++;
  const sensor = await ds.getRepository(Sensor).save({
    organisationId: home.organisationId,
    propertyId: home.id,
    roomId: room!.id,
    serial: `SW-${serial}-${home.id}`,
    model: "Test probe",
    placement,
    measuresSurface: true,
    intervalS: 900,
    installedOn: "2026-10-01",
    mqttUsername: `sw${serial}x${home.id}`,
  });
  return { id: sensor.id, roomId: room!.id };
}

/** Readings every 15 minutes from T0 for `hours` hours (inclusive of both ends), as the ingest stores them. */
async function storeReadings(
  sensorId: number,
  fromHour: number,
  hours: number,
  at: (hour: number) => { rh: number; surface: number },
) {
  const rows: unknown[][] = [];
  for (let i = 0; i <= hours * 4; i++) {
    const hour = fromHour + i / 4;
    const { rh, surface } = at(hour);
    rows.push([sensorId, new Date(T0 + hour * H), 20, rh, surface, 80, clock.now()]);
  }
  for (let i = 0; i < rows.length; i += 1000) {
    const chunk = rows.slice(i, i + 1000);
    await ds.query(
      `INSERT IGNORE INTO sensor_readings (sensor_id, taken_at, air_temperature_c, relative_humidity_pct, surface_temperature_c, battery_pct, received_at) VALUES ${chunk.map(() => "(?, ?, ?, ?, ?, ?, ?)").join(", ")}`,
      chunk.flat(),
    );
  }
  await ds.query(
    "UPDATE sensors SET last_reading_at = (SELECT MAX(taken_at) FROM sensor_readings WHERE sensor_id = ?) WHERE id = ?",
    [sensorId, sensorId],
  );
}

/** What the ingest does after its commit: tell the watch, then the test waits for the queue to empty. */
async function told(sensor: { id: number; roomId: number }, home: Property) {
  t.ctx.services.sensorWatch.readingsStored({
    organisationId: home.organisationId,
    sensors: [{ sensorId: sensor.id, roomId: sensor.roomId, propertyId: home.id, newestTakenAt: clock.now() }],
    receivedAt: clock.now(),
  });
  await t.ctx.services.sensorWatch.drain();
}

const alertsOf = (roomId: number) =>
  ds.getRepository(SensorAlert).find({ where: { roomId }, order: { raisedAt: "ASC", id: "ASC" } });
const damp = () => ({ rh: 90, surface: 20 }); // air 20 °C / 90 %, surface probe 20 °C → surface RH 90 %

beforeAll(async () => {
  t = await createTestApp({}, undefined, clock);
  ds = t.ctx.dataSource;
  landlord = await makeLandlord(ds);
  officer = await signedInClient(t.app, landlord.officer.email, PASSWORD);
  admin = await signedInClient(t.app, landlord.admin.email, PASSWORD);
  tenant = await signedInClient(t.app, landlord.tenant.email, PASSWORD);
  const second = await makeUser(ds, landlord.org, "officer");
  secondOfficer = await signedInClient(t.app, second.email, PASSWORD);
});
afterAll(() => t.close());

describe("rules fire at the right hour", () => {
  let home: Property;
  let sensor: { id: number; roomId: number };

  beforeAll(async () => {
    home = await makeProperty(ds, landlord.org);
    await makeTenant(ds, landlord.org, home);
    sensor = await fitSensor(home);
  });

  it("≥ 72 h at ≥ 80 % surface RH in 7 days: raised at T0 + 72 h, whatever the clock says", async () => {
    // 96 h of readings at surface RH 90 %. Each reading holds until the next (15 min), so by the whole
    // hour T0 + h there are h hours at ≥ 80 %: 71 at 71:00, 72 at 72:00 → 2026-11-05T00:00Z.
    // (Condensing needs ≥ 100 %: none. The clock stands at 22 November and plays no part.)
    await storeReadings(sensor.id, 0, 96, damp);
    await told(sensor, home);
    const alerts = (await alertsOf(sensor.roomId)).filter((a) => a.rule === "hours-at-80");
    expect(alerts.map((a) => a.raisedAt.toISOString())).toEqual(["2026-11-05T00:00:00.000Z"]);
    expect(alerts[0]!.figures.hoursAt80).toBe(72);
    expect(alerts[0]!.state).toBe("open");
    expect((await alertsOf(sensor.roomId)).some((a) => a.rule === "condensing-days")).toBe(false);

    const figures = await ds.getRepository(SensorRoomFigures).findOneByOrFail({ roomId: sensor.roomId });
    expect(figures.hoursAt80).toBe(96);
    expect(figures.surfaceBasis).toBe("measured");
    expect(figures.latestReadingAt.toISOString()).toBe("2026-11-06T00:00:00.000Z");
  });

  it("the same readings again, and more within the cooldown, raise nothing new; after the 7-day cooldown, one more", async () => {
    await told(sensor, home);
    // Three more damp days (to T0 + 168 h): the rule keeps holding, but within 7 days of the first alert.
    await storeReadings(sensor.id, 96, 72, damp);
    await told(sensor, home);
    expect((await alertsOf(sensor.roomId)).filter((a) => a.rule === "hours-at-80")).toHaveLength(1);
    // On to T0 + 240 h: it still holds, and 72 h + 168 h (the cooldown) = 240 h → 2026-11-12T00:00Z.
    await storeReadings(sensor.id, 168, 72, damp);
    await told(sensor, home);
    expect((await alertsOf(sensor.roomId)).filter((a) => a.rule === "hours-at-80").map((a) => a.raisedAt.toISOString())).toEqual([
      "2026-11-05T00:00:00.000Z",
      "2026-11-12T00:00:00.000Z",
    ]);
  });

  it("condensing on 3 of the last 7 days: raised at 04:00 on the third day", async () => {
    const other = await makeProperty(ds, landlord.org);
    const s = await fitSensor(other, "Kitchen", "by the window");
    // Air 20 °C / 60 % (dew point ≈ 12 °C, from memory); 03:00–04:00 each day the probe reads 5 °C: condensing.
    // The third day's first condensing quarter (03:00 → 03:15) is complete by 04:00 on 4 November.
    await storeReadings(s.id, 0, 96, (hour) => ({ rh: 60, surface: hour % 24 >= 3 && hour % 24 < 4 ? 5 : 20 }));
    await told(s, other);
    const alerts = (await alertsOf(s.roomId)).filter((a) => a.rule === "condensing-days");
    expect(alerts.map((a) => a.raisedAt.toISOString())).toEqual(["2026-11-04T04:00:00.000Z"]);
  });

  it("rooms told at once, live and backfill, and a room told again mid-evaluation, all end at their latest readings", async () => {
    const tell = (s: { id: number; roomId: number }, home: Property, newest: Date) =>
      t.ctx.services.sensorWatch.readingsStored({
        organisationId: home.organisationId,
        sensors: [{ sensorId: s.id, roomId: s.roomId, propertyId: home.id, newestTakenAt: newest }],
        receivedAt: clock.now(),
      });
    const homes = [
      await makeProperty(ds, landlord.org),
      await makeProperty(ds, landlord.org),
      await makeProperty(ds, landlord.org),
    ];
    const [a, b, c] = [await fitSensor(homes[0]!), await fitSensor(homes[1]!), await fitSensor(homes[2]!)];
    await storeReadings(b.id, 0, 96, damp);
    await storeReadings(c.id, 0, 96, damp);
    await storeReadings(a.id, 0, 40, damp);
    // Backfill (readings 16 days older than the clock) first, then live rooms; a's second batch lands while
    // its first may be being worked out, and must not be lost.
    tell(c, homes[2]!, new Date(T0 + 96 * H));
    tell(a, homes[0]!, clock.now());
    tell(b, homes[1]!, clock.now());
    await storeReadings(a.id, 40, 56, damp);
    tell(a, homes[0]!, clock.now());
    await t.ctx.services.sensorWatch.drain();
    for (const s of [a, b, c]) {
      const figures = await ds.getRepository(SensorRoomFigures).findOneByOrFail({ roomId: s.roomId });
      expect(figures.latestReadingAt.toISOString()).toBe("2026-11-06T00:00:00.000Z");
      expect(figures.hoursAt80).toBe(96);
      const alerts = (await alertsOf(s.roomId)).filter((x) => x.rule === "hours-at-80");
      expect(alerts.map((x) => x.raisedAt.toISOString())).toEqual(["2026-11-05T00:00:00.000Z"]);
    }
  });

  it("a sweep finds a room whose evaluation was lost and works it out", async () => {
    const other = await makeProperty(ds, landlord.org);
    const s = await fitSensor(other);
    await storeReadings(s.id, 0, 80, damp); // stored, but the listener was never told (a crash)
    expect(await alertsOf(s.roomId)).toHaveLength(0);
    expect(await t.ctx.services.sensorWatch.sweep()).toBeGreaterThan(0);
    await t.ctx.services.sensorWatch.drain();
    expect((await alertsOf(s.roomId)).map((a) => a.rule)).toContain("hours-at-80");
  });
});

describe("through the real ingest", () => {
  it("readings stored by SensorIngestService reach the watch, which raises the alert at its hour", async () => {
    const home = await makeProperty(ds, landlord.org);
    const s = await fitSensor(home);
    // Issued a key, as the registry does (the ingest takes readings only from an active sensor).
    await ds.query("UPDATE sensors SET key_hash = SHA2(CONCAT('test-key-', id), 256) WHERE id = ?", [s.id]);
    // Readings every 15 min for 80 h at surface RH 90 %: the 72-hour rule holds first at T0 + 72 h.
    const readings = Array.from({ length: 80 * 4 + 1 }, (_, i) => ({
      takenAt: new Date(T0 + i * 0.25 * H).toISOString(),
      airTemperatureC: 20,
      relativeHumidityPct: 90,
      surfaceTemperatureC: 20,
    }));
    const identity = {
      id: s.id,
      organisationId: home.organisationId,
      propertyId: home.id,
      roomId: s.roomId,
      serial: "via-ingest",
      mqttUsername: "via-ingest",
      intervalS: 900,
      measuresSurface: true,
    };
    const outcome = await t.ctx.services.sensorIngest.ingest(identity, readings, "http");
    expect(outcome.refused.slice(0, 1)).toEqual([]);
    expect(outcome.stored).toBe(readings.length);
    await t.ctx.services.sensorWatch.drain();
    expect((await alertsOf(s.roomId)).filter((a) => a.rule === "hours-at-80").map((a) => a.raisedAt.toISOString())).toEqual([
      "2026-11-05T00:00:00.000Z",
    ]);
  });
});

describe("the Alerts view and the proactive case", () => {
  let home: Property;
  let sensor: { id: number; roomId: number };
  let tenantEmail: string;

  beforeAll(async () => {
    home = await makeProperty(ds, landlord.org, { addressLine1: "1 Alert Row" });
    tenantEmail = (await makeTenant(ds, landlord.org, home)).email;
    sensor = await fitSensor(home);
    await storeReadings(sensor.id, 0, 96, damp);
    await told(sensor, home);
  });

  it("lists the home with its figures for officers, sorted as asked", async () => {
    const res = await officer.get("/api/sensor-alerts?sort=address&dir=asc").expect(200);
    const body = homesAtRiskResponse.parse(res.body);
    const row = body.items.find((i) => i.propertyId === home.id)!;
    expect(row.address).toContain("1 Alert Row");
    expect(row.rooms[0]!.roomName).toBe("Bedroom");
    expect(row.rooms[0]!.days).toHaveLength(7);
    expect(row.alerts.map((a) => a.rule)).toContain("hours-at-80");
    const addresses = body.items.map((i) => i.address.toLowerCase());
    expect(addresses).toEqual([...addresses].sort());
    await officer.get("/api/sensor-alerts?sort=colour").expect(400);
  });

  it("two officers clicking at once open ONE sensor case, and the tenant is told once, in blame-free words", async () => {
    const row = homesAtRiskResponse
      .parse((await officer.get("/api/sensor-alerts").expect(200)).body)
      .items.find((i) => i.propertyId === home.id)!;
    const [a, b] = await Promise.all([
      officer.post(`/api/sensor-alerts/${row.alertId}/proactive-case`),
      secondOfficer.post(`/api/sensor-alerts/${row.alertId}/proactive-case`),
    ]);
    expect([a.status, b.status].sort()).toEqual([200, 201]);
    const first = proactiveCaseResponse.parse(a.body);
    expect(proactiveCaseResponse.parse(b.body).caseId).toBe(first.caseId);

    const c = (await officer.get(`/api/cases/${first.caseId}`).expect(200)).body;
    expect(c.channel).toBe("sensor");
    // The landlord could have known from the first alert's hour.
    expect(c.awareAt).toBe("2026-11-05T00:00:00.000Z");

    const mails = await outboxRows(ds, { to: tenantEmail, template: "sensorCaseNotice" });
    expect(mails).toHaveLength(1);
    const text = mails[0]!.textBody!;
    expect(text).toContain("about 72 hours");
    expect(text).toContain("nothing here says you have done anything wrong");
    expect(text).toMatch(/GP or pharmacist/);
    expect(text.toLowerCase()).not.toMatch(/lifestyle|your fault|drying clothes|you should open/);

    // The home has left the Alerts view: its alerts are on the case now.
    const after = homesAtRiskResponse.parse((await officer.get("/api/sensor-alerts").expect(200)).body);
    expect(after.items.some((i) => i.propertyId === home.id)).toBe(false);
    const events = (await officer.get(`/api/cases/${first.caseId}/events`).expect(200)).body.events as { type: string }[];
    expect(events.some((e) => e.type === "sensor-alert")).toBe(true);
  });

  it("dismissing needs a reason and takes the home off the view", async () => {
    const other = await makeProperty(ds, landlord.org);
    const s = await fitSensor(other);
    await storeReadings(s.id, 0, 80, damp);
    await told(s, other);
    const id = (await alertsOf(s.roomId))[0]!.id;
    await officer.post(`/api/sensor-alerts/${id}/dismiss`, {}).expect(400);
    expect((await alertsOf(s.roomId))[0]!.state).toBe("open");
    await officer.post(`/api/sensor-alerts/${id}/dismiss`, { reason: "Sensor was next to the kettle while fitted." }).expect(200);
    const after = homesAtRiskResponse.parse((await officer.get("/api/sensor-alerts").expect(200)).body);
    expect(after.items.some((i) => i.propertyId === other.id)).toBe(false);
    expect((await alertsOf(s.roomId))[0]!.dismissedReason).toBe("Sensor was next to the kettle while fitted.");
  });
});

describe("an alert on a home with an open case", () => {
  it("goes on the case's staff timeline (not the tenant's) and into its triage figures", async () => {
    // The landlord's own home and tenant: the tenant reports first, with no readings.
    const report = await tenant
      .post("/api/cases", {
        description: "Water on the kitchen window every morning.",
        locations: ["window"],
        observations: ["condensation"],
      })
      .expect(201);
    const caseId = report.body.id as number;
    const before = (await officer.get(`/api/cases/${caseId}/triage`).expect(200)).body;
    expect(before.riskState ?? null).not.toBe("condensing");

    const s = await fitSensor(landlord.home, "Kitchen", "by the window");
    await storeReadings(s.id, 0, 96, (hour) => ({ rh: 60, surface: hour % 24 >= 3 && hour % 24 < 4 ? 5 : 20 }));
    await told(s, landlord.home);

    const alerts = await alertsOf(s.roomId);
    expect(alerts.map((a) => [a.rule, a.caseId, a.state])).toContainEqual(["condensing-days", caseId, "acknowledged"]);
    const list = homesAtRiskResponse.parse((await officer.get("/api/sensor-alerts").expect(200)).body);
    expect(list.items.some((i) => i.propertyId === landlord.home.id)).toBe(false);

    const staffEvents = (await officer.get(`/api/cases/${caseId}/events`).expect(200)).body.events as { type: string }[];
    expect(staffEvents.filter((e) => e.type === "sensor-alert").length).toBeGreaterThan(0);
    const tenantEvents = (await tenant.get(`/api/cases/${caseId}/events`).expect(200)).body.events as { type: string }[];
    expect(tenantEvents.some((e) => e.type === "sensor-alert")).toBe(false);

    const row = (await ds.query("SELECT risk_state AS riskState FROM cases WHERE id = ?", [caseId])) as { riskState: string }[];
    expect(row[0]!.riskState).toBe("condensing");
  });
});

describe("alert rules in the policy", () => {
  it("officers read our defaults; admins change them with validation; the rules apply to the next evaluation", async () => {
    const defaults = sensorAlertPolicyResponse.parse((await officer.get("/api/policy/sensor-alerts").expect(200)).body);
    expect(defaults).toEqual({
      mouldIndexAtLeast: 1,
      hoursAt80In7Days: 72,
      condensingDaysIn7Days: 3,
      cooldownDays: 7,
      source: "default",
    });
    const put = (c: Client, body: object) => c.agent.put("/api/policy/sensor-alerts").set("X-CSRF-Token", c.csrf).send(body);
    await put(officer, { ...defaults, source: undefined }).expect(403);
    const bad = await put(admin, {
      mouldIndexAtLeast: 1,
      hoursAt80In7Days: 200,
      condensingDaysIn7Days: 3,
      cooldownDays: 7,
    }).expect(400);
    expect(JSON.stringify(bad.body)).toContain("hoursAt80In7Days");
    expect((await officer.get("/api/policy/sensor-alerts").expect(200)).body.source).toBe("default");
    await put(admin, { mouldIndexAtLeast: 1, hoursAt80In7Days: 24, condensingDaysIn7Days: 3, cooldownDays: 7 }).expect(200);

    // With 24 h, 30 h of damp readings raise the rule at T0 + 24 h.
    const home = await makeProperty(ds, landlord.org);
    const s = await fitSensor(home);
    await storeReadings(s.id, 0, 30, damp);
    await told(s, home);
    expect((await alertsOf(s.roomId)).filter((a) => a.rule === "hours-at-80").map((a) => a.raisedAt.toISOString())).toEqual([
      "2026-11-03T00:00:00.000Z",
    ]);
    await admin.agent.delete("/api/policy/sensor-alerts").set("X-CSRF-Token", admin.csrf).expect(200);
  });
});
