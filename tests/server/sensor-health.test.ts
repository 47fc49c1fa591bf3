// Sensor health through the API against real MariaDB: sensors and their readings are inserted directly
// (as the ingest would store them), the sweep checks them, and the lead's summary, the list of sensors
// needing attention and one sensor's health are read as staff would. The clock is the test's own: it
// stands still on a whole second until the test moves it. The rules themselves (the offline
// rule, our thresholds) are tested on constructed series in tests/domain/sensor-health.test.ts.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import {
  sensorAttentionPageResponse,
  sensorHealthResponse,
  sensorHealthSummaryResponse,
} from "../../src/lib/contracts/sensor-health.js";
import { localDate } from "../../src/lib/domain/working-days.js";
import { createClockedApp, ManualClock } from "../support/clocked-app.js";
import { makeLandlord, PASSWORD } from "../support/factories.js";
import { signedInClient, type Client, type TestApp } from "../support/test-app.js";

const MIN = 60_000;
const clock = new ManualClock();
let t: TestApp;
let maintenance: Client;
let officer: Client;
let tenant: Client;
let otherAdmin: Client;
const ids: Record<string, number> = {};
let now: Date;

interface Reading {
  minutesAgo: number;
  t?: number;
  rh?: number;
  battery?: number | null;
}

/** Every sensor this file made: other test files share the database, and the sweep sees all landlords. */
const created = new Set<number>();
/** How many of this file's sensors a sweep checked. */
const ours = (checked: number[]) => checked.filter((id) => created.has(id)).length;

async function addSensor(
  org: { id: number },
  home: { id: number },
  serial: string,
  readings: Reading[],
  over: { keyIssuedMinutesAgo?: number; revoked?: boolean; removedOn?: string } = {},
): Promise<number> {
  const ds = t.ctx.dataSource;
  const [room] = (await ds.query("SELECT id FROM rooms WHERE property_id = ? ORDER BY id LIMIT 1", [home.id])) as {
    id: number;
  }[];
  const issued = new Date(now.getTime() - (over.keyIssuedMinutesAgo ?? 14 * 24 * 60) * MIN);
  const result = (await ds.query(
    `INSERT INTO sensors (organisation_id, property_id, room_id, serial, model, placement, interval_s, installed_on,
                          removed_on, mqtt_username, key_hash, key_issued_at, revoked_at, created_at)
     VALUES (?, ?, ?, ?, 'TH-1', 'external wall corner, 0.3 m above floor', 900, '2026-01-01', ?, ?, NULL, ?, ?, ?)`,
    [
      org.id,
      home.id,
      room!.id,
      serial,
      over.removedOn ?? null,
      `t-${serial}-${org.id}`,
      issued,
      over.revoked ? now : null,
      issued,
    ],
  )) as { insertId: number | bigint };
  const id = Number(result.insertId);
  created.add(id);
  if (readings.length) {
    const rows = readings.map((r) => [
      id,
      new Date(now.getTime() - r.minutesAgo * MIN),
      r.t ?? 20,
      r.rh ?? 60,
      r.battery === undefined ? 90 : r.battery,
      now,
    ]);
    await ds.query(
      `INSERT INTO sensor_readings (sensor_id, taken_at, air_temperature_c, relative_humidity_pct, battery_pct, received_at)
       VALUES ${rows.map(() => "(?, ?, ?, ?, ?, ?)").join(", ")}`,
      rows.flat(),
    );
    await ds.query(
      "UPDATE sensors SET last_reading_at = (SELECT MAX(taken_at) FROM sensor_readings WHERE sensor_id = ?) WHERE id = ?",
      [id, id],
    );
  }
  return id;
}

/** Every 15 minutes from `from` to `to` minutes ago, the temperature moving a little unless `pinned`. */
function every15(from: number, to: number, over: Omit<Reading, "minutesAgo"> = {}, pinned = false): Reading[] {
  const out: Reading[] = [];
  for (let m = from; m >= to; m -= 15) out.push({ t: pinned ? over.t : 20 + ((m / 15) % 4) / 10, ...over, minutesAgo: m });
  return out;
}

beforeAll(async () => {
  // A whole second, as readings are stored.
  clock.advance(1000 - (clock.now().getTime() % 1000));
  now = clock.now();
  t = await createClockedApp(clock);
  const ds = t.ctx.dataSource;
  const landlord = await makeLandlord(ds);
  const elsewhere = await makeLandlord(ds);
  maintenance = await signedInClient(t.app, landlord.maintenance.email, PASSWORD);
  officer = await signedInClient(t.app, landlord.officer.email, PASSWORD);
  tenant = await signedInClient(t.app, landlord.tenant.email, PASSWORD);
  otherAdmin = await signedInClient(t.app, elsewhere.admin.email, PASSWORD);
  const { org, home } = landlord;

  ids.working = await addSensor(org, home, "A-WORKING", every15(480, 5));
  // Exactly twice its 15-minute interval since its last reading: offline.
  ids.silent = await addSensor(org, home, "B-SILENT", every15(480, 30));
  // One second short of twice its interval: not offline.
  ids.almost = await addSensor(org, home, "B-ALMOST", [...every15(480, 45), { minutesAgo: 29 + 59 / 60 }]);
  ids.battery = await addSensor(org, home, "C-BATTERY", every15(240, 5, { battery: 18 }));
  ids.flat = await addSensor(org, home, "D-FLAT", [...every15(600, 435), ...every15(420, 0, { t: 19.5, rh: 64 }, true)]);
  ids.jumping = await addSensor(org, home, "E-JUMPING", [...every15(245, 20), { minutesAgo: 5, t: 31 }]);
  ids.neverReported = await addSensor(org, home, "F-NEVER", [], { keyIssuedMinutesAgo: 120 });
  // Not in use: revoked, or removed yesterday. Neither is counted, however silent.
  await addSensor(org, home, "G-REVOKED", every15(3000, 2000), { revoked: true });
  await addSensor(org, home, "H-REMOVED", every15(3000, 2000), { removedOn: localDate(new Date(now.getTime() - 86_400_000)) });
  // Another landlord's silent sensor.
  ids.elsewhere = await addSensor(elsewhere.org, elsewhere.home, "X-ELSEWHERE", every15(600, 300));
});
afterAll(() => t?.close());

const summaryOf = async (c: Client) =>
  sensorHealthSummaryResponse.parse((await c.get("/api/sensor-health/summary").expect(200)).body);
const pageOf = async (c: Client, query = "") =>
  sensorAttentionPageResponse.parse((await c.get(`/api/sensor-health/devices${query}`).expect(200)).body);

describe("the lead's summary", () => {
  it("counts offline at once, and the problems in readings once the sweep has checked them", async () => {
    const before = await summaryOf(maintenance);
    expect(before).toMatchObject({
      total: 7,
      needingAttention: 2,
      ok: 5,
      counts: { offline: 2, "low-battery": 0, "flat-lined": 0, jumping: 0 },
      oldestCheckAt: null,
    });

    // Every sensor not revoked with readings and no check yet: six in use, the removed one, another landlord's.
    expect(ours(await t.ctx.services.sensorHealth.sweep())).toBe(8);
    const after = await summaryOf(maintenance);
    expect(after).toMatchObject({
      total: 7,
      needingAttention: 5,
      ok: 2,
      counts: { offline: 2, "low-battery": 1, "flat-lined": 1, jumping: 1 },
      oldestCheckAt: now.toISOString(),
    });
    // Officers read it; another landlord sees only their own sensor; tenants never.
    expect(await summaryOf(officer)).toEqual(after);
    expect(await summaryOf(otherAdmin)).toMatchObject({ total: 1, counts: { offline: 1 } });
    await tenant.get("/api/sensor-health/summary").expect(403);
  });

  it("lists the sensors needing attention with their home, room, problems and reasons, paged and filtered", async () => {
    const all = await pageOf(maintenance);
    expect(all.total).toBe(5);
    expect(all.items.map((i) => i.sensor.serial)).toEqual(["B-SILENT", "C-BATTERY", "D-FLAT", "E-JUMPING", "F-NEVER"]);
    const flat = all.items.find((i) => i.sensor.serial === "D-FLAT")!;
    expect(flat.room.name).toBe("Bedroom");
    expect(flat.home.town).toBe("Testford");
    expect(flat.findings).toEqual([
      {
        problem: "flat-lined",
        since: new Date(now.getTime() - 420 * MIN).toISOString(),
        reason:
          "The same 19.5 °C and 64.0 % RH in 29 readings over 7 h (ours: no change at all for 6 h or more means a stuck sensor).",
      },
    ]);
    expect(all.items.find((i) => i.sensor.serial === "B-SILENT")!.findings).toEqual([
      {
        problem: "offline",
        since: new Date(now.getTime() - 30 * MIN).toISOString(),
        reason: "No reading for 30 min (it reports every 15 min, so it counts as offline after 30 min).",
      },
    ]);
    expect(all.items.find((i) => i.sensor.serial === "E-JUMPING")!.findings[0]!.reason).toMatch(
      /^1 implausible step in the last 24 h, the latest air 20\.\d → 31\.0 °C in 15 min/,
    );

    const offline = await pageOf(maintenance, "?problem=offline");
    expect(offline.items.map((i) => i.sensor.serial)).toEqual(["B-SILENT", "F-NEVER"]);
    const second = await pageOf(maintenance, "?pageSize=2&page=2");
    expect(second).toMatchObject({ total: 5, page: 2, pageSize: 2 });
    expect(second.items.map((i) => i.sensor.serial)).toEqual(["D-FLAT", "E-JUMPING"]);

    await maintenance.get("/api/sensor-health/devices?problem=broken").expect(400);
    await maintenance.get("/api/sensor-health/devices?pageSize=500").expect(400);
  });
});

describe("one sensor's health", () => {
  it("is worked out from its readings when asked, for the landlord's staff only", async () => {
    const flat = sensorHealthResponse.parse((await maintenance.get(`/api/sensor-health/${ids.flat}`).expect(200)).body);
    expect(flat).toMatchObject({ serial: "D-FLAT", ok: false, checkedAt: now.toISOString() });
    expect(flat.findings.map((f) => f.problem)).toEqual(["flat-lined"]);
    const working = sensorHealthResponse.parse((await officer.get(`/api/sensor-health/${ids.working}`).expect(200)).body);
    expect(working).toMatchObject({ ok: true, findings: [] });
    await otherAdmin.get(`/api/sensor-health/${ids.flat}`).expect(404);
    await tenant.get(`/api/sensor-health/${ids.flat}`).expect(403);
  });
});

describe("the sweep", () => {
  it("checks again only sensors with new readings, and re-checks stored problems after an hour", async () => {
    const sweep = async () => ours(await t.ctx.services.sensorHealth.sweep());
    expect(await sweep()).toBe(0);

    // A new battery in C: its next reading clears its low battery.
    clock.advance(5 * MIN);
    await t.ctx.dataSource.query(
      `INSERT INTO sensor_readings (sensor_id, taken_at, air_temperature_c, relative_humidity_pct, battery_pct, received_at)
       VALUES (?, ?, 20.3, 61, 100, ?)`,
      [ids.battery, clock.now(), clock.now()],
    );
    await t.ctx.dataSource.query("UPDATE sensors SET last_reading_at = ? WHERE id = ?", [clock.now(), ids.battery]);
    expect(await sweep()).toBe(1);
    expect((await summaryOf(maintenance)).counts["low-battery"]).toBe(0);

    // A day later every reading has left the 24-hour window: the stored flat line and jump are checked
    // again and go; the sensors are offline instead.
    clock.advance(24 * 60 * MIN);
    expect(await sweep()).toBe(2);
    const later = await summaryOf(maintenance);
    expect(later.counts).toEqual({ offline: 7, "low-battery": 0, "flat-lined": 0, jumping: 0 });
    expect(later.needingAttention).toBe(7);
  });
});
