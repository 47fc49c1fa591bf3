import { describe, expect, it } from "vitest";
import { diagnose, evaluateSeries } from "../../src/lib/domain/index.js";
import type { DiagnosisFacts, SeriesInput, SeriesReading } from "../../src/lib/domain/index.js";

const H = 3_600_000;
const T0 = Date.UTC(2025, 0, 6);
const allReasons: string[] = [];

/** Three days of hourly readings (72 h covered) under constant conditions. */
function threeDays(conditions: Omit<SeriesReading, "at">, hours = 73): SeriesReading[] {
  return Array.from({ length: hours }, (_, h) => ({ at: new Date(T0 + h * H).toISOString(), ...conditions }));
}

function run(input: SeriesInput) {
  const r = evaluateSeries(input);
  allReasons.push(...r.diagnosis.reasons);
  return r.diagnosis;
}

// Rules: TRADE.md §2 (high moisture excess → load or ventilation; low excess with a cold surface →
// the surface) and §6 (a wet surface that is not cold and wet from condensation suggests a leak,
// penetrating or rising damp: common practice, no source). Thresholds marked "ours" are our own.
describe("diagnosis from a series", () => {
  it("insufficient-data under 24 hours of readings (our own minimum)", () => {
    const d = run({ readings: threeDays({ airTemperatureC: 20, relativeHumidityPct: 90 }, 10), surfaceWet: true });
    expect(d.kind).toBe("insufficient-data");
    expect(d.reasons[0]).toMatch(/cover 9\.0 hours/);
  });

  it("no-risk-found: 20 °C / 45 % air, surface 18 °C", () => {
    // Surface RH = 0.45 × 2338.80/2064.29 = 51.0 % (ASHRAE eq. 6 via psychrolib): under 80 % (ISO 13788).
    const d = run({ readings: threeDays({ airTemperatureC: 20, relativeHumidityPct: 45, surfaceTemperatureC: 18 }) });
    expect(d.kind).toBe("no-risk-found");
    expect(d.reasons[0]).toMatch(/51 %/);
  });

  it("likely-not-condensation: the surface is wet but the air is dry for it", () => {
    // Same readings as above, with dampness seen: surface RH 51 % cannot condense (needs 100 %).
    const d = run({
      readings: threeDays({ airTemperatureC: 20, relativeHumidityPct: 45, surfaceTemperatureC: 18 }),
      surfaceWet: true,
    });
    expect(d.kind).toBe("likely-not-condensation");
    expect(d.reasons.join(" ")).toMatch(/leak, or penetrating or rising damp/);
    expect(d.reasons.join(" ")).toMatch(/survey/);
  });

  it("ventilation-or-moisture-load: high moisture excess (class 4), sound surface", () => {
    // By hand (ideal gas; psat via psychrolib; Rv 461.523): inside 20 °C / 70 % → 12.1006 g/m³;
    // outside 0 °C, RH assumed 85 % (common practice, no source) → 4.1207 g/m³; excess 7.980 g/m³,
    // class 4 at 0 °C (boundaries 2, 4, 6, 8 — ISO 13788, from memory).
    // Surface 16 °C: RH = 1637.16/1818.44 = 90.0 % ≥ 80 %; fRsi = 16/20 = 0.80 ≥ 0.75 (BRE IP 1/06).
    const d = run({
      readings: threeDays({ airTemperatureC: 20, relativeHumidityPct: 70, surfaceTemperatureC: 16, outdoorTemperatureC: 0 }),
    });
    expect(d.kind).toBe("ventilation-or-moisture-load");
    const text = d.reasons.join(" ");
    expect(text).toMatch(/8\.0 g\/m³ more water/);
    expect(text).toMatch(/class 4 of 5/);
    expect(text).toMatch(/Moisture in the air is high for the ventilation the room has/);
    expect(text).toMatch(/Outdoor humidity was not measured; it was taken as 85 %/);
    expect(text).toMatch(/at 80 % relative humidity or more for 72 hours and never at the dew point/);
  });

  it("cold-surface: usual moisture excess (class 3), surface factor under 0.75", () => {
    // Inside 20 °C / 50 % → 8.6433 g/m³; outside 0 °C / 85 % (assumed) → 4.1207; excess 4.523 → class 3.
    // Surface 8 °C: RH 109 % (condensing); fRsi = 8/20 = 0.40 < 0.75 (BRE IP 1/06).
    const d = run({
      readings: threeDays({ airTemperatureC: 20, relativeHumidityPct: 50, surfaceTemperatureC: 8, outdoorTemperatureC: 0 }),
    });
    expect(d.kind).toBe("cold-surface");
    const text = d.reasons.join(" ");
    expect(text).toMatch(/class 3 of 5/);
    expect(text).toMatch(/measured temperature factor is 0\.40, below the 0\.75/);
    expect(text).toMatch(/insulation, a thermal bridge/);
    expect(text).toMatch(/at the dew point, so wet with condensation, for 72 hours/);
    expect(text).not.toMatch(/cooler room/); // 20 °C is not under the 18 °C we call cool
  });

  it("cold-surface from a typical element when the surface is estimated", () => {
    // Solid wall fRsi 0.475 (1 − 2.1 × 0.25): surface 9.5 °C; RH = 1169.40/1187.46 = 98.5 % (≥ 80).
    const d = run({
      element: "solid-wall",
      readings: threeDays({ airTemperatureC: 20, relativeHumidityPct: 50, outdoorTemperatureC: 0 }),
    });
    expect(d.kind).toBe("cold-surface");
    expect(d.reasons.join(" ")).toMatch(/typical temperature factor is 0\.48/);
    expect(d.reasons.join(" ")).toMatch(/estimated from a typical building element, not measured/);
  });

  it("without outdoor readings: air RH ≥ 60 % points to moisture, < 60 % to the surface (our threshold)", () => {
    // 20 °C / 70 %, surface 16 °C → 90.0 % surface RH (above); air 70 % ≥ 60 % (ours, no source).
    const wet = run({ readings: threeDays({ airTemperatureC: 20, relativeHumidityPct: 70, surfaceTemperatureC: 16 }) });
    expect(wet.kind).toBe("ventilation-or-moisture-load");
    expect(wet.reasons.join(" ")).toMatch(/Outdoor temperature readings would confirm/);
    // 20 °C / 50 %, surface 10 °C: RH = 1169.40/1228.00 = 95.2 %; air 50 % < 60 %.
    const cold = run({ readings: threeDays({ airTemperatureC: 20, relativeHumidityPct: 50, surfaceTemperatureC: 10 }) });
    expect(cold.kind).toBe("cold-surface");
    expect(cold.reasons.join(" ")).toMatch(/averaged 50 % relative humidity, which is moderate/);
  });

  it("names a cool room (under 18 °C, WHO 2018 from memory) and mixed surface sources", () => {
    // 15 °C / 60 %, surface 9 °C: RH = 0.6 × 1705.45/1148.11 = 89.1 % (psat via psychrolib) ≥ 80 %.
    const readings = threeDays({ airTemperatureC: 15, relativeHumidityPct: 60, surfaceTemperatureC: 9 });
    for (let i = 0; i < 10; i++) delete readings[i]!.surfaceTemperatureC;
    const d = run({ readings });
    expect(d.reasons.join(" ")).toMatch(/averaged 15\.0 °C; a cooler room has cooler walls and windows/);
    expect(d.reasons.join(" ")).toMatch(
      /Of 73 readings, the surface temperature was measured for 63, taken at the air temperature for 10/,
    );
  });

  it("says when the surface was taken at air temperature", () => {
    const d = run({ readings: threeDays({ airTemperatureC: 20, relativeHumidityPct: 50 }) });
    expect(d.kind).toBe("no-risk-found");
    expect(d.reasons.join(" ")).toMatch(/taken at the air temperature/);
  });
});

describe("diagnose() on its own", () => {
  const base: DiagnosisFacts = {
    observedHours: 720,
    worstRolling30DayMeanSurfaceRhPct: 85,
    hoursSurfaceRhAtLeast80: 400,
    hoursCondensing: 20,
  };
  const kinds = (facts: Partial<DiagnosisFacts>) => {
    const d = diagnose({ ...base, ...facts });
    allReasons.push(...d.reasons);
    return d.kind;
  };

  it("each kind from facts", () => {
    // Same rules as above (TRADE.md §2 and §6); 24 h minimum and 60 % air RH are ours, no source.
    expect(kinds({ observedHours: 12 })).toBe("insufficient-data");
    expect(kinds({ worstRolling30DayMeanSurfaceRhPct: null })).toBe("insufficient-data");
    expect(kinds({ worstRolling30DayMeanSurfaceRhPct: 60, hoursCondensing: 0, hoursSurfaceRhAtLeast80: 0 })).toBe(
      "no-risk-found",
    );
    expect(kinds({ worstRolling30DayMeanSurfaceRhPct: 60, hoursCondensing: 0, surfaceWet: true })).toBe(
      "likely-not-condensation",
    );
    const excess = { meanGPerM3: 7, loadClass: 4, meanOutdoorTemperatureC: 3, readings: 720, assumedOutdoorRhReadings: 0 };
    expect(kinds({ moistureExcess: excess })).toBe("ventilation-or-moisture-load");
    expect(kinds({ moistureExcess: { ...excess, meanGPerM3: 3, loadClass: 2 } })).toBe("cold-surface");
    expect(kinds({ temperatureFactor: { value: 0.6, basis: "measured" } })).toBe("cold-surface");
    expect(kinds({ meanAirRelativeHumidityPct: 68 })).toBe("ventilation-or-moisture-load");
    expect(kinds({ meanAirRelativeHumidityPct: 52 })).toBe("cold-surface");
  });

  it("a wet surface with conditions for condensation is not called 'not condensation'", () => {
    // TRADE.md §6: only a surface that is not cold and wet from condensation points elsewhere.
    expect(kinds({ surfaceWet: true, meanAirRelativeHumidityPct: 68 })).toBe("ventilation-or-moisture-load");
  });

  it("mentions a high moisture load and a cold surface together when both hold", () => {
    // TRADE.md §2 (class 5 is the top class, from memory) and BRE IP 1/06 (0.5 < 0.75).
    const d = diagnose({
      ...base,
      moistureExcess: { meanGPerM3: 9, loadClass: 5, meanOutdoorTemperatureC: 2, readings: 10, assumedOutdoorRhReadings: 4 },
      temperatureFactor: { value: 0.5, basis: "measured" },
    });
    allReasons.push(...d.reasons);
    expect(d.kind).toBe("ventilation-or-moisture-load");
    expect(d.reasons.join(" ")).toMatch(/also colder than it should be/);
    expect(d.reasons.join(" ")).toMatch(/not measured for 4 of the 10 readings/);
  });

  it("no-risk-found notes a borderline monthly mean (our 70 % margin)", () => {
    const d = diagnose({ ...base, worstRolling30DayMeanSurfaceRhPct: 75, hoursCondensing: 0, hoursSurfaceRhAtLeast80: 30 });
    allReasons.push(...d.reasons);
    expect(d.kind).toBe("no-risk-found");
    expect(d.reasons.join(" ")).toMatch(/worth watching/);
    expect(d.reasons.join(" ")).toMatch(/80 % or more for 30 hours/);
  });
});

describe("wording", () => {
  it("never blames occupants' habits (Housing Ombudsman, 'It's not lifestyle', 2021)", () => {
    // Housing Ombudsman Spotlight on damp and mould (October 2021), TRADE.md §5 [S].
    expect(allReasons.length).toBeGreaterThan(30);
    for (const reason of allReasons) {
      expect(reason).not.toMatch(/lifestyle|habit|washing|laundry|cooking|shower|bath|you\b|your\b|occupant|tenant|resident/i);
    }
  });
});
