import { describe, expect, it } from "vitest";
import { reasonInEnglish } from "../../src/lib/domain/point.js";
import { evaluatePoint } from "../../src/lib/domain/index.js";

describe("evaluatePoint", () => {
  it("returns exactly the agreed shape", () => {
    // Issue 3 brief: the public API returns this shape verbatim.
    const r = evaluatePoint({ airTemperatureC: 20, relativeHumidityPct: 50, surfaceTemperatureC: 15, outdoorTemperatureC: 0 });
    expect(Object.keys(r).sort()).toEqual(
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
    expect(Object.keys(r.surface).sort()).toEqual(
      ["relativeHumidityPct", "source", "state", "temperatureC", "temperatureFactor"].sort(),
    );
    const air = evaluatePoint({ airTemperatureC: 20, relativeHumidityPct: 50 });
    expect(Object.keys(air.surface).sort()).toEqual(["relativeHumidityPct", "source", "state", "temperatureC"].sort());
    expect(JSON.parse(JSON.stringify(r))).toEqual(r); // plain data, no Dates or class instances
  });

  it("tenant example: 19 °C / 78 % with a window at 9 °C is condensing, dew point ≈ 15.1 °C", () => {
    // Issue 3 brief example. Magnus check by hand (Alduchov & Eskridge 1996, TRADE.md §1 [S]):
    //   γ = ln 0.78 + 17.625 × 19/(243.04 + 19) = −0.248461 + 1.277954 = 1.029492
    //   Td = 243.04 × 1.029492/(17.625 − 1.029492) = 15.077 °C
    // Surface RH = pv/psat(9 °C) = 1714.28/1148.11 = 149.3 % (ASHRAE eq. 6 via psychrolib), ≥ 100.
    const r = evaluatePoint({
      airTemperatureC: 19,
      relativeHumidityPct: 78,
      surfaceTemperatureC: 9,
      element: "single-glazing",
    });
    expect(Math.abs(r.dewPointC - 15.077)).toBeLessThan(0.05);
    expect(r.dewPointC).toBeCloseTo(15.1, 1);
    expect(r.surface.state).toBe("condensing");
    expect(r.surface.source).toBe("measured");
    expect(r.surface.relativeHumidityPct).toBeCloseTo(149.3, 1);
    expect(r.reasons).toContain(
      "The window surface is about 9.0 °C, below the air's dew point of 15.1 °C, so water condenses on it.",
    );
  });

  it("air properties at 20 °C / 60 % match the psychrometrics module", () => {
    // psat(20 °C) = 2338.80 Pa (ASHRAE eq. 6 via psychrolib; Table 3 gives 2339.2, from memory);
    // pv = 0.6 × 2338.80 = 1403.28 Pa; dew point 12.01 °C (TRADE.md §1 [D]);
    // ρv = 1403.28/(461.523 × 293.15) = 10.372 g/m³; W = 0.621945 × 1403.28/(101325 − 1403.28) = 0.0087345.
    const r = evaluatePoint({ airTemperatureC: 20, relativeHumidityPct: 60 });
    expect(r.saturationVapourPressurePa).toBeCloseTo(2338.8, 2);
    expect(r.vapourPressurePa).toBeCloseTo(1403.28, 2);
    expect(Math.abs(r.dewPointC - 12.01)).toBeLessThan(0.02);
    expect(r.absoluteHumidityGPerM3).toBeCloseTo(10.372, 3);
    expect(r.humidityRatio).toBeCloseTo(0.0087345, 7);
  });

  it("uses the given pressure for the humidity ratio (default 101 325 Pa)", () => {
    // ASHRAE 2017 ch.1 eq. 20 by hand at 90 000 Pa: 0.621945 × 1403.28/(90000 − 1403.28) = 0.0098510.
    const r = evaluatePoint({ airTemperatureC: 20, relativeHumidityPct: 60, pressurePa: 90_000 });
    expect(r.humidityRatio).toBeCloseTo(0.009851, 6);
  });

  it("estimates the surface from the element and the outdoor temperature", () => {
    // θsi = θe + fRsi·(θi − θe) with the solid wall's fRsi = 1 − 2.1 × 0.25 = 0.475 (TRADE.md §2, U from memory):
    // 0 + 0.475 × (20 − 0) = 9.5 °C (TRADE.md §2 [D], derived).
    const r = evaluatePoint({ airTemperatureC: 20, relativeHumidityPct: 60, outdoorTemperatureC: 0, element: "solid-wall" });
    expect(r.surface.source).toBe("estimated");
    expect(r.surface.temperatureC).toBeCloseTo(9.5, 10);
    expect(r.surface.temperatureFactor).toBeCloseTo(0.475, 10);
    // Dew point 12.01 °C is above 9.5 °C, so the wall condenses; the factor is under 0.75 (BRE IP 1/06).
    expect(r.surface.state).toBe("condensing");
    expect(r.reasons.some((s) => s.includes("estimated at 9.5 °C"))).toBe(true);
    expect(r.reasons.some((s) => s.includes("below the 0.75 that BRE IP 1/06 sets"))).toBe(true);
    // The same reasons by id, with the figures as shown, and the English is their rendering.
    expect(r.reasonIds.map((x) => x.id)).toEqual(["estimated", "dew", "factor-typical"]);
    expect(r.reasonIds[0]!.values).toMatchObject({
      noun: "wall",
      element: "solid-wall",
      surface: 9.5,
      air: 20,
      outdoor: 0,
      factor: 0.48,
    });
    expect(r.reasonIds[2]!.values).toEqual({ element: "solid-wall", factor: 0.48, critical: 0.75 });
    expect(r.reasonIds.map(reasonInEnglish)).toEqual(r.reasons);
  });

  it("says the corner figure is our own assumption", () => {
    // Issue 3 brief: state the corner assumption in a reason string.
    const r = evaluatePoint({
      airTemperatureC: 20,
      relativeHumidityPct: 50,
      outdoorTemperatureC: 0,
      element: "corner-thermal-bridge",
    });
    // θsi = 0 + 0.40 × 20 = 8.0 °C (our own assumed fRsi, common practice, no source).
    expect(r.surface.temperatureC).toBeCloseTo(8, 10);
    expect(r.reasons.some((s) => s.includes("our own assumption"))).toBe(true);
  });

  it("takes the surface at air temperature when nothing else is known, and says why", () => {
    // Issue 3 brief: source "air" with a reason; element without outdoor temperature → air too.
    const none = evaluatePoint({ airTemperatureC: 20, relativeHumidityPct: 50 });
    expect(none.surface.source).toBe("air");
    expect(none.surface.temperatureC).toBe(20);
    expect(none.surface.relativeHumidityPct).toBe(50);
    expect(none.reasons[0]).toMatch(/taken at the air temperature/);

    const elementOnly = evaluatePoint({ airTemperatureC: 20, relativeHumidityPct: 50, element: "single-glazing" });
    expect(elementOnly.surface.source).toBe("air");
    expect(elementOnly.reasons[0]).toMatch(/An outdoor temperature is needed/);
  });

  it("never claims condensing without a surface temperature, measured or estimated from the construction", () => {
    // Saturated air with no surface temperature and no element to estimate one: the surface is only
    // assumed at air temperature, so the state is mould risk (≥ 80 %, ISO 13788), not condensing.
    const saturated = evaluatePoint({ airTemperatureC: 18, relativeHumidityPct: 100 });
    expect(saturated.surface.source).toBe("air");
    expect(saturated.surface.relativeHumidityPct).toBe(100);
    expect(saturated.surface.state).toBe("mould-risk");
    expect(saturated.reasons.join(" ")).toMatch(/cannot say whether water condenses/);
    // Estimated from the element (single glazing, typical fRsi) with an outdoor temperature: condensing
    // stays, and the source says it is an estimate (the panel labels it so).
    const estimated = evaluatePoint({
      airTemperatureC: 19,
      relativeHumidityPct: 78,
      outdoorTemperatureC: 0,
      element: "single-glazing",
    });
    expect(estimated.surface.source).toBe("estimated");
    expect(estimated.surface.state).toBe("condensing");
  });

  it("measured temperature factor: given at ≥ 5 K difference, flagged under 0.75, withheld under 5 K", () => {
    // fRsi = (θsi − θe)/(θi − θe) (ISO 13788): (12 − 0)/(20 − 0) = 0.60 < 0.75 (BRE IP 1/06).
    const low = evaluatePoint({ airTemperatureC: 20, relativeHumidityPct: 40, surfaceTemperatureC: 12, outdoorTemperatureC: 0 });
    expect(low.surface.temperatureFactor).toBeCloseTo(0.6, 12);
    expect(low.reasons.some((s) => s.includes("temperature factor is 0.60, below the 0.75"))).toBe(true);
    // (17 − 0)/(20 − 0) = 0.85: no factor reason.
    const ok = evaluatePoint({ airTemperatureC: 20, relativeHumidityPct: 40, surfaceTemperatureC: 17, outdoorTemperatureC: 0 });
    expect(ok.surface.temperatureFactor).toBeCloseTo(0.85, 12);
    expect(ok.reasons.some((s) => s.includes("0.75"))).toBe(false);
    // 20 − 17 = 3 K < 5 K (our own cut-off): no factor.
    const mild = evaluatePoint({
      airTemperatureC: 20,
      relativeHumidityPct: 40,
      surfaceTemperatureC: 18,
      outdoorTemperatureC: 17,
    });
    expect(mild.surface.temperatureFactor).toBeUndefined();
    expect(mild.reasons.some((s) => s.includes("no temperature factor is given"))).toBe(true);
  });

  it("reports each state", () => {
    // 20 °C / 50 %: pv = 1169.40 Pa. Surface RH = pv/psat(θs) with psat from ASHRAE eq. 6 via psychrolib:
    //   θs 18 °C: 1169.40/2064.29 = 56.6 % → dry
    //   θs 12 °C: psat 1402.59 → 83.4 % → mould-risk (≥ 80, ISO 13788)
    //   θs 14 °C: psat 1598.67 → 73.1 % → borderline (70–80, our own margin)
    const at = (s: number) =>
      evaluatePoint({ airTemperatureC: 20, relativeHumidityPct: 50, surfaceTemperatureC: s }).surface.state;
    expect(at(18)).toBe("dry");
    expect(at(14)).toBe("borderline");
    expect(at(12)).toBe("mould-risk");
    expect(at(8)).toBe("condensing");
  });

  it("throws RangeError on NaN", () => {
    // Issue 3 brief: the module throws RangeError on NaN inputs.
    expect(() => evaluatePoint({ airTemperatureC: Number.NaN, relativeHumidityPct: 50 })).toThrow(RangeError);
    expect(() => evaluatePoint({ airTemperatureC: 20, relativeHumidityPct: Number.NaN })).toThrow(RangeError);
    expect(() => evaluatePoint({ airTemperatureC: 20, relativeHumidityPct: 50, surfaceTemperatureC: Number.NaN })).toThrow(
      RangeError,
    );
    expect(() => evaluatePoint({ airTemperatureC: 20, relativeHumidityPct: 50, outdoorTemperatureC: Number.NaN })).toThrow(
      RangeError,
    );
  });
});
