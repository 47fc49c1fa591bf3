// A case's evaluation is stored per room and worked out again (on the worker pool) only when its
// readings change through the app, so a case with hundreds of thousands of readings answers from
// the stored result, and the numbers are always those of a full recomputation.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { elementsForReport, evaluateSeries } from "../../src/lib/domain/index.js";
import { makeLandlord, PASSWORD } from "../support/factories.js";
import { createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";
import { daysAgo } from "../support/test-clock.js";

let t: TestApp;
let tenant: Client;
let bedroomId: number;
let kitchenId: number;

// Readings on the hour, from 07:00 UTC 400 days back by the test clock.
const BASE_MS = Math.floor(daysAgo(400).getTime() / 86_400_000) * 86_400_000 + 7 * 3_600_000;
const at = (minutes: number) => new Date(BASE_MS + minutes * 60_000);

beforeAll(async () => {
  t = await createTestApp();
  const landlord = await makeLandlord(t.ctx.dataSource);
  tenant = await signedInClient(t.app, landlord.tenant.email, PASSWORD);
  const rooms = (await tenant.get("/api/me/home")).body.property.rooms as { id: number; kind: string }[];
  bedroomId = rooms.find((r) => r.kind === "bedroom")!.id;
  kitchenId = rooms.find((r) => r.kind !== "bedroom")!.id;
});
afterAll(() => t.close());

const newCase = async (roomIds: number[]) =>
  (
    await tenant
      .post("/api/cases", {
        description: "Black mould behind the wardrobe and the window streams.",
        locations: ["window"],
        observations: ["condensation", "wet-patches"],
        roomIds,
      })
      .expect(201)
  ).body.id as number;

/** The evaluation worked out from scratch from every reading in the database, as the engine does. */
async function fullRecomputation(caseId: number) {
  const c = await t.ctx.services.cases.findById(caseId);
  const elements = elementsForReport(c!.property!, c!.locations);
  const out: Record<number, unknown> = {};
  for (const room of t.ctx.services.cases.roomsOf(c!)) {
    const series = await t.ctx.services.readings.seriesFor(caseId, room.id);
    if (series.length === 0) continue;
    out[room.id] = JSON.parse(JSON.stringify(evaluateSeries({ readings: series, element: elements[0], surfaceWet: true })));
  }
  return out;
}

async function served(caseId: number) {
  // Adding readings starts the recomputation in the background: wait for it to settle.
  await t.ctx.services.readings.whenIdle();
  const body = (await tenant.get(`/api/cases/${caseId}/evaluation`).expect(200)).body as {
    rooms: { roomId: number; readingsCount: number; series: unknown }[];
  };
  return Object.fromEntries(body.rooms.map((r) => [r.roomId, r.series]));
}

/** Multi-row INSERTs straight into the table, as a seed or a restore would (the app is not told). */
async function insertDirectly(caseId: number, roomId: number, fromMinute: number, count: number, stepMinutes: number) {
  for (let start = 0; start < count; start += 10_000) {
    const n = Math.min(10_000, count - start);
    const values: string[] = [];
    for (let i = 0; i < n; i++) {
      const k = start + i;
      const time = at(fromMinute + k * stepMinutes)
        .toISOString()
        .slice(0, 19)
        .replace("T", " ");
      values.push(
        `(${caseId},${roomId},'${time}',${(17 + (k % 50) / 10).toFixed(2)},${55 + (k % 45)},${(9 + (k % 30) / 10).toFixed(2)},NULL,'import',NULL)`,
      );
    }
    await t.ctx.dataSource.query(
      "INSERT INTO readings (case_id, room_id, taken_at, air_temperature_c, relative_humidity_pct, surface_temperature_c, outdoor_temperature_c, source, import_id) VALUES " +
        values.join(","),
    );
  }
}

const hand = (roomId: number, minute: number, rh: number, surface?: number) => ({
  roomId,
  takenAt: at(minute).toISOString(),
  airTemperatureC: 19,
  relativeHumidityPct: rh,
  ...(surface === undefined ? {} : { surfaceTemperatureC: surface }),
});

describe("the stored evaluation of a case", () => {
  it("equals a full recomputation after adds, an earlier reading, an import and a second room", async () => {
    const caseId = await newCase([bedroomId, kitchenId]);
    await tenant
      .post(
        `/api/cases/${caseId}/readings`,
        Array.from({ length: 50 }, (_, i) => hand(bedroomId, i * 60, 60 + (i % 35), 10 + (i % 6))),
      )
      .expect(201);
    expect(await served(caseId)).toEqual(await fullRecomputation(caseId));

    // one more at the end, then one in the middle of the series, then one after a gap
    await tenant.post(`/api/cases/${caseId}/readings`, [hand(bedroomId, 50 * 60, 92, 9)]).expect(201);
    expect(await served(caseId)).toEqual(await fullRecomputation(caseId));
    await tenant.post(`/api/cases/${caseId}/readings`, [hand(bedroomId, 10 * 60 + 30, 95, 8)]).expect(201);
    expect(await served(caseId)).toEqual(await fullRecomputation(caseId));
    await tenant.post(`/api/cases/${caseId}/readings`, [hand(bedroomId, 80 * 60, 70)]).expect(201);
    expect(await served(caseId)).toEqual(await fullRecomputation(caseId));

    // a logger import into the other room
    const rows = ["Timestamp,Temperature (°C),Humidity (%rh)"];
    for (let i = 0; i < 300; i++) rows.push(`${at(i * 10).toISOString()},${(18 + (i % 10) / 10).toFixed(1)},${65 + (i % 30)}`);
    await tenant.agent
      .post(`/api/cases/${caseId}/readings/import`)
      .set("X-CSRF-Token", tenant.csrf)
      .field("roomId", String(kitchenId))
      .attach("file", Buffer.from(rows.join("\n")), "logger.csv")
      .expect(201);
    const after = await served(caseId);
    expect(Object.keys(after)).toHaveLength(2);
    expect(after).toEqual(await fullRecomputation(caseId));
  });

  it("answers a case of 200 000 readings from the stored result, and keeps it up to date when readings are added", async () => {
    const caseId = await newCase([bedroomId]);
    await insertDirectly(caseId, bedroomId, 0, 200_000, 2);
    const first = await tenant.get(`/api/cases/${caseId}/evaluation`).expect(200);
    expect(first.body.rooms[0].readingsCount).toBe(200_000);
    expect(first.body.rooms[0].series).toEqual((await fullRecomputation(caseId))[bedroomId]);

    // Readings written behind the app's back do not show: the evaluation is the stored one, not
    // read again from 200 000 rows on every request.
    await insertDirectly(caseId, bedroomId, 200_000 * 2, 10, 2);
    const stored = await tenant.get(`/api/cases/${caseId}/evaluation`).expect(200);
    expect(stored.body.rooms[0].readingsCount).toBe(200_000);
    expect(stored.body.rooms[0].series).toEqual(first.body.rooms[0].series);

    // A reading added through the app is taken in (with the ten written behind its back), and the
    // numbers are those of a full recomputation.
    await tenant.post(`/api/cases/${caseId}/readings`, [hand(bedroomId, 200_010 * 2, 97, 7)]).expect(201);
    await t.ctx.services.readings.whenIdle();
    const updated = await tenant.get(`/api/cases/${caseId}/evaluation`).expect(200);
    expect(updated.body.rooms[0].readingsCount).toBe(200_011);
    expect(updated.body.rooms[0].series).toEqual((await fullRecomputation(caseId))[bedroomId]);
  }, 120_000);

  it("answers at once from the last stored result while newer readings are taken in, then with the new figures", async () => {
    const caseId = await newCase([bedroomId]);
    await insertDirectly(caseId, bedroomId, 0, 20_000, 2);
    const first = await tenant.get(`/api/cases/${caseId}/evaluation`).expect(200);
    expect(first.body.rooms[0].readingsCount).toBe(20_000);

    // A hundred readings arrive through a writer that marks the room changed but starts no
    // recomputation here (as another instance of the app would).
    await insertDirectly(caseId, bedroomId, 20_000 * 2, 100, 2);
    await t.ctx.dataSource.transaction((m) => t.ctx.services.readings.markChanged(m, caseId, [bedroomId]));

    // The next view does not wait for the recomputation: the stored figures, marked as being updated.
    const during = await tenant.get(`/api/cases/${caseId}/evaluation`).expect(200);
    expect(during.body.rooms[0]).toMatchObject({ readingsCount: 20_000, series: first.body.rooms[0].series });
    expect(during.body.updating).toBe(true);
    expect(during.body.rooms[0].updating).toBe(true);
    expect(typeof during.body.rooms[0].evaluatedAt).toBe("string");

    // Once the recomputation that view started has settled: the new figures, equal to a full recomputation.
    await t.ctx.services.readings.whenIdle();
    const after = await tenant.get(`/api/cases/${caseId}/evaluation`).expect(200);
    expect(after.body.updating).toBe(false);
    expect(after.body.rooms[0]).toMatchObject({ readingsCount: 20_100, updating: false });
    expect(after.body.rooms[0].series).toEqual((await fullRecomputation(caseId))[bedroomId]);
  }, 120_000);
});
