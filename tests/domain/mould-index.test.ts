import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  MATERIAL_CLASSES,
  createMouldIndexState,
  criticalRelativeHumidityPct,
  maximumMouldIndex,
  mouldDecline,
  mouldGrowthRatePerDay,
  stepMouldIndex,
} from "../../src/lib/domain/index.js";
import type { MaterialSensitivity } from "../../src/lib/domain/index.js";

/** Constant conditions in equal steps: the stepper the series uses, driven directly. */
function run(material: MaterialSensitivity, t: number, rh: number, totalHours: number, stepHours = 1, initial = 0) {
  const state = createMouldIndexState(material, initial);
  const steps = Math.round(totalHours / stepHours);
  for (let i = 0; i < steps; i++) stepMouldIndex(state, t, rh, stepHours);
  return state;
}

describe("material classes", () => {
  it("carries the 2010 sensitivity-class parameters", () => {
    // TRADE.md §3 [S]: Ojanen et al. (2010) / Viitanen et al. (2010) sensitivity classes.
    expect(MATERIAL_CLASSES["very-sensitive"]).toMatchObject({ k1BelowOne: 1, k1FromOne: 2, a: 1, b: 7, c: 2, rhMinPct: 80 });
    expect(MATERIAL_CLASSES.sensitive).toMatchObject({ k1BelowOne: 0.578, k1FromOne: 0.386, a: 0.3, b: 6, c: 1, rhMinPct: 80 });
    expect(MATERIAL_CLASSES["medium-resistant"]).toMatchObject({
      k1BelowOne: 0.072,
      k1FromOne: 0.097,
      a: 0,
      b: 5,
      c: 1.5,
      rhMinPct: 85,
    });
    expect(MATERIAL_CLASSES.resistant).toMatchObject({ k1BelowOne: 0.033, k1FromOne: 0.014, a: 0, b: 3, c: 1, rhMinPct: 85 });
  });

  it("uses decline factors 1 / 0.5 / 0.25 / 0.1", () => {
    // 1 for very sensitive: TRADE.md §3 [S]. 0.5 / 0.25 / 0.1: relative decline coefficients
    // commonly quoted from Ojanen et al. (2010) — from memory.
    expect(MATERIAL_CLASSES["very-sensitive"].declineFactor).toBe(1);
    expect(MATERIAL_CLASSES.sensitive.declineFactor).toBe(0.5);
    expect(MATERIAL_CLASSES["medium-resistant"].declineFactor).toBe(0.25);
    expect(MATERIAL_CLASSES.resistant.declineFactor).toBe(0.1);
  });
});

describe("critical RH", () => {
  it.each([
    // Hand-computed from RHcrit = −0.00267·T³ + 0.160·T² − 3.13·T + 100 (TRADE.md §3 [S]):
    [0, 100], // 100
    [5, 88.01625], // −0.33375 + 4 − 15.65 + 100
    [10, 82.03], // −2.67 + 16 − 31.3 + 100
    [15, 80.03875], // −9.01125 + 36 − 46.95 + 100
    [20, 80.04], // −21.36 + 64 − 62.6 + 100
  ])("very sensitive at %d °C is %d %%", (t, expected) => {
    expect(criticalRelativeHumidityPct(t, "very-sensitive")).toBeCloseTo(expected, 10);
  });

  it("above 20 °C is RHmin: 80 % (very sensitive, sensitive), 85 % (medium resistant, resistant)", () => {
    // TRADE.md §3 [S]: RHmin above 20 °C. Our convention: exactly RHmin above 20 °C, so very
    // sensitive steps from the polynomial's 80.04 at 20 °C to 80 just above it.
    expect(criticalRelativeHumidityPct(20.5, "very-sensitive")).toBe(80);
    expect(criticalRelativeHumidityPct(30, "sensitive")).toBe(80);
    expect(criticalRelativeHumidityPct(25, "medium-resistant")).toBe(85);
    expect(criticalRelativeHumidityPct(25, "resistant")).toBe(85);
  });

  it("below 20 °C never drops under RHmin (our convention: max(polynomial, RHmin))", () => {
    // Polynomial at 10 °C is 82.03 (hand-computed above), under the 85 % RHmin of medium resistant.
    expect(criticalRelativeHumidityPct(10, "medium-resistant")).toBe(85);
    expect(criticalRelativeHumidityPct(5, "medium-resistant")).toBeCloseTo(88.01625, 10);
  });

  it("at the 20 °C seam: no growth at 20 °C / 80 %, growth at 20.5 °C / 80 % (our convention)", () => {
    // Our convention (mould-index.ts): 80.04 at 20 °C, 80 above. At 20.5 °C/80 %: x = 0, Mmax = A = 1,
    // k2 = 1 − exp(2.3 × (0 − 1)) = 1 − 0.1003 = 0.8997 > 0, so growth starts.
    expect(mouldGrowthRatePerDay(0, 20, 80, "very-sensitive")).toBe(0);
    expect(mouldGrowthRatePerDay(0, 20.5, 80, "very-sensitive")).toBeGreaterThan(0);
  });

  it("would catch a sign slip in the polynomial (TRADE.md §3 names this published slip)", () => {
    // Correct RHcrit(10 °C) = 82.03 %. Slips give: +0.00267·T³ → 87.37; −0.160·T² → 50.03;
    // +3.13·T → 144.63. So growth at 83 % and none at 81.9 % pins the correct signs.
    expect(mouldGrowthRatePerDay(0, 10, 83, "very-sensitive")).toBeGreaterThan(0);
    expect(mouldGrowthRatePerDay(0, 10, 81.9, "very-sensitive")).toBe(0);
    expect(mouldGrowthRatePerDay(0, 5, 88.5, "very-sensitive")).toBeGreaterThan(0); // RHcrit(5) = 88.016
    expect(mouldGrowthRatePerDay(0, 5, 87.9, "very-sensitive")).toBe(0);
  });
});

describe("growth", () => {
  it("one hourly step at 20 °C / 97 % from M = 0 (very sensitive), hand-computed", () => {
    // Hukka & Viitanen (1999) / 2010 update equations (TRADE.md §3 [S]), by hand:
    //   RHcrit(20) = 80.04
    //   x = (80.04 − 97)/(80.04 − 100) = −16.96/−19.96 = 0.849699
    //   Mmax = 1 + 7·0.849699 − 2·0.849699² = 1 + 5.947896 − 1.443978 = 5.503918
    //   k2 = 1 − exp(2.3·(0 − 5.503918)) = 1 − exp(−12.659) = 1 − 3.18e−6 = 0.9999968
    //   ln 20 = 2.995732, ln 97 = 4.574711
    //   exponent = −0.68·2.995732 − 13.9·4.574711 + 66.02 = −2.037098 − 63.588483 + 66.02 = 0.394419
    //   7·exp(0.394419) = 7 × 1.483523 = 10.384659
    //   dM/dt = 1 × 0.9999968 / 10.384659 = 0.0962956 per DAY
    //   one hour: 0.0962956 / 24 = 0.00401232
    expect(maximumMouldIndex(20, 97, "very-sensitive")).toBeCloseTo(5.503918, 6);
    expect(mouldGrowthRatePerDay(0, 20, 97, "very-sensitive")).toBeCloseTo(0.0962956, 7);
    expect(run("very-sensitive", 20, 97, 1).m).toBeCloseTo(0.00401232, 8);
  });

  it("20 °C / 97 %: ≈0.67 after 7 days, ≈1.7 after 14 days, plateau ≈5.5", () => {
    // TRADE.md §3 [D], derived (hourly Euler steps from M = 0, very sensitive). By hand:
    //   7 days: 168 h × 0.00401232 = 0.6741 (k1 = 1 throughout, M < 1).
    //   M passes 1 at hour 250 (250 × 0.00401232 = 1.0031); the next 86 h run at k1 = 2:
    //   1.0031 + 86 × 2 × 0.00401232 = 1.6932 at 14 days.
    //   Plateau: Mmax = 5.5039 (hand-computed in the previous test).
    expect(run("very-sensitive", 20, 97, 7 * 24).m).toBeCloseTo(0.67, 2);
    expect(run("very-sensitive", 20, 97, 14 * 24).m).toBeCloseTo(1.69, 2);
    expect(Math.abs(run("very-sensitive", 20, 97, 14 * 24).m - 1.7)).toBeLessThan(0.05);
    expect(run("very-sensitive", 20, 97, 365 * 24).m).toBeCloseTo(5.5, 1);
    expect(run("very-sensitive", 20, 97, 365 * 24).m).toBeCloseTo(5.503918, 5);
  });

  it("20 °C / 85 % on a medium-resistant material stays 0", () => {
    // TRADE.md §3 [D], derived: RHcrit = 85 (RHmin), x = (85 − 85)/(85 − 100) = 0, Mmax = A = 0,
    // so k2 = 1 − exp(2.3·(0 − 0)) = 0: no growth.
    expect(run("medium-resistant", 20, 85, 365 * 24).m).toBe(0);
  });

  it("switches k1 at M = 1", () => {
    // TRADE.md §3 [S]: very sensitive k1 = 1 below M = 1, 2 from M = 1. k2 barely moves between
    // M = 0.9999 and 1 (both ≈ 1 − 3.2e−5), so the rate doubles.
    const below = mouldGrowthRatePerDay(0.9999, 20, 97, "very-sensitive");
    const from = mouldGrowthRatePerDay(1, 20, 97, "very-sensitive");
    expect(from / below).toBeCloseTo(2, 3);
  });

  it("stops at Mmax (k2 = 0)", () => {
    // TRADE.md §3 [S]: k2 = max(1 − exp(2.3·(M − Mmax)), 0).
    const mMax = maximumMouldIndex(20, 97, "very-sensitive");
    expect(mouldGrowthRatePerDay(mMax, 20, 97, "very-sensitive")).toBe(0);
    expect(mouldGrowthRatePerDay(mMax + 0.1, 20, 97, "very-sensitive")).toBe(0);
  });

  // Property tests of the published equations' shape (TRADE.md §3 [S]).
  it("no growth below RHcrit, nor at or below 0 °C", () => {
    fc.assert(
      fc.property(
        fc.constantFrom<MaterialSensitivity>("very-sensitive", "sensitive", "medium-resistant", "resistant"),
        fc.double({ min: 0.5, max: 45, noNaN: true }),
        fc.double({ min: 0.01, max: 30, noNaN: true }),
        fc.double({ min: 0, max: 5, noNaN: true }),
        (material, t, below, m) => {
          const rh = criticalRelativeHumidityPct(t, material) - below;
          expect(mouldGrowthRatePerDay(m, t, rh, material)).toBe(0);
          expect(mouldGrowthRatePerDay(m, -t, 99, material)).toBe(0);
        },
      ),
    );
  });

  it("grows faster at higher RH", () => {
    fc.assert(
      fc.property(
        fc.constantFrom<MaterialSensitivity>("very-sensitive", "sensitive", "medium-resistant", "resistant"),
        fc.double({ min: 1, max: 45, noNaN: true }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        fc.double({ min: 0.5, max: 5, noNaN: true }),
        (material, t, share, step) => {
          const rhCrit = criticalRelativeHumidityPct(t, material);
          const rh = rhCrit + share * (100 - step - rhCrit);
          expect(mouldGrowthRatePerDay(0, t, rh + step, material)).toBeGreaterThan(mouldGrowthRatePerDay(0, t, rh, material));
        },
      ),
    );
  });
});

describe("decline", () => {
  it("−0.00133/h for the first 6 h, 0 from 6 h to 24 h, −0.000667/h after (very sensitive)", () => {
    // TRADE.md §3 [S], decline per HOUR, material factor 1. By hand from M = 1 at 20 °C / 50 %:
    //   after 6 h: 1 − 6 × 0.00133 = 0.99202
    //   after 24 h: still 0.99202
    //   after 48 h: 0.99202 − 24 × 0.000667 = 0.976012
    expect(run("very-sensitive", 20, 50, 3, 1, 1).m).toBeCloseTo(1 - 3 * 0.00133, 12);
    expect(run("very-sensitive", 20, 50, 6, 1, 1).m).toBeCloseTo(0.99202, 12);
    expect(run("very-sensitive", 20, 50, 24, 1, 1).m).toBeCloseTo(0.99202, 12);
    expect(run("very-sensitive", 20, 50, 48, 1, 1).m).toBeCloseTo(0.976012, 12);
  });

  it("scales by the material's decline factor", () => {
    // Sensitive: factor 0.5 (from memory). 48 h: 1 − 0.5 × (6 × 0.00133 + 24 × 0.000667) = 1 − 0.011994 = 0.988006.
    expect(run("sensitive", 20, 50, 48, 1, 1).m).toBeCloseTo(0.988006, 12);
    expect(mouldDecline(0, 48, "very-sensitive")).toBeCloseTo(0.023988, 12);
  });

  it("does not go below 0 and restarts its clock when conditions turn favourable", () => {
    // Hukka & Viitanen (1999): M ≥ 0, and the decline clock runs from when conditions turned
    // unfavourable (TRADE.md §3 [S]). 10 h dry from M = 0.005: 6 × 0.00133 = 0.00798 > 0.005 → 0.
    const state = createMouldIndexState("very-sensitive", 0.005);
    for (let i = 0; i < 10; i++) stepMouldIndex(state, 20, 50, 1);
    expect(state.m).toBe(0);
    stepMouldIndex(state, 20, 97, 1);
    expect(state.unfavourableHours).toBe(0);
  });
});

describe("units: per-day growth, per-hour decline (TRADE.md §3 names mixing them as a published slip)", () => {
  it("one hour of growth is 1/24 of the daily rate, not the daily rate", () => {
    // Hand-computed above: 0.0962956 per day → 0.00401232 in one hour. Applying the daily rate
    // per hour would give 0.0963 here and M ≈ 5.5 within a week instead of 0.67.
    const oneHour = run("very-sensitive", 20, 97, 1).m;
    expect(oneHour).toBeCloseTo(mouldGrowthRatePerDay(0, 20, 97, "very-sensitive") / 24, 12);
    expect(run("very-sensitive", 20, 97, 7 * 24).m).toBeLessThan(1);
  });

  it("one hour of decline is 0.00133, not 0.00133/24 nor 24 × 0.00133", () => {
    // TRADE.md §3 [S]: −0.00133 per hour for the first 6 h.
    expect(1 - run("very-sensitive", 20, 50, 1, 1, 1).m).toBeCloseTo(0.00133, 12);
  });

  it("does not depend on the step length", () => {
    // Growth before M = 1 is near-linear (only k2 moves, by ~1e−5), so 7 days in 15-min, 1-h and
    // 3-h steps agree to 1e−6; decline is integrated exactly over its 6 h / 24 h breakpoints.
    const hourly = run("very-sensitive", 20, 97, 168, 1).m;
    expect(run("very-sensitive", 20, 97, 168, 0.25).m).toBeCloseTo(hourly, 6);
    expect(run("very-sensitive", 20, 97, 168, 3).m).toBeCloseTo(hourly, 6);
    const dryHourly = run("very-sensitive", 20, 50, 48, 1, 1).m;
    expect(run("very-sensitive", 20, 50, 48, 0.5, 1).m).toBeCloseTo(dryHourly, 12);
    expect(run("very-sensitive", 20, 50, 48, 2.5 + 0.5, 1).m).toBeCloseTo(dryHourly, 12);
    expect(run("very-sensitive", 20, 50, 48, 48, 1).m).toBeCloseTo(dryHourly, 12);
  });
});
