// Before/after the works on a constructed series, with the engine's numbers checked by hand.
import { describe, expect, it } from "vitest";
import { compareBeforeAfter, MIN_AFTER_HOURS } from "../../src/lib/domain/verification.js";

const HOUR = 3_600_000;
const WORKS = Date.UTC(2026, 0, 12, 12); // Mon 12 January 2026, 12:00 UTC

/** Saturation vapour pressure over water, hPa: the Magnus form with Alduchov & Eskridge (1996) constants (from memory). */
const magnus = (t: number) => 6.1094 * Math.exp((17.625 * t) / (t + 243.04));

function hourly(
  fromMs: number,
  n: number,
  reading: { airTemperatureC: number; relativeHumidityPct: number; surfaceTemperatureC: number },
) {
  return Array.from({ length: n }, (_, i) => ({ at: new Date(fromMs + i * HOUR).toISOString(), ...reading }));
}

describe("compareBeforeAfter", () => {
  // Before: a bedroom at 20 °C and 70 % with the wall at 15 °C, for two days (48 hourly readings).
  // After: 20 °C and 50 % with the wall at 17 °C (better ventilated and warmer), for two days.
  const before = hourly(WORKS - 48 * HOUR, 48, { airTemperatureC: 20, relativeHumidityPct: 70, surfaceTemperatureC: 15 });
  const after = hourly(WORKS, 48, { airTemperatureC: 20, relativeHumidityPct: 50, surfaceTemperatureC: 17 });
  const result = compareBeforeAfter({ readings: [...after, ...before], worksDoneAt: new Date(WORKS) });

  it("splits the readings at the works and works out surface humidity as RH × ps(air) / ps(surface)", () => {
    expect(result.before.count).toBe(48);
    expect(result.after.count).toBe(48);
    // By hand: 70 × 23.389 / 17.056 = 95.99 % before; 50 × 23.389 / 19.380 = 60.34 % after (Magnus, A&E constants).
    const byHandBefore = (70 * magnus(20)) / magnus(15);
    const byHandAfter = (50 * magnus(20)) / magnus(17);
    expect(byHandBefore).toBeCloseTo(95.99, 1);
    expect(byHandAfter).toBeCloseTo(60.34, 1);
    // psychrolib's over-water saturation pressure differs from Magnus by well under 0.5 %.
    expect(result.before.meanSurfaceRhPct!).toBeCloseTo(byHandBefore, 0);
    expect(Math.abs(result.before.meanSurfaceRhPct! - byHandBefore)).toBeLessThan(0.3);
    expect(Math.abs(result.after.meanSurfaceRhPct! - byHandAfter)).toBeLessThan(0.3);
  });

  it("counts the hours at or above 80 % surface RH: every one of the 47 hours before, none after", () => {
    // 48 hourly readings span 47 hours; each interval takes the state of the reading that starts it.
    expect(result.before.coveredHours).toBe(47);
    expect(result.before.hoursSurfaceRhAtLeast80).toBe(47);
    expect(result.before.hoursAtLeast80PerDay).toBeCloseTo(24, 6);
    expect(result.after.hoursSurfaceRhAtLeast80).toBe(0);
    expect(result.after.hoursAtLeast80PerDay).toBe(0);
  });

  it("lets the mould index grow before and not after, and calls it improved", () => {
    // 47 hours at 96 % surface RH and 20 °C: the VTT index grows (TRADE.md §3: growth needs RH above RHcrit, 80 % here).
    expect(result.before.mouldIndexFinal!).toBeGreaterThan(0);
    // After: 60 % is below RHcrit, so from a clean surface the index stays at 0.
    expect(result.after.mouldIndexFinal).toBe(0);
    expect(result.improved).toBe(true);
    expect(result.points).toHaveLength(96);
    expect(result.points[0]!.phase).toBe("before");
    expect(result.points.at(-1)!.phase).toBe("after");
  });

  it("does not judge with less than a day of readings after the works, and says no when it is no better", () => {
    const tooShort = compareBeforeAfter({
      readings: [...before, ...hourly(WORKS, 10, { airTemperatureC: 20, relativeHumidityPct: 50, surfaceTemperatureC: 17 })],
      worksDoneAt: new Date(WORKS),
    });
    expect(tooShort.after.coveredHours).toBeLessThan(MIN_AFTER_HOURS);
    expect(tooShort.improved).toBeNull();
    const same = compareBeforeAfter({
      readings: [...before, ...hourly(WORKS, 48, { airTemperatureC: 20, relativeHumidityPct: 72, surfaceTemperatureC: 15 })],
      worksDoneAt: new Date(WORKS),
    });
    expect(same.improved).toBe(false);
    const none = compareBeforeAfter({ readings: before, worksDoneAt: new Date(WORKS) });
    expect(none.after).toMatchObject({ count: 0, meanSurfaceRhPct: null });
    expect(none.improved).toBeNull();
  });
});
