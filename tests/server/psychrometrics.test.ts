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
        "frostPointC",
        "humidityRatio",
        "reasonIds",
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
    expect(res.body.frostPointC).toBeNull(); // dew point above 0 °C: no frost point
    expect(res.body.reasons.length).toBeGreaterThan(0);
  });

  it("below 0 °C answers the dew point over water and the frost point over ice, and judges the surface over ice", async () => {
    // Conventions: RH over water at any temperature (WMO-No. 8 Annex 4.B); a surface below 0 °C against
    // saturation over ice (ISO 13788). Worked by hand from WMO-No. 8's formulas, tolerance 0.02 K:
    // pv = 0.8 × 6.112·exp(17.62·−5/238.12) hPa = 337.75 Pa; g = ln(337.75/611.2) = −0.59311;
    // dew point 243.12·g/(17.62 − g) = −7.917 °C; frost point 272.62·g/(22.46 − g) = −7.014 °C.
    const res = await evaluate({ airTemperatureC: -5, relativeHumidityPct: 80, surfaceTemperatureC: -7.3 }).expect(200);
    expect(Math.abs(res.body.dewPointC - -7.917)).toBeLessThan(0.02);
    expect(Math.abs(res.body.frostPointC - -7.014)).toBeLessThan(0.02);
    // −7.3 °C is above the dew point but below the frost point: frost forms (102.4 % over ice, ASHRAE eq. 5).
    expect(res.body.surface.state).toBe("condensing");
    expect(res.body.surface.relativeHumidityPct).toBeCloseTo(102.4, 1);
    expect(res.body.reasons.join(" ")).toMatch(/frost point of -7\.0 °C, so frost forms/);
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
    // The reply's dew point and frost point are documented with their conventions.
    const point = res.body.paths["/api/psychrometrics/evaluate"].post.responses["200"].content["application/json"].schema;
    expect(point.required).toEqual(expect.arrayContaining(["dewPointC", "frostPointC"]));
    expect(point.properties.dewPointC.description).toMatch(/over liquid water/);
    expect(point.properties.frostPointC).toMatchObject({ type: ["number", "null"] });
  });
});
