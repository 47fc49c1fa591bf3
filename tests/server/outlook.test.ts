// The three-day condensation outlook over the real app: the forecast from the local fake weather
// service, a room's indoor figures from its case's readings (else our stated assumption), each hour's
// surface figures checked against ISO 13788 worked in the test, and who may read which home's outlook.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Property } from "../../server/modules/properties/property.entity.js";
import { Tenancy } from "../../server/modules/tenancies/tenancy.entity.js";
import { startFakeWeather, fakeOutdoorAir, type FakeWeather } from "../../scripts/lib/fake-weather.js";
import type { OutlookResponse } from "../../src/lib/contracts/outlook.js";
import { outlookResponse } from "../../src/lib/contracts/outlook.js";
import { makeLandlord, makeProperty, makeTenant, PASSWORD } from "../support/factories.js";
import { createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";
import { hoursAgo, testClock } from "../support/test-clock.js";

// ISO 13788:2012 by hand:
//   θsi = θe + fRsi·(θi − θe)                          surface temperature from the temperature factor
//   psat(θ) = 610.5·exp(17.269·θ/(237.3 + θ)), θ ≥ 0   (over ice below 0: 610.5·exp(21.875·θ/(265.5 + θ)))
//   φsi = pi/psat(θsi), pi = φi·psat(θi)
// The engine uses ASHRAE's saturation pressure (psychrolib): within 1 % of ISO's in this range.
const isoPsat = (t: number) =>
  t >= 0 ? 610.5 * Math.exp((17.269 * t) / (237.3 + t)) : 610.5 * Math.exp((21.875 * t) / (265.5 + t));
// The factories' home is solid brick with single glazing: the coldest surface is the glass,
// fRsi = 1 − U·Rsi = 1 − 5.7 × 0.13 = 0.259 (below the corner's 0.40 and the wall's 0.475).
const SINGLE_GLAZING_FRSI = 1 - 5.7 * 0.13;
const LATITUDE = 51.45;
const LONGITUDE = -2.6;

let t: TestApp;
let weather: FakeWeather;
let landlord: Awaited<ReturnType<typeof makeLandlord>>;
let other: Awaited<ReturnType<typeof makeLandlord>>;
let tenant: Client;
let neighbour: Client;
let officer: Client;
let otherOfficer: Client;
let formerTenant: Client;
let neighbourHomeId: number;

beforeAll(async () => {
  weather = await startFakeWeather({ port: 0, now: () => testClock.now() });
  t = await createTestApp({ WEATHER_URL: weather.url });
  const ds = t.ctx.dataSource;
  landlord = await makeLandlord(ds);
  other = await makeLandlord(ds);
  await ds.getRepository(Property).update(landlord.home.id, { latitude: LATITUDE, longitude: LONGITUDE });
  // Another home of the same landlord, with no location on record (neither the home's nor its estate's).
  const neighbourHome = await makeProperty(ds, landlord.org, { estate: `Nowhere ${landlord.org.id}` });
  neighbourHomeId = neighbourHome.id;
  const neighbourUser = await makeTenant(ds, landlord.org, neighbourHome);
  // Someone whose tenancy of the first home has ended.
  const former = await makeTenant(ds, landlord.org, neighbourHome);
  await ds.getRepository(Tenancy).update({ tenantUserId: former.id }, { propertyId: landlord.home.id, endDate: "2025-01-31" });

  tenant = await signedInClient(t.app, landlord.tenant.email, PASSWORD);
  neighbour = await signedInClient(t.app, neighbourUser.email, PASSWORD);
  formerTenant = await signedInClient(t.app, former.email, PASSWORD);
  officer = await signedInClient(t.app, landlord.officer.email, PASSWORD);
  otherOfficer = await signedInClient(t.app, other.officer.email, PASSWORD);
});
afterAll(async () => {
  await t?.close();
  await weather?.close();
});

describe("the condensation outlook", () => {
  it("gives the tenant their own home's three days, worked out by ISO 13788 from the forecast", async () => {
    const home = (await tenant.get("/api/me/home").expect(200)).body.property;
    const bedroom = home.rooms.find((r: { name: string }) => r.name === "Bedroom");
    // A case reading in the bedroom two hours ago: 20 °C and 65 %.
    const caseId = (
      await tenant
        .post("/api/cases", {
          description: "Water runs down the bedroom window every morning.",
          locations: ["window"],
          observations: ["condensation"],
          roomIds: [bedroom.id],
        })
        .expect(201)
    ).body.id;
    await officer
      .post(`/api/cases/${caseId}/readings`, [
        { roomId: bedroom.id, takenAt: hoursAgo(2).toISOString(), airTemperatureC: 20, relativeHumidityPct: 65 },
      ])
      .expect(201);

    const res = await tenant.get("/api/me/outlook").expect(200);
    const outlook: OutlookResponse = outlookResponse.parse(res.body);
    expect(outlook, "the reply is exactly a contract value").toEqual(res.body);
    expect(outlook.propertyId).toBe(home.id);
    expect(outlook.forecastAvailable).toBe(true);
    expect(outlook.surface).toMatchObject({ elementId: "single-glazing" });
    expect(outlook.surface.fRsi).toBeCloseTo(SINGLE_GLAZING_FRSI, 3);

    // Today and the next two London days, each a day after the one before.
    expect(outlook.dates).toHaveLength(3);
    expect(outlook.dates[0]).toBe(new Intl.DateTimeFormat("en-CA", { timeZone: "Europe/London" }).format(testClock.now()));
    for (let i = 1; i < 3; i++) {
      expect(Date.parse(outlook.dates[i]!) - Date.parse(outlook.dates[i - 1]!)).toBe(86_400_000);
    }

    const room = outlook.rooms.find((r) => r.roomId === bedroom.id)!;
    expect(room.indoor).toMatchObject({ airTemperatureC: 20, relativeHumidityPct: 65, source: "case-readings" });
    // From the current hour to the end of the third day: at least two whole days of hours.
    expect(room.hours.length).toBeGreaterThanOrEqual(48);
    expect(room.hours.length).toBeLessThanOrEqual(72);
    expect(Date.parse(room.hours[0]!.at)).toBe(Math.floor(testClock.now().getTime() / 3_600_000) * 3_600_000);
    expect(room.days.reduce((n, d) => n + d.hours, 0)).toBe(room.hours.length);

    const pi = 0.65 * isoPsat(20);
    for (const h of room.hours) {
      // The outdoor air is the fake's for this place and hour (stored as float32, then to 0.1 °C).
      const fake = fakeOutdoorAir(LATITUDE, LONGITUDE, Date.parse(h.at) / 3_600_000);
      expect(Math.abs(h.outdoorTemperatureC - fake.temperatureC)).toBeLessThan(0.11);
      // θsi = θe + 0.259·(20 − θe), e.g. θe = 5 °C → 5 + 0.259 × 15 = 8.9 °C
      const surface = h.outdoorTemperatureC + SINGLE_GLAZING_FRSI * (20 - h.outdoorTemperatureC);
      expect(Math.abs(h.surfaceTemperatureC - surface)).toBeLessThan(0.06);
      expect(h.surfaceRelativeHumidityPct / ((100 * pi) / isoPsat(surface))).toBeCloseTo(1, 1);
    }
    // The per-day counts are the hours' (≥ 80 % and ≥ 100 % surface humidity), and the level says them in our words.
    for (const day of room.days) {
      const hours = room.hours.filter(
        (h) => new Intl.DateTimeFormat("en-CA", { timeZone: "Europe/London" }).format(new Date(h.at)) === day.date,
      );
      expect(day.hours).toBe(hours.length);
      expect(day.hoursAtOrAbove80).toBe(hours.filter((h) => h.surfaceRelativeHumidityPct >= 80).length);
      expect(day.condensingHours).toBe(hours.filter((h) => h.surfaceRelativeHumidityPct >= 100).length);
      const expected =
        day.hours === 0
          ? null
          : day.condensingHours >= 2
            ? "likely"
            : day.condensingHours > 0 || day.hoursAtOrAbove80 >= 4
              ? "possible"
              : "unlikely";
      expect(day.level).toBe(expected);
    }

    // The kitchen has no readings: our stated assumption (18 °C in October to April, else 20 °C; 60 %).
    const kitchen = outlook.rooms.find((r) => r.name === "Kitchen")!;
    const month = Number(outlook.dates[0]!.slice(5, 7));
    expect(kitchen.indoor).toEqual({
      airTemperatureC: month >= 10 || month <= 4 ? 18 : 20,
      relativeHumidityPct: 60,
      source: "assumed",
      takenAt: null,
    });

    // Cautions always; nothing about the tenant's way of life.
    expect(outlook.cautions.map((c) => c.id)).toEqual(
      expect.arrayContaining(["report-damp", "no-cooker-heating", "keep-vents-clear", "health-advice"]),
    );
    expect(JSON.stringify(outlook)).not.toMatch(/lifestyle/i);

    // Staff of the landlord read the same home's outlook.
    const staff = outlookResponse.parse((await officer.get(`/api/properties/${home.id}/outlook`).expect(200)).body);
    expect(staff.rooms.find((r) => r.roomId === bedroom.id)!.days).toEqual(room.days);
  });

  it("asks the weather service once for repeated reads (its stored hours serve the next)", async () => {
    await tenant.get("/api/me/outlook").expect(200);
    const before = weather.requests();
    await tenant.get("/api/me/outlook").expect(200);
    expect(weather.requests()).toBe(before);
  });

  it("says so when a home has no location, and still gives the tips and cautions", async () => {
    const res = await neighbour.get("/api/me/outlook").expect(200);
    const outlook = outlookResponse.parse(res.body);
    expect(outlook.propertyId).toBe(neighbourHomeId);
    expect(outlook.forecastAvailable).toBe(false);
    expect(outlook.rooms.every((r) => r.hours.length === 0 && r.days.every((d) => d.level === null))).toBe(true);
    expect(outlook.tips.map((x) => x.id)).toEqual(["trickle-vents", "extract-fans"]);
    expect(outlook.cautions.length).toBeGreaterThanOrEqual(4);
  });

  it("shows each person only homes that are theirs to see", async () => {
    // Another tenant of the same landlord gets their own home, never the first one; the staff route is not theirs.
    expect((await neighbour.get("/api/me/outlook").expect(200)).body.propertyId).not.toBe(landlord.home.id);
    await neighbour.get(`/api/properties/${landlord.home.id}/outlook`).expect(403);
    await tenant.get(`/api/properties/${landlord.home.id}/outlook`).expect(403);
    // A tenancy that has ended opens no home.
    await formerTenant.get("/api/me/outlook").expect(404);
    // Staff of another landlord cannot tell the home exists.
    await otherOfficer.get(`/api/properties/${landlord.home.id}/outlook`).expect(404);
    await officer.get(`/api/properties/999999999/outlook`).expect(404);
    await officer.get(`/api/properties/abc/outlook`).expect(400);
  });

  it("takes a room's indoor figures from its sensors' last day, before any case reading", async () => {
    const home = (await tenant.get("/api/me/home").expect(200)).body.property;
    const kitchen = home.rooms.find((r: { name: string }) => r.name === "Kitchen");
    const ds = t.ctx.dataSource;
    const { insertId } = (await ds.query(
      `INSERT INTO sensors (organisation_id, property_id, room_id, serial, model, placement, installed_on, mqtt_username)
       VALUES (?, ?, ?, 'OUTLOOK-1', 'TH-1', 'kitchen wall', '2025-01-01', 'outlook-1')`,
      [landlord.org.id, home.id, kitchen.id],
    )) as { insertId: number };
    // Two readings within the last day (mean 20 °C, 72 %) and one 30 hours ago that must not count.
    const newest = new Date(Math.floor(hoursAgo(1).getTime() / 1000) * 1000);
    for (const [at, air, rh] of [
      [hoursAgo(30), 10, 95],
      [hoursAgo(5), 19, 70],
      [newest, 21, 74],
    ] as const) {
      await ds.query(
        `INSERT INTO sensor_readings (sensor_id, taken_at, air_temperature_c, relative_humidity_pct, received_at) VALUES (?, ?, ?, ?, ?)`,
        [insertId, new Date(Math.floor(at.getTime() / 1000) * 1000), air, rh, at],
      );
    }
    const outlook = outlookResponse.parse((await tenant.get("/api/me/outlook").expect(200)).body);
    const room = outlook.rooms.find((r) => r.roomId === kitchen.id)!;
    expect(room.indoor).toEqual({
      airTemperatureC: 20,
      relativeHumidityPct: 72,
      source: "sensor",
      takenAt: newest.toISOString(),
    });
  });
});
