// A case's readings without an outdoor temperature take the weather service's hour (the local fake,
// on a free port): the surface estimate (ISO 13788), the moisture excess and its ISO 13788 class come
// from it, staff are told where the outdoor values came from, and tenants are not.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Property } from "../../server/modules/properties/property.entity.js";
import { startFakeWeather, type FakeWeather } from "../../scripts/lib/fake-weather.js";
import { makeLandlord, makeTenant, makeProperty, PASSWORD } from "../support/factories.js";
import { createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";

let fake: FakeWeather;
let t: TestApp;

beforeAll(async () => {
  fake = await startFakeWeather({ port: 0 });
  t = await createTestApp({ WEATHER_URL: fake.url });
});
afterAll(async () => {
  await t?.close();
  await fake?.close();
});

interface Room {
  readingsCount: number;
  latest: { outdoorTemperatureC: number | null };
  surfaces: {
    element: string;
    result: { surface: { temperatureC: number; relativeHumidityPct: number; state: string; source: string } };
  }[];
  series: { moistureExcess?: { meanGPerM3: number; loadClass: number } } | null;
  outdoor?: { fromWeather: number; place: string | null; note: string } | null;
}

/** A tenant's report about an external wall of their bedroom, with one reading typed in without an outdoor temperature. */
async function caseWithOneReading(tenant: Client) {
  const rooms = (await tenant.get("/api/me/home").expect(200)).body.property.rooms as { id: number; kind: string }[];
  const bedroomId = rooms.find((r) => r.kind === "bedroom")!.id;
  const caseId = (
    await tenant
      .post("/api/cases", {
        description: "Grey mould spots along the outside wall of the bedroom.",
        locations: ["external-wall"],
        observations: ["condensation"],
        roomIds: [bedroomId],
      })
      .expect(201)
  ).body.id as number;
  await tenant
    .post(`/api/cases/${caseId}/readings`, [
      { roomId: bedroomId, takenAt: "2026-01-20T14:20:00Z", airTemperatureC: 20, relativeHumidityPct: 55 },
    ])
    .expect(201);
  await t.ctx.services.readings.whenIdle();
  return caseId;
}

describe("outdoor weather in a case's evaluation", () => {
  it("estimates the wall surface from the weather (ISO 13788) and gives the moisture excess a class, telling staff the source", async () => {
    const landlord = await makeLandlord(t.ctx.dataSource);
    // A solid brick wall at 53.48° N, 2.24° W: the weather is that of the 0.1° cell at (53.5, −2.2).
    await t.ctx.dataSource
      .getRepository(Property)
      .update(landlord.home.id, { wallType: "solid-brick", latitude: 53.48, longitude: -2.24 });
    const tenant = await signedInClient(t.app, landlord.tenant.email, PASSWORD);
    const officer = await signedInClient(t.app, landlord.officer.email, PASSWORD);
    const caseId = await caseWithOneReading(tenant);

    // The fake's hour 2026-01-20T14:00Z at (53.5, −2.2): 7.3 °C and 68 % (asserted, so the arithmetic
    // below rests on it).
    const [hour] = await t.ctx.services.weather.hoursAt(
      53.5,
      -2.2,
      new Date("2026-01-20T14:00:00Z"),
      new Date("2026-01-20T14:00:00Z"),
    );
    expect(hour).toEqual({ at: new Date("2026-01-20T14:00:00Z"), temperatureC: 7.3, relativeHumidityPct: 68 });

    const body = (await officer.get(`/api/cases/${caseId}/evaluation`).expect(200)).body as { rooms: Room[] };
    const [room] = body.rooms;
    expect(room!.latest.outdoorTemperatureC).toBe(7.3);
    expect(room!.outdoor).toEqual({
      fromWeather: 1,
      place: "home",
      note: expect.stringContaining("come from the weather service") as unknown as string,
    });

    // Surface temperature, BS EN ISO 13788 §3 (temperature factor): θsi = θe + fRsi·(θi − θe).
    // A solid brick wall: fRsi = 1 − U·Rsi = 1 − 2.1 × 0.25 = 0.475 (U typical, Rsi 0.25 m²K/W of ISO 13788).
    // θsi = 7.3 + 0.475 × (20 − 7.3) = 7.3 + 0.475 × 12.7 = 7.3 + 6.0325 = 13.3325 °C.
    const wall = room!.surfaces[0]!;
    expect(wall.element).toBe("solid-wall");
    expect(wall.result.surface.source).toBe("estimated");
    expect(wall.result.surface.temperatureC).toBeCloseTo(13.3325, 2);
    // Surface RH = pv / psat(θsi). Saturation pressures over water from the ASHRAE Handbook,
    // Fundamentals 2017, ch. 1, table 3 (interpolated): psat(20 °C) = 2.3389 kPa; psat(13 °C) = 1.4979,
    // psat(14 °C) = 1.5985 kPa → psat(13.3325 °C) ≈ 1.4979 + 0.3325 × 0.1006 = 1.5313 kPa.
    // pv = 0.55 × 2338.9 = 1286.4 Pa → surface RH = 1286.4 / 1531.3 = 84.0 % (≥ 80 %: mould risk).
    expect(wall.result.surface.relativeHumidityPct).toBeCloseTo(84.0, 0);
    expect(wall.result.surface.state).toBe("mould-risk");

    // Moisture excess Δv = v_i − v_e with v = pv / (Rv·T), Rv = 461.52 J/(kg·K) (BS EN ISO 13788 annex A):
    // v_i = 1286.4 / (461.52 × 293.15) = 9.508 g/m³.
    // Outdoors psat(7.3 °C) ≈ 1.0021 + 0.3 × (1.0730 − 1.0021) = 1.0234 kPa (ASHRAE table 3, 7 and 8 °C);
    // pv_e = 0.68 × 1023.4 = 695.9 Pa; v_e = 695.9 / (461.52 × 280.45) = 5.377 g/m³; Δv = 4.131 g/m³.
    // ISO 13788 internal moisture load classes at θe = 7.3 °C: class c's limit is 2c·(1 − 7.3/20) = 1.27c,
    // so class 3 ends at 3.81 and class 4 at 5.08 g/m³: 4.131 is class 4.
    expect(room!.series!.moistureExcess!.meanGPerM3).toBeCloseTo(4.131, 1);
    expect(room!.series!.moistureExcess!.loadClass).toBe(4);

    // The tenant sees the same figures, without the staff note on where the outdoor values came from.
    const mine = (await tenant.get(`/api/cases/${caseId}/evaluation`).expect(200)).body as { rooms: Room[] };
    expect(mine.rooms[0]!.series!.moistureExcess!.loadClass).toBe(4);
    expect(mine.rooms[0]!).not.toHaveProperty("outdoor");
  });

  it("uses the estate's coordinates when the home has none, and says so when neither is known", async () => {
    const landlord = await makeLandlord(t.ctx.dataSource);
    const officer = await signedInClient(t.app, landlord.officer.email, PASSWORD);
    const tenant = await signedInClient(t.app, landlord.tenant.email, PASSWORD);
    const caseId = await caseWithOneReading(tenant);

    const before = (await officer.get(`/api/cases/${caseId}/evaluation`).expect(200)).body as { rooms: Room[] };
    expect(before.rooms[0]!.latest.outdoorTemperatureC).toBeNull();
    expect(before.rooms[0]!.series!.moistureExcess).toBeUndefined();
    expect(before.rooms[0]!.surfaces[0]!.result.surface.source).toBe("air");
    expect(before.rooms[0]!.outdoor).toMatchObject({
      fromWeather: 0,
      place: null,
      note: expect.stringMatching(/no coordinates/),
    });

    await t.ctx.services.weather.setEstateLocation(
      {
        id: landlord.admin.id,
        email: landlord.admin.email,
        name: landlord.admin.name,
        role: "admin",
        organisationId: landlord.org.id,
      },
      { estate: landlord.home.estate, latitude: 53.5, longitude: -2.2 },
    );
    // A new weather place makes the stored evaluation out of date: it is worked out again.
    await officer.get(`/api/cases/${caseId}/evaluation`).expect(200);
    await t.ctx.services.readings.whenIdle();
    const after = (await officer.get(`/api/cases/${caseId}/evaluation`).expect(200)).body as { rooms: Room[] };
    expect(after.rooms[0]!.outdoor).toMatchObject({ fromWeather: 1, place: "estate" });
    expect(after.rooms[0]!.latest.outdoorTemperatureC).toBe(7.3);
    expect(after.rooms[0]!.series!.moistureExcess!.loadClass).toBe(4);

    // Another home of the same landlord on another estate is not affected.
    const elsewhere = await makeProperty(t.ctx.dataSource, landlord.org, { estate: "Far Meadow" });
    const theirTenant = await makeTenant(t.ctx.dataSource, landlord.org, elsewhere);
    const theirs = await caseWithOneReading(await signedInClient(t.app, theirTenant.email, PASSWORD));
    const far = (await officer.get(`/api/cases/${theirs}/evaluation`).expect(200)).body as { rooms: Room[] };
    expect(far.rooms[0]!.outdoor).toMatchObject({ place: null });
  });
});
