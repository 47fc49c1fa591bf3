// The public risk-engine API: validation of every field, the response shapes, limits and the OpenAPI document.
import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createTestApp, type TestApp } from "../support/test-app.js";

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

const evaluate = (body: unknown) =>
  request(t.app)
    .post("/api/psychrometrics/evaluate")
    .send(body as object);
const series = (body: unknown) =>
  request(t.app)
    .post("/api/psychrometrics/series")
    .send(body as object);
const ok = { airTemperatureC: 20, relativeHumidityPct: 60 };

describe("POST /api/psychrometrics/evaluate", () => {
  it("answers without sign-in or CSRF token, with the documented shape", async () => {
    const res = await evaluate({ airTemperatureC: 19, relativeHumidityPct: 78, surfaceTemperatureC: 9 }).expect(200);
    expect(Object.keys(res.body).sort()).toEqual(
      [
        "absoluteHumidityGPerM3",
        "dewPointC",
        "humidityRatio",
        "reasons",
        "saturationVapourPressurePa",
        "surface",
        "vapourPressurePa",
      ].sort(),
    );
    // 19 °C / 78 % → dew point 15.077 °C by the Magnus form of Alduchov & Eskridge (1996), derived:
    // γ = ln 0.78 + 17.625·19/(243.04+19) = 1.02949; Td = 243.04·γ/(17.625−γ) = 15.077 °C.
    expect(Math.abs(res.body.dewPointC - 15.077)).toBeLessThan(0.05);
    expect(res.body.surface).toMatchObject({ temperatureC: 9, source: "measured", state: "condensing" });
    expect(res.body.reasons.length).toBeGreaterThan(0);
  });

  it("estimates the surface from an element and outdoor temperature, else takes air temperature and says so", async () => {
    const est = await evaluate({ ...ok, outdoorTemperatureC: 0, element: "single-glazing" }).expect(200);
    expect(est.body.surface.source).toBe("estimated");
    expect(est.body.surface.temperatureC).toBeLessThan(10);
    expect(est.body.surface.temperatureFactor).toBeGreaterThan(0);
    const air = await evaluate(ok).expect(200);
    expect(air.body.surface).toMatchObject({ source: "air", temperatureC: 20 });
    expect(air.body.reasons.join(" ")).toMatch(/air temperature/i);
  });

  const bad: [string, object, string][] = [
    ["missing air temperature", { relativeHumidityPct: 50 }, "airTemperatureC"],
    ["missing humidity", { airTemperatureC: 20 }, "relativeHumidityPct"],
    ["air temperature as a string", { airTemperatureC: "20", relativeHumidityPct: 50 }, "airTemperatureC"],
    ["humidity as a string", { airTemperatureC: 20, relativeHumidityPct: "NaN" }, "relativeHumidityPct"],
    ["air temperature null", { airTemperatureC: null, relativeHumidityPct: 50 }, "airTemperatureC"],
    ["RH 0", { airTemperatureC: 20, relativeHumidityPct: 0 }, "relativeHumidityPct"],
    ["RH 101", { airTemperatureC: 20, relativeHumidityPct: 101 }, "relativeHumidityPct"],
    ["RH negative", { airTemperatureC: 20, relativeHumidityPct: -5 }, "relativeHumidityPct"],
    ["air −20.1 °C", { airTemperatureC: -20.1, relativeHumidityPct: 50 }, "airTemperatureC"],
    ["air 50.1 °C", { airTemperatureC: 50.1, relativeHumidityPct: 50 }, "airTemperatureC"],
    ["surface −30.1 °C", { ...ok, surfaceTemperatureC: -30.1 }, "surfaceTemperatureC"],
    ["surface 50.1 °C", { ...ok, surfaceTemperatureC: 50.1 }, "surfaceTemperatureC"],
    ["outdoor −30.1 °C", { ...ok, outdoorTemperatureC: -30.1 }, "outdoorTemperatureC"],
    ["outdoor 40.1 °C", { ...ok, outdoorTemperatureC: 40.1 }, "outdoorTemperatureC"],
    ["unknown element", { ...ok, outdoorTemperatureC: 0, element: "paper-wall" }, "element"],
    ["pressure as a string", { ...ok, pressurePa: "high" }, "pressurePa"],
  ];
  for (const [name, body, field] of bad) {
    it(`refuses ${name} with 400 naming ${field}`, async () => {
      const res = await evaluate(body).expect(400);
      expect(res.body.error.code).toBe("validation_failed");
      expect(res.body.error.message).toContain(field);
      expect(res.body.error.details[0].field).toBe(field);
    });
  }

  it("accepts the edges of each range", async () => {
    await evaluate({ airTemperatureC: -20, relativeHumidityPct: 100, surfaceTemperatureC: -30, outdoorTemperatureC: -30 }).expect(
      200,
    );
    await evaluate({ airTemperatureC: 50, relativeHumidityPct: 0.1, surfaceTemperatureC: 50, outdoorTemperatureC: 40 }).expect(
      200,
    );
  });

  it("refuses a literal NaN (not JSON) with 400", async () => {
    const res = await request(t.app)
      .post("/api/psychrometrics/evaluate")
      .set("Content-Type", "application/json")
      .send('{"airTemperatureC": NaN, "relativeHumidityPct": 50}')
      .expect(400);
    expect(res.body.error.code).toBe("invalid_json");
  });
});

const hourly = (n: number, at0 = Date.UTC(2026, 0, 1)) =>
  Array.from({ length: n }, (_, i) => ({
    at: new Date(at0 + i * 3_600_000).toISOString(),
    airTemperatureC: 18,
    relativeHumidityPct: 70,
    surfaceTemperatureC: 12,
  }));

describe("POST /api/psychrometrics/series", () => {
  it("refuses a body that is not JSON with 400 (it is read on the worker pool, not the request thread)", async () => {
    const res = await request(t.app)
      .post("/api/psychrometrics/series")
      .set("Content-Type", "application/json")
      .send('{"readings": [{"at": "2026-01-01T00:00:00Z", "airTemperatureC": NaN}]}')
      .expect(400);
    expect(res.body.error.code).toBe("invalid_json");
  });

  it("evaluates a series with the documented shape", async () => {
    const readings = hourly(48);
    const res = await series({ readings, material: "sensitive" }).expect(200);
    expect(res.body).toMatchObject({
      count: 48,
      from: readings[0]!.at,
      to: readings[47]!.at,
      gaps: [],
      mouldIndex: { material: "sensitive" },
    });
    expect(res.body.hoursSurfaceRhAtLeast80).toBeGreaterThan(40);
    expect(typeof res.body.diagnosis.kind).toBe("string");
    expect(res.body).not.toHaveProperty("moistureExcess");
  });

  it("reports a gap of more than 3 hours", async () => {
    const readings = [...hourly(5), ...hourly(5, Date.UTC(2026, 0, 2))];
    const res = await series({ readings }).expect(200);
    expect(res.body.gaps).toEqual([{ from: readings[4]!.at, to: readings[5]!.at }]);
  });

  it("refuses 10 001 readings from an anonymous caller with 413 and accepts 10 000", async () => {
    const res = await series({ readings: hourly(10_001) }).expect(413);
    expect(res.body.error.message).toMatch(/at most 10,000/);
    await series({ readings: hourly(10_000) }).expect(200);
  }, 60_000);

  const bad: [string, object, string][] = [
    ["no readings field", {}, "readings"],
    ["an empty list", { readings: [] }, "readings"],
    ["readings not a list", { readings: "lots" }, "readings"],
    ["a reading without a time", { readings: [{ airTemperatureC: 20, relativeHumidityPct: 50 }] }, "readings.0.at"],
    [
      "a time without a zone",
      { readings: [{ at: "2026-01-01T00:00:00", airTemperatureC: 20, relativeHumidityPct: 50 }] },
      "readings.0.at",
    ],
    [
      "a string temperature",
      { readings: [{ at: "2026-01-01T00:00:00Z", airTemperatureC: "warm", relativeHumidityPct: 50 }] },
      "readings.0.airTemperatureC",
    ],
    [
      "RH 101 in the second reading",
      { readings: [hourly(1)[0], { at: "2026-01-01T01:00:00Z", airTemperatureC: 20, relativeHumidityPct: 101 }] },
      "readings.1.relativeHumidityPct",
    ],
    ["an unknown material", { readings: hourly(1), material: "steel" }, "material"],
  ];
  for (const [name, body, field] of bad) {
    it(`refuses ${name} with 400 naming ${field}`, async () => {
      const res = await series(body).expect(400);
      expect(res.body.error.details[0].field).toBe(field);
    });
  }
});

describe("limits and documentation", () => {
  it("limits each address to 120 calculations a minute", async () => {
    const fresh = await createTestApp();
    try {
      for (let i = 0; i < 120; i++) await request(fresh.app).post("/api/psychrometrics/evaluate").send(ok).expect(200);
      const res = await request(fresh.app).post("/api/psychrometrics/evaluate").send(ok).expect(429);
      expect(Number(res.headers["retry-after"])).toBeGreaterThan(0);
    } finally {
      await fresh.close();
    }
  });

  it("serves an OpenAPI 3.1 document describing both routes", async () => {
    const res = await request(t.app).get("/api/psychrometrics/openapi.json").expect(200);
    expect(res.body.openapi).toBe("3.1.0");
    const evaluateBody = res.body.paths["/api/psychrometrics/evaluate"].post.requestBody.content["application/json"].schema;
    expect(evaluateBody.required).toEqual(expect.arrayContaining(["airTemperatureC", "relativeHumidityPct"]));
    expect(evaluateBody.properties.airTemperatureC).toMatchObject({ minimum: -20, maximum: 50 });
    expect(res.body.paths["/api/psychrometrics/series"].post.responses).toHaveProperty("413");
  });
});
