// Outdoor weather for homes: the local fake weather service (deterministic, spoken to through the
// `openmeteo` client) and WeatherService.outdoorHourly — the home's coordinates, else its estate's,
// else nothing; hours stored per 0.1° cell so a repeated read asks the service nothing; forecasts
// fetched again once stale; a failing service leaves what is stored.
import { fetchWeatherApi } from "openmeteo";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { EstateLocation } from "../../server/modules/weather/estate-location.entity.js";
import { fakeOutdoorAir, startFakeWeather, type FakeWeather } from "../../scripts/lib/fake-weather.js";
import { ManualClock, createClockedApp } from "../support/clocked-app.js";
import { makeLandlord, makeOrganisation, makeProperty, PASSWORD } from "../support/factories.js";
import { signedInClient, type Client, type TestApp } from "../support/test-app.js";

const HOUR_MS = 3_600_000;
const hourly = ["temperature_2m", "relative_humidity_2m"];

let fake: FakeWeather;
let t: TestApp;
const clock = new ManualClock();

/** A 0.1° cell of our own in the far south, so no other test file's stored hours are in it. */
let nextCell = Math.floor(Math.random() * 5000);
const freshCell = () => {
  const n = nextCell++;
  return { latitude: -40 - (n % 90) / 10, longitude: 100 + Math.floor(n / 90) / 10 };
};

beforeAll(async () => {
  fake = await startFakeWeather({ port: 0 });
  t = await createClockedApp(clock, { WEATHER_URL: fake.url });
});

afterAll(async () => {
  await t?.close();
  await fake?.close();
});

describe("the fake weather service", () => {
  it("gives the same hours for the same place and dates, whatever its own today is, in FlatBuffers and JSON", async () => {
    const other = await startFakeWeather({ port: 0, now: () => new Date("2031-07-01T12:00:00Z") });
    try {
      const params = { latitude: 53.48, longitude: -2.24, hourly, start_date: "2026-01-14", end_date: "2026-01-15" };
      const [a] = await fetchWeatherApi(fake.url, params);
      const [b] = await fetchWeatherApi(other.url, params);
      const values = (r: typeof a) => [0, 1].map((i) => Array.from(r!.hourly()!.variables(i)!.valuesArray()!));
      expect(values(a)).toEqual(values(b));
      expect(values(a)[0]).toHaveLength(48);
      // The first hour is 2026-01-14T00:00Z.
      expect(Number(a!.hourly()!.time())).toBe(Date.parse("2026-01-14T00:00:00Z") / 1000);
      expect(a!.hourly()!.interval()).toBe(3600);

      const json = await (
        await fetch(
          `${fake.url}?${new URLSearchParams({ ...params, latitude: "53.48", longitude: "-2.24", hourly: hourly.join(",") })}`,
        )
      ).json();
      expect(json.hourly.time[0]).toBe("2026-01-14T00:00");
      expect(json.hourly.temperature_2m).toEqual(values(a)[0]!.map((v) => Math.round(v * 10) / 10));
      expect(json.hourly.relative_humidity_2m).toEqual(values(a)[1]);
    } finally {
      await other.close();
    }
  });

  it("is a plausible UK winter and summer: colder in January than July, colder at night, humidity 30–100 %", () => {
    const at = (iso: string) => fakeOutdoorAir(51.5, -0.1, Date.parse(iso) / HOUR_MS);
    const januaryDays = Array.from(
      { length: 31 },
      (_, d) => at(`2026-01-${String(d + 1).padStart(2, "0")}T14:00:00Z`).temperatureC,
    );
    const julyDays = Array.from({ length: 31 }, (_, d) => at(`2026-07-${String(d + 1).padStart(2, "0")}T14:00:00Z`).temperatureC);
    const mean = (xs: number[]) => xs.reduce((s, x) => s + x, 0) / xs.length;
    // Met Office 1991–2020 averages for southern England (from memory): Jan max ~8 °C, Jul max ~23 °C.
    expect(mean(januaryDays)).toBeGreaterThan(2);
    expect(mean(januaryDays)).toBeLessThan(11);
    expect(mean(julyDays)).toBeGreaterThan(16);
    expect(mean(julyDays)).toBeLessThan(26);
    const nights = Array.from({ length: 31 }, (_, d) => at(`2026-01-${String(d + 1).padStart(2, "0")}T04:00:00Z`).temperatureC);
    expect(mean(nights)).toBeLessThan(mean(januaryDays));
    for (let h = 0; h < 24 * 365; h += 5) {
      const rh = fakeOutdoorAir(55, -3, Date.parse("2026-01-01T00:00:00Z") / HOUR_MS + h).relativeHumidityPct;
      expect(rh).toBeGreaterThanOrEqual(30);
      expect(rh).toBeLessThanOrEqual(100);
    }
  });

  it("counts past_days and forecast_days from its today", async () => {
    const other = await startFakeWeather({ port: 0, now: () => new Date("2026-03-10T15:30:00Z") });
    try {
      const [r] = await fetchWeatherApi(other.url, { latitude: 52, longitude: -1, hourly, past_days: 2, forecast_days: 3 });
      expect(Number(r!.hourly()!.time())).toBe(Date.parse("2026-03-08T00:00:00Z") / 1000);
      expect(Number(r!.hourly()!.timeEnd())).toBe(Date.parse("2026-03-13T00:00:00Z") / 1000);
      expect(r!.hourly()!.variables(0)!.valuesArray()).toHaveLength(5 * 24);
    } finally {
      await other.close();
    }
  });

  it("refuses bad parameters with 400 and a reason", async () => {
    const bad = async (params: Record<string, string>) => {
      const res = await fetch(`${fake.url}?${new URLSearchParams({ hourly: hourly.join(","), ...params })}`);
      expect(res.status).toBe(400);
      const body = await res.json();
      expect(body.error).toBe(true);
      return body.reason as string;
    };
    expect(await bad({ latitude: "91", longitude: "0" })).toMatch(/latitude/);
    expect(await bad({ longitude: "0" })).toMatch(/latitude/);
    expect(await bad({ latitude: "51", longitude: "0", hourly: "snowfall" })).toMatch(/snowfall/);
    expect(await bad({ latitude: "51", longitude: "0", start_date: "2026-02-30", end_date: "2026-03-01" })).toMatch(/start_date/);
    expect(await bad({ latitude: "51", longitude: "0", start_date: "2026-03-02", end_date: "2026-03-01" })).toMatch(/end_date/);
    expect(await bad({ latitude: "51", longitude: "0", start_date: "2026-03-01" })).toMatch(/together/);
    expect(await bad({ latitude: "51", longitude: "0", forecast_days: "17" })).toMatch(/forecast_days/);
    await expect(fetchWeatherApi(fake.url, { latitude: 51, longitude: 200, hourly })).rejects.toThrow(/longitude/);
  });
});

describe("WeatherService.outdoorHourly", () => {
  const from = new Date("2026-01-20T06:00:00Z");
  const to = new Date("2026-01-20T17:30:00Z");

  it("uses the home's coordinates (its 0.1° cell), and asks the service once for repeated reads", async () => {
    const cell = freshCell();
    const org = await makeOrganisation(t.ctx.dataSource);
    // 0.04° off the cell's centre: still the same cell.
    const home = await makeProperty(t.ctx.dataSource, org, { latitude: cell.latitude + 0.04, longitude: cell.longitude - 0.04 });
    const before = fake.requests();
    const hours = await t.ctx.services.weather.outdoorHourly(home.id, from, to);
    expect(fake.requests()).toBe(before + 1);
    // 06:00 … 17:00: twelve whole hours, each the fake's value at the cell's centre.
    expect(hours.map((h) => h.at.toISOString())).toEqual(
      Array.from({ length: 12 }, (_, i) => new Date(from.getTime() + i * HOUR_MS).toISOString()),
    );
    for (const h of hours) {
      expect(h).toEqual({ at: h.at, ...fakeOutdoorAir(cell.latitude, cell.longitude, h.at.getTime() / HOUR_MS) });
    }
    expect(await t.ctx.services.weather.outdoorHourly(home.id, from, to)).toEqual(hours);
    // A part of the same hours, and another home in the same cell: nothing asked either.
    const neighbour = await makeProperty(t.ctx.dataSource, org, { latitude: cell.latitude, longitude: cell.longitude });
    expect(await t.ctx.services.weather.outdoorHourly(neighbour.id, new Date("2026-01-20T09:00:00Z"), to)).toEqual(
      hours.slice(3),
    );
    expect(fake.requests()).toBe(before + 1);
  });

  it("falls back to the estate's coordinates, and is empty when neither is known", async () => {
    const cell = freshCell();
    const org = await makeOrganisation(t.ctx.dataSource);
    const home = await makeProperty(t.ctx.dataSource, org, { estate: "Larch Fields" });
    const stranger = await makeProperty(t.ctx.dataSource, org, { estate: "Nowhere Close" });
    expect(await t.ctx.services.weather.outdoorHourly(home.id, from, to)).toEqual([]);
    await t.ctx.dataSource.getRepository(EstateLocation).save({
      organisationId: org.id,
      estate: "Larch Fields",
      latitude: cell.latitude,
      longitude: cell.longitude,
      updatedAt: clock.now(),
    });
    const { place, hours } = await t.ctx.services.weather.outdoor(home.id, from, to);
    expect(place).toEqual({ source: "estate", ...cell });
    expect(hours).toHaveLength(12);
    expect(hours[0]).toEqual({ at: from, ...fakeOutdoorAir(cell.latitude, cell.longitude, from.getTime() / HOUR_MS) });
    expect(await t.ctx.services.weather.outdoorHourly(stranger.id, from, to)).toEqual([]);
    // Another landlord's estate of the same name is not this one.
    const otherOrg = await makeOrganisation(t.ctx.dataSource);
    const theirs = await makeProperty(t.ctx.dataSource, otherOrg, { estate: "Larch Fields" });
    expect(await t.ctx.services.weather.outdoorHourly(theirs.id, from, to)).toEqual([]);
  });

  it("fetches forecast hours again once they are over 3 hours old, not before", async () => {
    const cell = freshCell();
    const org = await makeOrganisation(t.ctx.dataSource);
    const home = await makeProperty(t.ctx.dataSource, org, cell);
    const start = new Date(Math.ceil(clock.now().getTime() / HOUR_MS) * HOUR_MS + 5 * HOUR_MS);
    const end = new Date(start.getTime() + 24 * HOUR_MS);
    const before = fake.requests();
    expect(await t.ctx.services.weather.outdoorHourly(home.id, start, end)).toHaveLength(25);
    clock.advance(2 * HOUR_MS);
    await t.ctx.services.weather.outdoorHourly(home.id, start, end);
    expect(fake.requests()).toBe(before + 1);
    clock.advance(1.5 * HOUR_MS);
    expect(await t.ctx.services.weather.outdoorHourly(home.id, start, end)).toHaveLength(25);
    expect(fake.requests()).toBe(before + 2);
  });

  it("returns what is stored when the service fails", async () => {
    const cell = freshCell();
    const org = await makeOrganisation(t.ctx.dataSource);
    const home = await makeProperty(t.ctx.dataSource, org, cell);
    expect(await t.ctx.services.weather.outdoorHourly(home.id, from, to)).toHaveLength(12);
    // Whole days are fetched: 06:00 … 23:00 of the 20th are stored now.
    const before = fake.requests();
    const stored = await t.ctx.services.weather.outdoorHourly(home.id, from, new Date("2026-01-20T23:59:00Z"));
    expect(stored).toHaveLength(18);
    expect(fake.requests()).toBe(before);
    const down = await createClockedApp(clock, { WEATHER_URL: "http://127.0.0.1:9/v1/forecast", WEATHER_TIMEOUT_MS: "500" });
    try {
      // Hours of the 21st are asked for, the call fails, the stored hours come back.
      const later = new Date(to.getTime() + 24 * HOUR_MS);
      expect(await down.ctx.services.weather.outdoorHourly(home.id, from, later)).toEqual(stored);
    } finally {
      await down.close();
    }
  });
});

describe("where homes and estates are", () => {
  it("admins set an estate's coordinates (one of their own estates, in the UK); staff read them; others may not", async () => {
    const landlord = await makeLandlord(t.ctx.dataSource);
    const admin = await signedInClient(t.app, landlord.admin.email, PASSWORD);
    const officer = await signedInClient(t.app, landlord.officer.email, PASSWORD);
    const put = (c: Client, body: object) => c.agent.put("/api/estate-locations").set("X-CSRF-Token", c.csrf).send(body);
    const estate = landlord.home.estate;

    expect((await officer.get("/api/estate-locations").expect(200)).body.items).toEqual([
      { estate, latitude: null, longitude: null, updatedAt: null },
    ]);
    await put(officer, { estate, latitude: 53.5, longitude: -2.2 }).expect(403);
    const unknown = await put(admin, { estate: "Somebody Else's Estate", latitude: 53.5, longitude: -2.2 }).expect(400);
    expect(unknown.body.error.message).toMatch(/None of your homes/);
    await put(admin, { estate, latitude: 71, longitude: -2.2 }).expect(400);
    await put(admin, { estate, latitude: 53.5 }).expect(400);
    expect((await officer.get("/api/estate-locations").expect(200)).body.items).toEqual([
      { estate, latitude: null, longitude: null, updatedAt: null },
    ]);

    await put(admin, { estate, latitude: 53.5, longitude: -2.2 }).expect(200);
    const changed = await put(admin, { estate, latitude: 53.51234, longitude: -2.21 }).expect(200);
    expect(changed.body).toEqual({ estate, latitude: 53.51234, longitude: -2.21, updatedAt: clock.now().toISOString() });
    expect((await officer.get("/api/estate-locations").expect(200)).body.items).toEqual([changed.body]);
    expect(await t.ctx.services.weather.placeOf(landlord.home.id)).toEqual({
      source: "estate",
      latitude: 53.51234,
      longitude: -2.21,
    });

    // Another landlord's estate of the same name keeps no location.
    const other = await makeLandlord(t.ctx.dataSource);
    const otherOfficer = await signedInClient(t.app, other.officer.email, PASSWORD);
    expect((await otherOfficer.get("/api/estate-locations").expect(200)).body.items[0].latitude).toBeNull();
  });

  it("admins give a home its own coordinates, which come before its estate's", async () => {
    const landlord = await makeLandlord(t.ctx.dataSource);
    const admin = await signedInClient(t.app, landlord.admin.email, PASSWORD);
    await admin.patch(`/api/properties/${landlord.home.id}`, { latitude: 95, longitude: 0 }).expect(400);
    const home = await admin.patch(`/api/properties/${landlord.home.id}`, { latitude: 52.2052, longitude: 0.1218 }).expect(200);
    expect(home.body).toMatchObject({ latitude: 52.2052, longitude: 0.1218 });
    expect(await t.ctx.services.weather.placeOf(landlord.home.id)).toEqual({
      source: "home",
      latitude: 52.2052,
      longitude: 0.1218,
    });
    // Cleared: the estate's location again (none here).
    await admin.patch(`/api/properties/${landlord.home.id}`, { latitude: null, longitude: null }).expect(200);
    expect(await t.ctx.services.weather.placeOf(landlord.home.id)).toBeNull();
  });
});
