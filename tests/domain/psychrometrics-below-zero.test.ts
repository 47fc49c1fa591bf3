// The engine's conventions below 0 °C, each checked against published values named beside it.
//
// 1. A relative humidity reading is relative to liquid water at any temperature, below 0 °C too
//    (WMO convention: WMO-No. 8, Guide to Instruments and Methods of Observation, Annex 4.B — annex
//    number from memory): vapour pressure = RH × e_w(T), e_w over (supercooled) water.
// 2. dewPointC is always over water; frostPointC (over ice) is given whenever the dew point is below 0 °C.
// 3. A surface below 0 °C is judged against saturation over ice (ISO 13788, from memory: its saturation
//    pressure formula has an ice branch below 0 °C), so its relative humidity there is relative to ice.
import { describe, expect, it } from "vitest";
import {
  dewPointC,
  dewPointFromVapourPressureC,
  evaluatePoint,
  evaluateSeries,
  frostPointC,
  frostPointFromVapourPressureC,
  minimumTemperatureFactor,
  relativeHumidityPctFromVapourPressure,
  saturationVapourPressureOverIcePa,
  saturationVapourPressurePa,
  surfaceRelativeHumidityPct,
  surfaceSaturationVapourPressurePa,
  vapourPressurePa,
} from "../../src/lib/domain/index.js";
import { psychrolib } from "../../src/lib/domain/psychrometrics.js";

const relativeError = (actual: number, expected: number): number => Math.abs(actual / expected - 1);

// WMO-No. 8 (2008) Annex 4.B, as the task names them: e_w = 6.112·exp(17.62·t/(243.12 + t)) hPa over
// water, e_i = 6.112·exp(22.46·t/(272.62 + t)) hPa over ice; and their inversions.
const wmoWaterPa = (t: number): number => 611.2 * Math.exp((17.62 * t) / (243.12 + t));
const wmoIcePa = (t: number): number => 611.2 * Math.exp((22.46 * t) / (272.62 + t));
const wmoDewPoint = (pv: number): number => {
  const g = Math.log(pv / 611.2);
  return (243.12 * g) / (17.62 - g);
};
const wmoFrostPoint = (pv: number): number => {
  const g = Math.log(pv / 611.2);
  return (272.62 * g) / (22.46 - g);
};

describe("saturation over water and over ice (the engine's own ASHRAE eq. 5 and eq. 6)", () => {
  it("over water equals psychrolib above the triple point, and over ice equals it at and below", () => {
    // psychrolib (ASHRAE 2017 ch. 1) switches from eq. 6 to eq. 5 at 0.01 °C; our two curves carry the
    // same constants, so above 0.01 °C the water curve and at or below it the ice curve match it to rounding.
    for (let t = 0.02; t <= 200; t += 0.37) {
      expect(relativeError(saturationVapourPressurePa(t), psychrolib.GetSatVapPres(t))).toBeLessThan(1e-12);
      expect(surfaceSaturationVapourPressurePa(t)).toBe(saturationVapourPressurePa(t));
    }
    for (let t = -100; t <= 0.01; t += 0.23) {
      expect(relativeError(saturationVapourPressureOverIcePa(t), psychrolib.GetSatVapPres(t))).toBeLessThan(1e-12);
      expect(surfaceSaturationVapourPressurePa(t)).toBe(saturationVapourPressureOverIcePa(t));
    }
  });

  it("over water below 0 °C matches the published supercooled-water values", () => {
    // Murphy & Koop (2005), Q. J. R. Meteorol. Soc. 131, 1539–1565, check values (from memory; recomputed
    // from their liquid-water formula, which gives the same figures): 611.213 Pa at 273.15 K and 37.667 Pa
    // at 240 K. ASHRAE eq. 6 lands within 1e-4 at 0 °C and 0.35 % at −33.15 °C.
    expect(relativeError(saturationVapourPressurePa(0), 611.213)).toBeLessThan(1e-4);
    expect(relativeError(saturationVapourPressurePa(240 - 273.15), 37.667)).toBeLessThan(0.0035);
    // WMO-No. 8 Annex 4.B over water, an independent Magnus form: within 0.3 % from −30 to 0 °C
    // (measured worst 0.27 %, at −20 °C: 125.63 against 125.97 Pa).
    for (let t = -30; t <= 0; t += 0.5) {
      expect(relativeError(saturationVapourPressurePa(t), wmoWaterPa(t))).toBeLessThan(0.003);
    }
    // Supercooled water holds more vapour than ice at the same temperature (WMO-No. 8; both formulas).
    for (let t = -30; t < 0; t += 1) {
      expect(saturationVapourPressurePa(t)).toBeGreaterThan(saturationVapourPressureOverIcePa(t));
    }
  });

  it("over ice matches the ASHRAE table and the WMO ice formula", () => {
    // ASHRAE Handbook—Fundamentals (2017) ch. 1 Table 3 (over ice), via psychrolib's test suite:
    // −5 °C 401.74 Pa, −20 °C 103.24 Pa, relative 3e-4 as in that suite.
    expect(relativeError(saturationVapourPressureOverIcePa(-5), 401.74)).toBeLessThan(3e-4);
    expect(relativeError(saturationVapourPressureOverIcePa(-20), 103.24)).toBeLessThan(3e-4);
    // Murphy & Koop (2005) ice check value (from memory, recomputed from their ice formula): 27.272 Pa at 240 K.
    expect(relativeError(saturationVapourPressureOverIcePa(240 - 273.15), 27.272)).toBeLessThan(2e-4);
    // WMO-No. 8 Annex 4.B over ice: within 0.1 % from −40 to 0 °C (measured worst 0.036 %, at −40 °C).
    for (let t = -40; t <= 0; t += 0.5) {
      expect(relativeError(saturationVapourPressureOverIcePa(t), wmoIcePa(t))).toBeLessThan(0.001);
    }
    // Ice does not exist above the triple point: asking is an error, not a silent extrapolation.
    expect(() => saturationVapourPressureOverIcePa(5)).toThrow(RangeError);
  });
});

describe("convention 1: relative humidity is relative to water below 0 °C (WMO-No. 8 Annex 4.B)", () => {
  it("air at −5 °C / 80 % holds 0.8 × e_w(−5 °C), not 0.8 × e_i(−5 °C)", () => {
    // e_w(−5 °C) = 421.83 Pa by ASHRAE eq. 6 (WMO: 611.2·exp(17.62·−5/238.12) = 422.19 Pa);
    // 0.8 × 421.83 = 337.47 Pa (WMO 337.75 Pa, 0.08 % apart). Over ice it would be 0.8 × 401.76 = 321.41 Pa.
    const pv = vapourPressurePa(-5, 80);
    expect(pv).toBeCloseTo(337.47, 2);
    expect(relativeError(pv, 0.8 * wmoWaterPa(-5))).toBeLessThan(0.001);
    expect(relativeHumidityPctFromVapourPressure(-5, pv)).toBeCloseTo(80, 9);
  });
});

describe("convention 2: dewPointC is over water; frostPointC (over ice) whenever the dew point is below 0 °C", () => {
  it("worked example: air at −5 °C / 80 % → dew point −7.91 °C, frost point −7.02 °C", () => {
    // By hand from WMO-No. 8 Annex 4.B: pv = 0.8 × 422.185 = 337.75 Pa; g = ln(337.75/611.2) = −0.59311;
    // Td = 243.12·g/(17.62 − g) = −7.917 °C; Tf = 272.62·g/(22.46 − g) = −7.014 °C. (The figures of
    // −7.7 and −6.9 °C suggested when this work was planned do not follow from the formulas.)
    // ASHRAE eq. 5/6 give −7.911 and −7.025 °C; tolerance 0.02 K against WMO.
    expect(Math.abs(dewPointC(-5, 80) - wmoDewPoint(0.8 * wmoWaterPa(-5)))).toBeLessThan(0.02);
    expect(Math.abs(dewPointC(-5, 80) - -7.917)).toBeLessThan(0.02);
    expect(Math.abs(frostPointC(-5, 80)! - -7.014)).toBeLessThan(0.02);
    // The frost point lies above the dew point below 0 °C: ice takes up vapour more readily.
    expect(frostPointC(-5, 80)!).toBeGreaterThan(dewPointC(-5, 80));
  });

  it("agrees with WMO-No. 8 on a sub-zero grid (−20…0 °C, 30…100 %) within 0.05 K", () => {
    // Measured worst: 0.028 K for the dew point and 0.029 K for the frost point.
    let frostPoints = 0;
    for (let t = -20; t <= 0; t++) {
      for (let rh = 30; rh <= 100; rh += 5) {
        const wmoPv = (rh / 100) * wmoWaterPa(t);
        expect(Math.abs(dewPointC(t, rh) - wmoDewPoint(wmoPv))).toBeLessThan(0.05);
        const frost = frostPointC(t, rh);
        if (t === 0 && rh === 100) {
          expect(frost).toBeNull(); // dew point exactly 0 °C
          continue;
        }
        expect(frost).not.toBeNull();
        expect(Math.abs(frost! - wmoFrostPoint(wmoPv))).toBeLessThan(0.05);
        frostPoints++;
      }
    }
    expect(frostPoints).toBe(21 * 15 - 1);
  });

  it("gives no frost point when the dew point is at or above 0 °C", () => {
    expect(frostPointC(20, 60)).toBeNull();
    expect(frostPointC(0, 100)).toBeNull(); // dew point 0 °C exactly: not below
    expect(frostPointC(0, 99)).not.toBeNull();
  });

  it("the dew point at 100 % is the air temperature below 0 °C too, and inverts the water curve", () => {
    for (let t = -30; t <= 0; t += 2.5) {
      expect(Math.abs(dewPointC(t, 100) - t)).toBeLessThan(0.001);
      const pv = vapourPressurePa(t, 70);
      expect(relativeError(saturationVapourPressurePa(dewPointFromVapourPressureC(pv)), pv)).toBeLessThan(1e-9);
      expect(relativeError(saturationVapourPressureOverIcePa(frostPointFromVapourPressureC(pv)), pv)).toBeLessThan(1e-9);
    }
  });
});

describe("convention 3: a surface below 0 °C is judged against saturation over ice (ISO 13788)", () => {
  it("surface relative humidity below 0 °C is relative to ice, above 0 °C to water", () => {
    // Room air −5 °C / 80 %: pv = 337.47 Pa. At a surface of −7.3 °C, e_i = 329.49 Pa (ASHRAE eq. 5), so
    // 102.4 % over ice: frost forms. Over water (e_w = 353.81 Pa) it would read 95.4 % and no deposit.
    const pv = vapourPressurePa(-5, 80);
    expect(surfaceRelativeHumidityPct(pv, -7.3)).toBeCloseTo(102.42, 2);
    // 20 °C / 50 % over a surface at 8 °C: unchanged, 109.0 % over water (ASHRAE eq. 6).
    expect(surfaceRelativeHumidityPct(vapourPressurePa(20, 50), 8)).toBeCloseTo(109.0, 2);
  });

  it("a measured surface between the dew point and the frost point is frosting", () => {
    const r = evaluatePoint({ airTemperatureC: -5, relativeHumidityPct: 80, surfaceTemperatureC: -7.3 });
    expect(Math.abs(r.dewPointC - -7.917)).toBeLessThan(0.02); // WMO-No. 8, worked above
    expect(Math.abs(r.frostPointC! - -7.014)).toBeLessThan(0.02);
    expect(r.surface.relativeHumidityPct).toBeCloseTo(102.42, 2);
    expect(r.surface.state).toBe("condensing");
    expect(r.reasons).toContain(
      "The surface is about -7.3 °C, below the air's frost point of -7.0 °C, so frost forms on it (below 0 °C a " +
        "surface is judged against saturation over ice, as ISO 13788 does).",
    );
  });

  it("air at the surface below 0 °C: the surface humidity is the air's humidity relative to ice", () => {
    // No surface temperature: the surface is taken at the air's −5 °C; 80 % over water is
    // 337.47/401.76 = 84.0 % over ice (ASHRAE eq. 5 and 6).
    const r = evaluatePoint({ airTemperatureC: -5, relativeHumidityPct: 80 });
    expect(r.surface.source).toBe("air");
    expect(r.surface.relativeHumidityPct).toBeCloseTo(84.0, 1);
    expect(r.surface.state).toBe("mould-risk");
    // Above 0 °C the air's own humidity, exactly.
    expect(evaluatePoint({ airTemperatureC: 20, relativeHumidityPct: 60 }).surface.relativeHumidityPct).toBe(60);
  });

  it("a surface above 0 °C is measured against the dew point, one below 0 °C against ice", () => {
    // Air 15 °C / 30 %: pv = 511.63 Pa; dew point −2.42 °C, frost point −2.14 °C (ASHRAE eq. 5/6; WMO
    // gives the same to 0.03 K). A surface at 3 °C is above 0 °C, so the water curve and the dew point
    // apply: 3 − (−2.42) = 5.4 K.
    const warm = evaluatePoint({ airTemperatureC: 15, relativeHumidityPct: 30, surfaceTemperatureC: 3 });
    expect(warm.reasons.some((s) => s.includes("5.4 K above the dew point"))).toBe(true);
    // A surface at −1 °C: over ice 511.63/562.7 = 90.9 %, mould-risk wording relative to ice.
    const cold = evaluatePoint({ airTemperatureC: 15, relativeHumidityPct: 30, surfaceTemperatureC: -1 });
    expect(cold.surface.state).toBe("mould-risk");
    expect(cold.reasons.some((s) => s.includes("relative to ice"))).toBe(true);
  });

  it("series: condensing hours and moisture excess follow the same conventions", () => {
    // Two readings an hour apart at −5 °C / 80 % with the surface at −7.3 °C: 102.4 % over ice, so the
    // hour counts as condensing (frost); judged over water it would be 95.4 % and count only at ≥ 80 %.
    const frosty = evaluateSeries({
      readings: [
        { at: "2026-01-10T06:00:00Z", airTemperatureC: -5, relativeHumidityPct: 80, surfaceTemperatureC: -7.3 },
        { at: "2026-01-10T07:00:00Z", airTemperatureC: -5, relativeHumidityPct: 80, surfaceTemperatureC: -7.3 },
      ],
    });
    expect(frosty.hoursCondensing).toBe(1);
    // Moisture excess with outdoor −5 °C / 80 % (outdoor RH over water too, as weather services report it):
    // ρv,in = 0.5 × 2338.80/(461.523 × 293.15) = 8.6433 g/m³; ρv,out = 337.47/(461.523 × 268.15) = 2.7268 g/m³;
    // excess 5.9165 g/m³ (ideal-gas law by hand; over ice outdoors it would be 6.046).
    const excess = evaluateSeries({
      readings: [
        {
          at: "2026-01-10T06:00:00Z",
          airTemperatureC: 20,
          relativeHumidityPct: 50,
          outdoorTemperatureC: -5,
          outdoorRelativeHumidityPct: 80,
        },
      ],
    });
    expect(excess.moistureExcess!.meanGPerM3).toBeCloseTo(5.9165, 3);
  });

  it("ISO 13788 minimum surface temperature below 0 °C inverts the ice curve", () => {
    // Indoors 5 °C / 50 %: pi = 0.5 × 872.49 = 436.24 Pa; psat,min = 436.24/0.8 = 545.31 Pa < 611.66 Pa, so
    // θsi,min is where e_i = 545.30 Pa: −1.377 °C (WMO ice inversion, by hand: g = ln(545.30/611.2) = −0.11408,
    // 272.62·g/(22.46 − g) = −1.378 °C). Over water it would be −1.56 °C; a dew-point solve must not be used here.
    const r = minimumTemperatureFactor({ indoorTemperatureC: 5, indoorRelativeHumidityPct: 50, outdoorTemperatureC: -10 });
    expect(Math.abs(r.minimumSurfaceTemperatureC - wmoFrostPoint(r.minimumSaturationPressurePa))).toBeLessThan(0.02);
    expect(
      relativeError(saturationVapourPressureOverIcePa(r.minimumSurfaceTemperatureC), r.minimumSaturationPressurePa),
    ).toBeLessThan(1e-9);
  });
});
