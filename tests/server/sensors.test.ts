// The sensor registry and the HTTP ingest, against the real MariaDB: leads register sensors and see
// their secret once (stored only hashed), rotate and revoke it; devices post readings with it, each
// reading refused with its own reason or stored once, whatever order and however often it comes.
import { createHash, pbkdf2Sync } from "node:crypto";
import request from "supertest";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import type { StoredReadingsBatch } from "../../server/modules/sensors/sensor-events.js";
import { localDate } from "../../src/lib/domain/working-days.js";
import { makeLandlord, makeTenant, PASSWORD } from "../support/factories.js";
import { daysAgo, hoursAgo, msAgo } from "../support/test-clock.js";
import { createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";

let t: TestApp;
let lead: Client;
let admin: Client;
let officer: Client;
let otherLead: Client;
let tenant: Client;
let landlord: Awaited<ReturnType<typeof makeLandlord>>;
let roomId: number;
let serialNo = 0;
const batches: StoredReadingsBatch[] = [];

/** Whole seconds with a Z, as sensors send them. */
const iso = (d: Date) => `${d.toISOString().slice(0, 19)}Z`;
const reading = (at: Date, over: Record<string, unknown> = {}) => ({
  takenAt: iso(at),
  airTemperatureC: 19.5,
  relativeHumidityPct: 71.25,
  ...over,
});

async function register(client: Client = lead, over: Record<string, unknown> = {}) {
  serialNo += 1;
  const res = await client
    .post("/api/sensors", {
      propertyId: landlord.home.id,
      roomId,
      serial: `SN-${Date.now().toString(36)}-${serialNo}`,
      model: "TH-2 with surface probe",
      placement: "external wall corner, 0.3 m above floor",
      measuresSurface: true,
      intervalS: 900,
      installedOn: localDate(daysAgo(40)),
      ...over,
    })
    .expect(201);
  return res.body as {
    sensor: { id: number; serial: string; version: number; mqttUsername: string };
    credentials: { secret: string };
  };
}

const post = (secret: string, body: object) =>
  request(t.app).post("/api/sensor-ingest/readings").set("Authorization", `Bearer ${secret}`).send(body);

async function storedRows(sensorId: number) {
  return (await t.ctx.dataSource.query(
    "SELECT taken_at, air_temperature_c, relative_humidity_pct, surface_temperature_c, battery_pct FROM sensor_readings WHERE sensor_id = ? ORDER BY taken_at",
    [sensorId],
  )) as {
    taken_at: Date;
    air_temperature_c: string;
    relative_humidity_pct: string;
    surface_temperature_c: string | null;
    battery_pct: number | null;
  }[];
}

beforeAll(async () => {
  t = await createTestApp();
  const ds = t.ctx.dataSource;
  landlord = await makeLandlord(ds);
  const elsewhere = await makeLandlord(ds);
  lead = await signedInClient(t.app, landlord.maintenance.email, PASSWORD);
  admin = await signedInClient(t.app, landlord.admin.email, PASSWORD);
  officer = await signedInClient(t.app, landlord.officer.email, PASSWORD);
  otherLead = await signedInClient(t.app, elsewhere.maintenance.email, PASSWORD);
  const tenantUser = await makeTenant(ds, landlord.org, landlord.home);
  tenant = await signedInClient(t.app, tenantUser.email, PASSWORD);
  roomId = (await officer.get(`/api/properties/${landlord.home.id}`).expect(200)).body.rooms[0].id;
  t.ctx.services.sensorIngest.addListener({ readingsStored: (b) => batches.push(b) });
});
afterAll(() => t.close());

describe("sensor registry", () => {
  it("registers a sensor and shows its secret once; only hashes are stored (SHA-256 and mosquitto's $7$)", async () => {
    const { sensor, credentials } = await register();
    expect(credentials.secret).toMatch(/^dws_[A-Za-z0-9_-]{43}$/);
    expect(sensor.mqttUsername).toBe(`s${sensor.id}`);
    expect((credentials as unknown as { mqttTopic: string }).mqttTopic).toBe(`sensors/s${sensor.id}/readings`);

    const [row] = (await t.ctx.dataSource.query("SELECT * FROM sensors WHERE id = ?", [sensor.id])) as Record<string, unknown>[];
    const everything = JSON.stringify(row);
    expect(everything).not.toContain(credentials.secret);
    expect(everything).not.toContain(credentials.secret.slice(4));
    expect(row!.key_hash).toBe(createHash("sha256").update(credentials.secret).digest("hex"));
    // mosquitto_passwd's $7$ form, recomputed here from its parts (PBKDF2-SHA512, 101 iterations, 64 bytes).
    const [, seven, iterations, salt, hash] = String(row!.mqtt_password_hash).split("$");
    expect([seven, iterations]).toEqual(["7", "101"]);
    expect(Buffer.from(salt!, "base64")).toHaveLength(12);
    expect(hash).toBe(pbkdf2Sync(credentials.secret, Buffer.from(salt!, "base64"), 101, 64, "sha512").toString("base64"));

    // Never shown again: not in the sensor, nor in the list.
    const again = await officer.get(`/api/sensors/${sensor.id}`).expect(200);
    expect(JSON.stringify(again.body)).not.toContain(credentials.secret);
    const list = await officer.get(`/api/sensors?propertyId=${landlord.home.id}`).expect(200);
    expect(JSON.stringify(list.body)).not.toContain(credentials.secret);
    expect(list.body.items.map((s: { id: number }) => s.id)).toContain(sensor.id);
    expect(again.body).toMatchObject({
      state: "active",
      roomName: "Bedroom",
      placement: "external wall corner, 0.3 m above floor",
    });
  });

  it("refuses a duplicate serial (409), a room of another home (400), a future installation (400)", async () => {
    const { sensor } = await register();
    const dup = await lead
      .post("/api/sensors", {
        propertyId: landlord.home.id,
        roomId,
        serial: sensor.serial,
        model: "m",
        placement: "p",
        measuresSurface: false,
        intervalS: 900,
        installedOn: localDate(daysAgo(1)),
      })
      .expect(409);
    expect(dup.body.error.details[0].field).toBe("serial");
    const base = {
      propertyId: landlord.home.id,
      roomId,
      serial: "X-1",
      model: "m",
      placement: "p",
      measuresSurface: false,
      intervalS: 900,
    };
    await lead.post("/api/sensors", { ...base, installedOn: localDate(daysAgo(-3)) }).expect(400);
    await lead.post("/api/sensors", { ...base, roomId: 999_999, installedOn: localDate(daysAgo(1)) }).expect(400);
    await lead.post("/api/sensors", { ...base, intervalS: 30, installedOn: localDate(daysAgo(1)) }).expect(400);
    expect(
      (await officer.get("/api/sensors?state=active").expect(200)).body.items.some((s: { serial: string }) => s.serial === "X-1"),
    ).toBe(false);
  });

  it("lets only leads of the landlord change sensors: another landlord's lead gets 404, a tenant and an officer 403", async () => {
    const { sensor } = await register(admin);
    await otherLead.get(`/api/sensors/${sensor.id}`).expect(404);
    await otherLead.post(`/api/sensors/${sensor.id}/revoke`).expect(404);
    await otherLead.post(`/api/sensors/${sensor.id}/credentials`).expect(404);
    await otherLead.patch(`/api/sensors/${sensor.id}`, { model: "x", version: sensor.version }).expect(404);
    await tenant.get(`/api/sensors/${sensor.id}`).expect(403);
    await tenant.get(`/api/properties/${landlord.home.id}/sensors`).expect(403);
    await officer.post(`/api/sensors/${sensor.id}/revoke`).expect(403);
    expect((await otherLead.get("/api/sensors").expect(200)).body.items).toEqual([]);
    expect((await officer.get(`/api/sensors/${sensor.id}`).expect(200)).body.state).toBe("active");
  });

  it("checks the version on edits (409 when stale) and keeps the first editor's change", async () => {
    const { sensor } = await register();
    const first = await lead
      .patch(`/api/sensors/${sensor.id}`, { placement: "window reveal", version: sensor.version })
      .expect(200);
    expect(first.body.version).toBe(sensor.version + 1);
    const stale = await admin.patch(`/api/sensors/${sensor.id}`, { placement: "ceiling", version: sensor.version }).expect(409);
    expect(stale.body.error.details.code).toBe("stale_version");
    expect((await officer.get(`/api/sensors/${sensor.id}`).expect(200)).body.placement).toBe("window reveal");
  });

  it("rotating cuts off the old secret at once; revoking cuts off the new one and clears both hashes", async () => {
    const { sensor, credentials } = await register();
    await post(credentials.secret, { readings: [reading(hoursAgo(2))] }).expect(200);
    const rotated = (await lead.post(`/api/sensors/${sensor.id}/credentials`).expect(200)).body;
    expect(rotated.credentials.secret).not.toBe(credentials.secret);
    await post(credentials.secret, { readings: [reading(hoursAgo(1))] }).expect(401);
    await post(rotated.credentials.secret, { readings: [reading(hoursAgo(1))] }).expect(200);

    const revoked = await lead.post(`/api/sensors/${sensor.id}/revoke`).expect(200);
    expect(revoked.body.state).toBe("revoked");
    const [row] = (await t.ctx.dataSource.query("SELECT key_hash, mqtt_password_hash, revoked_at FROM sensors WHERE id = ?", [
      sensor.id,
    ])) as { key_hash: string | null; mqtt_password_hash: string | null; revoked_at: Date | null }[];
    expect(row).toMatchObject({ key_hash: null, mqtt_password_hash: null });
    expect(row!.revoked_at).not.toBeNull();
    const refused = await post(rotated.credentials.secret, { readings: [reading(msAgo(60_000))] }).expect(401);
    expect(refused.body.error.code).toBe("unauthorised");
    expect((await officer.get("/api/sensors?state=revoked").expect(200)).body.items.map((s: { id: number }) => s.id)).toContain(
      sensor.id,
    );
  });

  it("a removed sensor's key stops working", async () => {
    const { sensor, credentials } = await register();
    await lead
      .post(`/api/sensors/${sensor.id}/remove`, { removedOn: localDate(daysAgo(0)), version: sensor.version })
      .expect(200);
    await post(credentials.secret, { readings: [reading(hoursAgo(1))] }).expect(401);
    expect(
      (await officer.get(`/api/properties/${landlord.home.id}/sensors`).expect(200)).body.items.find(
        (s: { id: number }) => s.id === sensor.id,
      ).state,
    ).toBe("removed");
  });
});

describe("HTTP ingest", () => {
  it("stores a batch once: a re-post is all duplicates and the first values stay", async () => {
    const { sensor, credentials } = await register();
    const readings = [
      reading(hoursAgo(3), { surfaceTemperatureC: 12.4, batteryPct: 88 }),
      reading(hoursAgo(2)),
      reading(hoursAgo(1)),
    ];
    expect((await post(credentials.secret, { readings }).expect(200)).body).toEqual({ stored: 3, duplicates: 0, refused: [] });
    const changed = readings.map((r) => ({ ...r, airTemperatureC: 30 }));
    expect((await post(credentials.secret, { serial: sensor.serial, readings: changed }).expect(200)).body).toEqual({
      stored: 0,
      duplicates: 3,
      refused: [],
    });
    const rows = await storedRows(sensor.id);
    expect(rows).toHaveLength(3);
    expect(rows.map((r) => Number(r.air_temperature_c))).toEqual([19.5, 19.5, 19.5]);
    expect(rows[0]).toMatchObject({ surface_temperature_c: "12.40", battery_pct: 88, relative_humidity_pct: "71.25" });
  });

  it("takes readings out of order and late (29 days) and moves last seen to the newest only", async () => {
    const { sensor, credentials } = await register();
    const newest = hoursAgo(1);
    await post(credentials.secret, { readings: [reading(newest)] }).expect(200);
    // The refused time is taken once: worked out again after the request, it could be a second later.
    const tooLate = daysAgo(31);
    const late = await post(credentials.secret, {
      readings: [reading(daysAgo(29)), reading(hoursAgo(5)), reading(tooLate)],
    }).expect(200);
    expect(late.body.stored).toBe(2);
    expect(late.body.refused).toEqual([{ index: 2, takenAt: iso(tooLate), reason: expect.stringContaining("30 days") }]);
    const rows = await storedRows(sensor.id);
    expect(rows).toHaveLength(3);
    const seen = (await officer.get(`/api/sensors/${sensor.id}`).expect(200)).body.lastReadingAt;
    expect(seen).toBe(`${iso(newest).slice(0, 19)}.000Z`);
  });

  it("refuses each impossible reading with its own reason and stores the good ones of the same batch", async () => {
    const { sensor, credentials } = await register();
    const good = [reading(hoursAgo(4)), reading(hoursAgo(3), { surfaceTemperatureC: -2.5, batteryPct: 0 })];
    const bad = [
      reading(msAgo(-10 * 60_000)), // ten minutes ahead of the server's clock
      { ...reading(hoursAgo(2)), takenAt: iso(hoursAgo(2)).slice(0, 19) }, // no zone
      { ...reading(hoursAgo(2)), takenAt: "yesterday at noon" },
      reading(hoursAgo(2), { airTemperatureC: 55 }),
      reading(hoursAgo(2), { airTemperatureC: -20.5 }),
      reading(hoursAgo(2), { relativeHumidityPct: 0 }),
      reading(hoursAgo(2), { relativeHumidityPct: 100.5 }),
      reading(hoursAgo(2), { surfaceTemperatureC: -31 }),
      reading(hoursAgo(2), { batteryPct: 101 }),
      reading(hoursAgo(2), { airTemperatureC: "19" }),
      reading(daysAgo(45)), // before it was installed (40 days ago) — and too late
      "not a reading",
    ];
    const res = await post(credentials.secret, { readings: [good[0], ...bad, good[1]] }).expect(200);
    expect(res.body.stored).toBe(2);
    expect(res.body.duplicates).toBe(0);
    const reasons = res.body.refused.map((r: { index: number; reason: string }) => [r.index, r.reason]);
    expect(reasons).toEqual([
      [1, expect.stringContaining("future")],
      [2, expect.stringContaining("no time zone")],
      [3, expect.stringContaining("not an ISO 8601")],
      [4, expect.stringContaining("airTemperatureC 55")],
      [5, expect.stringContaining("airTemperatureC −20.5")],
      [6, expect.stringContaining("relativeHumidityPct 0")],
      [7, expect.stringContaining("relativeHumidityPct 100.5")],
      [8, expect.stringContaining("surfaceTemperatureC −31")],
      [9, expect.stringContaining("batteryPct 101")],
      [10, expect.stringContaining("airTemperatureC is missing or not a number")],
      [11, expect.stringContaining("30 days")],
      [12, expect.stringContaining("Not a reading")],
    ]);
    expect(await storedRows(sensor.id)).toHaveLength(2);
  });

  it("refuses readings from before the installation day", async () => {
    const { credentials } = await register(lead, { installedOn: localDate(daysAgo(3)) });
    const res = await post(credentials.secret, { readings: [reading(daysAgo(5)), reading(daysAgo(1))] }).expect(200);
    expect(res.body.stored).toBe(1);
    expect(res.body.refused[0]).toMatchObject({ index: 0, reason: expect.stringContaining("before the sensor was installed") });
  });

  it("401 for an unknown key, 403 for another sensor's serial, 400 for a bad body, 413 for a huge one", async () => {
    const { credentials } = await register();
    const other = await register();
    await post("dws_" + "A".repeat(43), { readings: [reading(hoursAgo(1))] }).expect(401);
    await request(t.app)
      .post("/api/sensor-ingest/readings")
      .send({ readings: [reading(hoursAgo(1))] })
      .expect(401);
    const wrong = await post(credentials.secret, { serial: other.sensor.serial, readings: [reading(hoursAgo(1))] }).expect(403);
    expect(wrong.body.error.code).toBe("wrong_sensor");
    expect(await storedRows(other.sensor.id)).toHaveLength(0);
    await post(credentials.secret, { readings: [] }).expect(400);
    await post(credentials.secret, { readings: Array.from({ length: 5001 }, () => reading(hoursAgo(1))) }).expect(400);
    await request(t.app)
      .post("/api/sensor-ingest/readings")
      .set("Authorization", `Bearer ${credentials.secret}`)
      .set("Content-Type", "application/json")
      .send("{ not json")
      .expect(400);
    const huge = JSON.stringify({ readings: [{ takenAt: "x".repeat(5_000_000) }] });
    await request(t.app)
      .post("/api/sensor-ingest/readings")
      .set("Authorization", `Bearer ${credentials.secret}`)
      .set("Content-Type", "application/json")
      .send(huge)
      .expect(413);
  });

  it("takes a full batch of 5 000 readings in one go", async () => {
    const { sensor, credentials } = await register();
    const start = daysAgo(20).getTime();
    const readings = Array.from({ length: 5000 }, (_, i) =>
      reading(new Date(start + i * 60_000), { relativeHumidityPct: 40 + (i % 50) }),
    );
    expect((await post(credentials.secret, { readings }).expect(200)).body).toEqual({ stored: 5000, duplicates: 0, refused: [] });
    expect(await storedRows(sensor.id)).toHaveLength(5000);
  });

  it("tells the listeners after the commit, with the sensor, its room and its newest reading; not for duplicates", async () => {
    const { sensor, credentials } = await register();
    const before = batches.length;
    const newest = hoursAgo(1);
    await post(credentials.secret, { readings: [reading(hoursAgo(2)), reading(newest)] }).expect(200);
    const told = batches.slice(before);
    expect(told).toHaveLength(1);
    expect(told[0]).toMatchObject({
      organisationId: landlord.org.id,
      sensors: [{ sensorId: sensor.id, roomId, propertyId: landlord.home.id, newestTakenAt: new Date(iso(newest)) }],
    });
    // Everything it names is already visible to any other connection.
    expect(await storedRows(sensor.id)).toHaveLength(2);
    await post(credentials.secret, { readings: [reading(newest)] }).expect(200);
    expect(batches.length).toBe(before + 1);
  });

  it("tells about backfills sent side by side once, together, when the ingest is quiet; live readings at once", async () => {
    const a = await register();
    const b = await register();
    const identity = async (secret: string) => (await t.ctx.services.sensorIngest.identifyByKey(secret))!;
    const [ida, idb] = [await identity(a.credentials.secret), await identity(b.credentials.secret)];
    const ingest = (id: typeof ida, at: Date[]) =>
      t.ctx.services.sensorIngest.ingest(
        id,
        at.map((d) => reading(d)),
        "http",
      );

    let before = batches.length;
    const oldA = daysAgo(3);
    const oldB = daysAgo(2);
    const outcomes = await Promise.all([ingest(ida, [daysAgo(4), oldA]), ingest(idb, [oldB])]);
    expect(outcomes.map((o) => o.stored)).toEqual([2, 1]);
    // Stored, and both sensors named in one batch once the ingest is quiet.
    await vi.waitFor(() => expect(batches.length).toBeGreaterThan(before), { timeout: 10_000 });
    const told = batches.slice(before);
    expect(told).toHaveLength(1);
    expect(told[0]!.organisationId).toBe(landlord.org.id);
    expect([...told[0]!.sensors].sort((x, y) => x.sensorId - y.sensorId)).toEqual([
      { sensorId: a.sensor.id, roomId, propertyId: landlord.home.id, newestTakenAt: new Date(iso(oldA)) },
      { sensorId: b.sensor.id, roomId, propertyId: landlord.home.id, newestTakenAt: new Date(iso(oldB)) },
    ]);

    before = batches.length;
    const live = msAgo(60_000);
    await Promise.all([ingest(ida, [live]), ingest(idb, [live])]);
    const liveTold = batches.slice(before).map((x) => x.sensors.map((s) => s.sensorId));
    expect(liveTold.sort((x, y) => x[0]! - y[0]!)).toEqual([[a.sensor.id], [b.sensor.id]]);
  });
});

describe("HTTP ingest as CSV (the backlog form)", () => {
  const postCsv = (secret: string, text: string) =>
    request(t.app)
      .post("/api/sensor-ingest/readings")
      .set("Authorization", `Bearer ${secret}`)
      .set("Content-Type", "text/csv")
      .send(text);
  /** An offset form of a time: the same moment written in +01:00. */
  const plusOne = (d: Date) => `${new Date(d.getTime() + 3_600_000).toISOString().slice(0, 19)}+01:00`;

  it("stores each good line once, in any column order, and refuses each bad line with its own reason", async () => {
    const { sensor, credentials } = await register();
    const [h6, h5, h4, h3, h2] = [hoursAgo(6), hoursAgo(5), hoursAgo(4), hoursAgo(3), hoursAgo(2)];
    const csv = [
      "\ufeffrelativeHumidityPct,takenAt,airTemperatureC,surfaceTemperatureC,batteryPct",
      `71.25,${iso(h6)},19.5,12.4,88`,
      `80,${plusOne(h5)},-2.25,,`, // an offset time; no surface or battery
      `65.5,${iso(h4)},21.256,13.004,87.6`, // more decimals than the columns keep: rounded
      "",
      `70,${iso(msAgo(-10 * 60_000))},19,12,80`, // ten minutes ahead of the server's clock
      `100.5,${iso(h2)},19,12,80`,
      `70,${iso(h2)},1e1,12,80`,
      `70,${iso(h2)},,12,80`,
      `70,${iso(h2)},19,12`,
      `70,${iso(h2).slice(0, 19)},19,12,80`,
      `70,${iso(h2)},19,12,101`,
      `70,${iso(daysAgo(45))},19,12,80`,
      `72,${iso(h3)},19.75,12.5,86`,
    ].join("\r\n");
    const res = await postCsv(credentials.secret, csv).expect(200);
    expect(res.body.stored).toBe(4);
    expect(res.body.duplicates).toBe(0);
    expect(res.body.refused.map((r: { index: number; reason: string }) => [r.index, r.reason])).toEqual([
      [3, expect.stringContaining("future")],
      [4, expect.stringContaining("relativeHumidityPct 100.5")],
      [5, expect.stringContaining("airTemperatureC is missing or not a number")],
      [6, expect.stringContaining("airTemperatureC is missing or not a number")],
      [7, "This line has 4 fields; the header names 5."],
      [8, expect.stringContaining("no time zone")],
      [9, expect.stringContaining("batteryPct 101")],
      [10, expect.stringContaining("30 days")],
    ]);
    expect(res.body.refused[1].takenAt).toBe(iso(h2));
    const rows = await storedRows(sensor.id);
    expect(
      rows.map((r) => [
        r.taken_at.toISOString(),
        r.air_temperature_c,
        r.relative_humidity_pct,
        r.surface_temperature_c,
        r.battery_pct,
      ]),
    ).toEqual([
      [`${iso(h6).slice(0, 19)}.000Z`, "19.50", "71.25", "12.40", 88],
      [`${iso(h5).slice(0, 19)}.000Z`, "-2.25", "80.00", null, null],
      [`${iso(h4).slice(0, 19)}.000Z`, "21.26", "65.50", "13.00", 88],
      [`${iso(h3).slice(0, 19)}.000Z`, "19.75", "72.00", "12.50", 86],
    ]);
    // Sent again, with other values: all duplicates, the first values stay.
    const again = await postCsv(
      credentials.secret,
      `takenAt,airTemperatureC,relativeHumidityPct\n${iso(h6)},30,50\n${iso(h3)},30,50\n`,
    ).expect(200);
    expect(again.body).toEqual({ stored: 0, duplicates: 2, refused: [] });
    expect((await storedRows(sensor.id))[0]!.air_temperature_c).toBe("19.50");
    const seen = (await officer.get(`/api/sensors/${sensor.id}`).expect(200)).body.lastReadingAt;
    expect(seen).toBe(`${iso(h3).slice(0, 19)}.000Z`);
  });

  it("refuses a header it cannot read, no readings, too many, and bodies neither JSON nor CSV; nothing is stored", async () => {
    const { sensor, credentials } = await register();
    const line = `${iso(hoursAgo(1))},19,70`;
    const unknown = await postCsv(credentials.secret, `takenAt,airTemperatureC,relativeHumidityPct,humidity\n${line},1\n`).expect(
      400,
    );
    expect(unknown.body.error.message).toContain('"humidity"');
    expect(
      (await postCsv(credentials.secret, `takenAt,airTemperatureC\n${iso(hoursAgo(1))},19\n`).expect(400)).body.error.message,
    ).toContain("lacks relativeHumidityPct");
    await postCsv(credentials.secret, `takenAt,takenAt,airTemperatureC,relativeHumidityPct\n`).expect(400);
    await postCsv(credentials.secret, "takenAt,airTemperatureC,relativeHumidityPct\n\n").expect(400);
    expect((await postCsv(credentials.secret, "").expect(400)).body.error.message).toContain("The CSV is empty");
    const start = daysAgo(20).getTime();
    const many = Array.from({ length: 50_001 }, (_, i) => `${iso(new Date(start + i * 30_000))},19,70`).join("\n");
    const tooMany = await postCsv(credentials.secret, `takenAt,airTemperatureC,relativeHumidityPct\n${many}\n`).expect(400);
    expect(tooMany.body.error.message).toContain("50,000");
    await request(t.app)
      .post("/api/sensor-ingest/readings")
      .set("Authorization", `Bearer ${credentials.secret}`)
      .set("Content-Type", "text/plain")
      .send(`takenAt,airTemperatureC,relativeHumidityPct\n${line}\n`)
      .expect(415);
    expect(await storedRows(sensor.id)).toHaveLength(0);
    // The key is still checked first: a CSV with an unknown key is a 401.
    await postCsv("dws_" + "B".repeat(43), `takenAt,airTemperatureC,relativeHumidityPct\n${line}\n`).expect(401);
  });

  it("stores big backlogs sent side by side for several sensors (one bulk load at a time), each answered with its own counts", async () => {
    const sensors = await Promise.all([register(), register(), register()]);
    const start = daysAgo(25).getTime();
    const backlog = (from: number, count: number, air: number) =>
      "takenAt,airTemperatureC,relativeHumidityPct\n" +
      Array.from({ length: count }, (_, i) => `${iso(new Date(start + (from + i) * 120_000))},${air},70`).join("\n");
    // The third sensor's second batch overlaps its first by 500 readings.
    const answers = await Promise.all([
      postCsv(sensors[0]!.credentials.secret, backlog(0, 12_000, 18)),
      postCsv(sensors[1]!.credentials.secret, backlog(0, 8_000, 19)),
      postCsv(sensors[2]!.credentials.secret, backlog(0, 3_000, 20)),
      postCsv(sensors[2]!.credentials.secret, backlog(2_500, 3_000, 21)),
    ]);
    expect(answers.map((a) => a.status)).toEqual([200, 200, 200, 200]);
    expect(answers.slice(0, 2).map((a) => a.body)).toEqual([
      { stored: 12_000, duplicates: 0, refused: [] },
      { stored: 8_000, duplicates: 0, refused: [] },
    ]);
    // Whichever of the overlapping two went first stored all of its own; the other 500 fewer.
    const third = answers.slice(2).map((a) => [a.body.stored, a.body.duplicates]);
    expect(third.sort()).toEqual([
      [2_500, 500],
      [3_000, 0],
    ]);
    const counts = await Promise.all(sensors.map(async (s) => (await storedRows(s.sensor.id)).length));
    expect(counts).toEqual([12_000, 8_000, 5_500]);
  });
});

describe("a sensor's series", () => {
  it("answers a window as stored and a long one averaged into buckets", async () => {
    const { sensor, credentials } = await register(lead, { intervalS: 60 });
    const start = Math.floor(daysAgo(4).getTime() / 3_600_000) * 3_600_000;
    const readings = Array.from({ length: 3000 }, (_, i) =>
      reading(new Date(start + i * 60_000), { airTemperatureC: 18 + (i % 2) }),
    );
    await post(credentials.secret, { readings }).expect(200);
    const short = await officer
      .get(
        `/api/sensors/${sensor.id}/readings?from=${new Date(start).toISOString()}&to=${new Date(start + 3_600_000).toISOString()}`,
      )
      .expect(200);
    expect(short.body.bucketS).toBe(0);
    expect(short.body.points).toHaveLength(60);
    const long = await officer
      .get(
        `/api/sensors/${sensor.id}/readings?from=${new Date(start).toISOString()}&to=${new Date(start + 3 * 86_400_000).toISOString()}`,
      )
      .expect(200);
    // 3 days of 1-minute readings would be 4 320 points: averaged into 2 000 buckets of ceil(259 200 / 2 000) s.
    expect(long.body.bucketS).toBe(130);
    const airs = long.body.points.map((p: { airTemperatureC: number }) => p.airTemperatureC);
    expect(airs.length).toBeGreaterThan(1000);
    expect(Math.min(...airs)).toBeGreaterThanOrEqual(18);
    expect(Math.max(...airs)).toBeLessThanOrEqual(19);
    expect(airs.some((a: number) => a !== 18 && a !== 19)).toBe(true);
    await otherLead.get(`/api/sensors/${sensor.id}/readings`).expect(404);
  });
});
