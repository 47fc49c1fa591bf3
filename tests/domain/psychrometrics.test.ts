import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  GAS_CONSTANT_WATER_VAPOUR,
  absoluteHumidityGPerM3,
  dewPointC,
  dewPointFromVapourPressureC,
  frostPointC,
  humidityRatio,
  relativeHumidityPctFromVapourPressure,
  saturationVapourPressurePa,
  vapourPressureFromDewPointPa,
  vapourPressurePa,
} from "../../src/lib/domain/index.js";
import { psychrolib } from "../../src/lib/domain/psychrometrics.js";

const relativeError = (actual: number, expected: number): number => Math.abs(actual / expected - 1);

describe("saturation vapour pressure", () => {
  // [temperature °C, Pa, source]
  const table: [number, number, string][] = [
    [5, 872.6, "ASHRAE Handbook—Fundamentals (2017) ch.1 Table 3, via psychrolib test suite"],
    [25, 3169.7, "ASHRAE Handbook—Fundamentals (2017) ch.1 Table 3, via psychrolib test suite"],
    [50, 12351.3, "ASHRAE Handbook—Fundamentals (2017) ch.1 Table 3, via psychrolib test suite"],
    [0, 611.2, "ASHRAE 2017 Table 3 value from memory (TRADE.md §1 [M])"],
    [10, 1228.2, "ASHRAE 2017 Table 3 value from memory (TRADE.md §1 [M])"],
    [15, 1705.7, "ASHRAE 2017 Table 3 value from memory (TRADE.md §1 [M])"],
    [20, 2339.2, "ASHRAE 2017 Table 3 value from memory (TRADE.md §1 [M])"],
    [30, 4246.7, "ASHRAE 2017 Table 3 value from memory (TRADE.md §1 [M])"],
  ];
  // Below 0 °C this function is over (supercooled) water; the table's over-ice values (−5 °C 401.74 Pa,
  // −20 °C 103.24 Pa) are checked against saturationVapourPressureOverIcePa in psychrometrics-below-zero.test.ts.
  it.each(table)("at %d °C matches %d Pa within 3e-4 (%s)", (t, pa) => {
    // Tolerance: relative 3e-4, as in psychrolib's test suite (TRADE.md §1).
    expect(relativeError(saturationVapourPressurePa(t), pa)).toBeLessThan(3e-4);
  });

  it("agrees with the Magnus forms within 0.5 % over 0–35 °C", () => {
    // Alduchov & Eskridge (1996) J. Appl. Meteor. 35: 6.1094·exp(17.625·t/(t+243.04)) hPa;
    // WMO-No. 8 (2008) Annex 4.B: 6.112·exp(17.62·t/(243.12+t)) hPa; both run up to ~0.3 % low
    // at 30 °C, so TRADE.md §1 says compare with ~0.5 %.
    for (let t = 0; t <= 35; t++) {
      const ae = 100 * 6.1094 * Math.exp((17.625 * t) / (t + 243.04));
      const wmo = 100 * 6.112 * Math.exp((17.62 * t) / (243.12 + t));
      expect(relativeError(ae, saturationVapourPressurePa(t))).toBeLessThan(0.005);
      expect(relativeError(wmo, saturationVapourPressurePa(t))).toBeLessThan(0.005);
    }
  });
});

// Magnus inversion (TRADE.md §1 [S]): γ = ln(RH) + a·t/(b+t), Td = b·γ/(a−γ).
const magnusDewPoint = (t: number, rhPct: number, a: number, b: number): number => {
  const gamma = Math.log(rhPct / 100) + (a * t) / (b + t);
  return (b * gamma) / (a - gamma);
};

describe("dew point", () => {
  it("is within 0.05 K of both Magnus forms on a 1 °C × 5 %RH grid over 0–35 °C, 30–95 % (water branch)", () => {
    // Alduchov & Eskridge (1996): a = 17.625, b = 243.04 °C; WMO-No. 8 (2008) Annex 4.B:
    // a = 17.62, b = 243.12 °C. psychrolib solves ASHRAE eq. 6 (Hyland–Wexler) over water.
    // Measured on this grid (dew points below 0 °C included, over water): worst 0.026 K (A&E) and 0.036 K (WMO).
    let checked = 0;
    for (let t = 0; t <= 35; t++) {
      for (let rh = 30; rh <= 95; rh += 5) {
        const td = dewPointC(t, rh);
        expect(Math.abs(td - magnusDewPoint(t, rh, 17.625, 243.04))).toBeLessThan(0.05);
        expect(Math.abs(td - magnusDewPoint(t, rh, 17.62, 243.12))).toBeLessThan(0.05);
        checked++;
      }
    }
    expect(checked).toBe(36 * 14); // over water everywhere, below 0 °C too
  });

  it("below 0 °C the dew point stays over water; the frost point is within 0.05 K of the over-ice Magnus forms", () => {
    // The dew point is over water at any temperature (WMO-No. 8 convention; it was the frost point
    // before, from psychrolib's ice branch). For the 115 grid points whose dew point is below 0 °C,
    // frostPointC (ASHRAE eq. 5) is checked against the over-ice forms, from memory (not in TRADE.md):
    // Alduchov & Eskridge (1996) 6.1121·exp(22.587·t/(273.86+t)) hPa; WMO-No. 8
    // 6.112·exp(22.46·t/(272.62+t)) hPa. The vapour pressure comes from the matching over-water form.
    // Measured worst: 0.026 K and 0.030 K.
    let checked = 0;
    for (let t = 0; t <= 35; t++) {
      for (let rh = 30; rh <= 95; rh += 5) {
        const frost = frostPointC(t, rh);
        if (frost === null) continue;
        const td = frost;
        const pvAe = (rh / 100) * 6.1094 * Math.exp((17.625 * t) / (243.04 + t));
        const gAe = Math.log(pvAe / 6.1121);
        const pvWmo = (rh / 100) * 6.112 * Math.exp((17.62 * t) / (243.12 + t));
        const gWmo = Math.log(pvWmo / 6.112);
        expect(Math.abs(td - (273.86 * gAe) / (22.587 - gAe))).toBeLessThan(0.05);
        expect(Math.abs(td - (272.62 * gWmo) / (22.46 - gWmo))).toBeLessThan(0.05);
        expect(td).toBeGreaterThan(dewPointC(t, rh)); // frost point above dew point
        expect(dewPointC(t, rh)).toBeLessThan(0);
        checked++;
      }
    }
    expect(checked).toBe(115);
  });

  it.each([
    [20, 50, 9.27],
    [20, 60, 12.01],
    [20, 70, 14.37],
    [25, 50, 13.86],
  ])("%d °C / %d %% → %d °C within 0.02 K", (t, rh, expected) => {
    // TRADE.md §1 reference dew points [D, from Hyland–Wexler; Magnus agrees within 0.02 K] — derived.
    expect(Math.abs(dewPointC(t, rh) - expected)).toBeLessThan(0.02);
  });

  it("20 °C / 60 % → 12.007 °C", () => {
    // STACK.md psychrolib section: GetTDewPointFromRelHum(20, 0.6) → 12.007 °C.
    expect(dewPointC(20, 60)).toBeCloseTo(12.007, 3);
  });

  it("round trip dew point → vapour pressure → dew point within 0.001 K", () => {
    // psychrolib test suite round-trip identities, abs 0.001 K (TRADE.md §1 [S]).
    fc.assert(
      fc.property(fc.double({ min: -30, max: 60, noNaN: true }), (td) => {
        expect(Math.abs(dewPointFromVapourPressureC(vapourPressureFromDewPointPa(td)) - td)).toBeLessThan(0.001);
      }),
    );
  });

  it("round trip RH → vapour pressure → RH", () => {
    // psychrolib test suite round-trip identities (TRADE.md §1 [S]); the inverse is exact algebra,
    // so we hold it to 1e-9 %RH.
    fc.assert(
      fc.property(fc.double({ min: -20, max: 50, noNaN: true }), fc.double({ min: 0, max: 100, noNaN: true }), (t, rh) => {
        expect(Math.abs(relativeHumidityPctFromVapourPressure(t, vapourPressurePa(t, rh)) - rh)).toBeLessThan(1e-9);
      }),
    );
  });

  it("round trip air → dew point → vapour pressure within 0.001 K of dew point", () => {
    // psychrolib test suite round-trip identities, abs 0.001 K (TRADE.md §1 [S]).
    fc.assert(
      fc.property(fc.double({ min: 0, max: 40, noNaN: true }), fc.double({ min: 20, max: 100, noNaN: true }), (t, rh) => {
        const td = dewPointC(t, rh);
        expect(Math.abs(dewPointFromVapourPressureC(vapourPressurePa(t, rh)) - td)).toBeLessThan(0.001);
      }),
    );
  });

  // Property tests: physical identities of the definition (no source needed beyond it).
  it("is never above the air temperature and equals it at 100 %", () => {
    fc.assert(
      fc.property(fc.double({ min: -20, max: 50, noNaN: true }), fc.double({ min: 1, max: 100, noNaN: true }), (t, rh) => {
        expect(dewPointC(t, rh)).toBeLessThanOrEqual(t);
      }),
    );
    fc.assert(
      fc.property(fc.double({ min: -20, max: 50, noNaN: true }), (t) => {
        expect(Math.abs(dewPointC(t, 100) - t)).toBeLessThan(0.001); // psychrolib solver tolerance
      }),
    );
  });

  it("rises with RH at a fixed air temperature", () => {
    fc.assert(
      fc.property(
        fc.double({ min: -20, max: 50, noNaN: true }),
        fc.double({ min: 5, max: 95, noNaN: true }),
        fc.double({ min: 1, max: 5, noNaN: true }),
        (t, rh, step) => {
          expect(dewPointC(t, rh + step)).toBeGreaterThan(dewPointC(t, rh));
        },
      ),
    );
  });
});

describe("absolute humidity and humidity ratio", () => {
  it("20 °C / 50 % → 8.643 g/m³ (hand-computed from the ideal-gas law)", () => {
    // pv = 0.5 × psat(20 °C) = 0.5 × 2338.804 = 1169.402 Pa (ASHRAE eq. 6 via psychrolib);
    // Rv = 287.042 / 0.621945 = 461.523 J/(kg·K) (ASHRAE 2017 ch.1 constants, as psychrolib);
    // ρv = pv / (Rv·T) = 1169.402 / (461.523 × 293.15) = 0.0086433 kg/m³ = 8.6433 g/m³.
    expect(GAS_CONSTANT_WATER_VAPOUR).toBeCloseTo(461.523, 3);
    expect(absoluteHumidityGPerM3(20, 50)).toBeCloseTo(8.6433, 4);
  });

  it("equals W/(1+W) × psychrolib's moist-air density", () => {
    // ASHRAE 2017 ch.1 eq. 11 (moist-air density, via psychrolib GetMoistAirDensity); vapour
    // mass per unit volume is the water share W/(1+W) of it. psychrolib's density uses 1.607858
    // where 1/0.621945 = 1.6078592; the mismatch grows with W (about 2e−8 relative at 30 °C/70 %),
    // hence the 1e−7 tolerance.
    for (const [t, rh] of [
      [5, 90],
      [20, 50],
      [30, 70],
    ] as const) {
      const w = psychrolib.GetHumRatioFromRelHum(t, rh / 100, 101_325);
      const density = psychrolib.GetMoistAirDensity(t, w, 101_325);
      expect(relativeError(absoluteHumidityGPerM3(t, rh), (1000 * w * density) / (1 + w))).toBeLessThan(1e-7);
    }
  });

  it("20 °C / 50 % at 101 325 Pa → W = 0.0072617 (ASHRAE 2017 ch.1 eq. 20 by hand)", () => {
    // W = 0.621945·pv/(p − pv) = 0.621945 × 1169.402 / (101325 − 1169.402) = 0.0072617.
    expect(humidityRatio(20, 50)).toBeCloseTo(0.0072617, 7);
    // Same equation at 90 000 Pa: 0.621945 × 1169.402 / (90000 − 1169.402) = 0.0081875.
    expect(humidityRatio(20, 50, 90_000)).toBeCloseTo(0.0081875, 7);
  });
});

describe("input guards", () => {
  it("throws RangeError on NaN and out-of-range inputs", () => {
    expect(() => saturationVapourPressurePa(Number.NaN)).toThrow(RangeError);
    expect(() => dewPointC(20, Number.NaN)).toThrow(RangeError);
    expect(() => dewPointC(Number.NaN, 50)).toThrow(RangeError);
    expect(() => dewPointC(20, 0)).toThrow(RangeError);
    expect(() => vapourPressurePa(20, 101)).toThrow(RangeError);
    expect(() => humidityRatio(20, 50, Number.NaN)).toThrow(RangeError);
  });
});
