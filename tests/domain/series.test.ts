import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  createMouldIndexState,
  evaluateSeries,
  moistureLoadBoundaryGPerM3,
  moistureLoadClass,
  mouldIndexTrajectory,
  stepMouldIndex,
  worstRollingMean,
} from "../../src/lib/domain/index.js";
import type { SeriesReading } from "../../src/lib/domain/index.js";

const H = 3_600_000;
const T0 = Date.UTC(2025, 0, 6);

type Conditions = Omit<SeriesReading, "at">;

/** Readings at the given hour offsets from T0, as ISO strings. */
function at(hours: readonly number[], conditions: (i: number, hour: number) => Conditions): SeriesReading[] {
  return hours.map((hour, i) => ({ at: new Date(T0 + hour * H).toISOString(), ...conditions(i, hour) }));
}
const range = (count: number, step = 1): number[] => Array.from({ length: count }, (_, i) => i * step);
const air = (t: number, rh: number): Conditions => ({ airTemperatureC: t, relativeHumidityPct: rh });

describe("evaluateSeries shape and ordering", () => {
  it("returns exactly the agreed keys; moistureExcess only with outdoor readings", () => {
    // Issue 3 brief: the public API returns this shape verbatim.
    const base = [
      "count",
      "from",
      "to",
      "hoursSurfaceRhAtLeast80",
      "hoursCondensing",
      "worstRolling30DayMeanSurfaceRhPct",
      "mouldIndex",
      "gaps",
      "diagnosis",
    ];
    const without = evaluateSeries({ readings: at(range(48), () => air(20, 50)) });
    expect(Object.keys(without)).toEqual(base);
    const withOutdoor = evaluateSeries({ readings: at(range(48), () => ({ ...air(20, 50), outdoorTemperatureC: 5 })) });
    expect(Object.keys(withOutdoor)).toEqual([...base.slice(0, 8), "moistureExcess", "diagnosis"]);
    expect(Object.keys(withOutdoor.moistureExcess!)).toEqual(["meanGPerM3", "loadClass"]);
    expect(Object.keys(without.mouldIndex)).toEqual(["final", "max", "material"]);
    expect(Object.keys(without.diagnosis)).toEqual(["kind", "reasons"]);
    expect(JSON.parse(JSON.stringify(withOutdoor))).toEqual(withOutdoor);
  });

  it("sorts readings by time; count, from and to as ISO 8601", () => {
    // Issue 3 brief: readings sorted by time first; count is the number of readings; times ISO 8601.
    const sorted = at(range(30), (i) => air(20, 60 + i));
    const shuffled = [...sorted].reverse();
    shuffled.push(shuffled.shift()!);
    const a = evaluateSeries({ readings: sorted });
    const b = evaluateSeries({ readings: shuffled });
    expect(b).toEqual(a);
    expect(a.count).toBe(30);
    expect(a.from).toBe("2025-01-06T00:00:00.000Z");
    expect(a.to).toBe("2025-01-07T05:00:00.000Z");
  });

  it("accepts Date objects as times", () => {
    // Issue 3 brief: at is Date | ISO string. Air-only readings at 85 % → 4 hourly intervals at ≥ 80 %.
    const readings = range(5).map((h) => ({ at: new Date(T0 + h * H), ...air(20, 85) }));
    expect(evaluateSeries({ readings }).hoursSurfaceRhAtLeast80).toBe(4);
  });

  it("handles an empty series", () => {
    // Our convention (series.ts): no readings → nulls and insufficient-data.
    const r = evaluateSeries({ readings: [] });
    expect(r).toMatchObject({
      count: 0,
      from: null,
      to: null,
      hoursSurfaceRhAtLeast80: 0,
      worstRolling30DayMeanSurfaceRhPct: null,
    });
    expect(r.diagnosis.kind).toBe("insufficient-data");
  });

  it("throws RangeError on NaN readings and bad times", () => {
    // Issue 3 brief: the module throws RangeError on NaN inputs.
    expect(() => evaluateSeries({ readings: at([0, 1], () => air(Number.NaN, 50)) })).toThrow(RangeError);
    expect(() => evaluateSeries({ readings: at([0, 1], () => ({ ...air(20, 50), surfaceTemperatureC: Number.NaN })) })).toThrow(
      RangeError,
    );
    expect(() => evaluateSeries({ readings: [{ at: "not a time", ...air(20, 50) }] })).toThrow(RangeError);
  });
});

describe("hours and gaps", () => {
  it("counts hours at ≥ 80 % and ≥ 100 %, each reading holding until the next", () => {
    // Our convention: a reading's state holds until the next reading (step function).
    // Air 20 °C / 60 %: pv = 1403.28 Pa, dew point 12.01 °C (TRADE.md §1 [D]). Surface RH by hand
    // with psat from ASHRAE eq. 6 via psychrolib:
    //   10 °C: 1403.28/1227.995 = 114.3 % (condensing) — readings 0–4
    //   13 °C: 1403.28/1497.81 = 93.7 % (mould-risk) — readings 5–9
    //   18 °C: 1403.28/2064.29 = 68.0 % (dry) — readings 10–14
    // Hourly: intervals 0→5 condensing (5 h), 0→10 at ≥ 80 % (10 h); reading 14 holds nothing.
    const r = evaluateSeries({
      readings: at(range(15), (i) => ({ ...air(20, 60), surfaceTemperatureC: i < 5 ? 10 : i < 10 ? 13 : 18 })),
    });
    expect(r.hoursCondensing).toBeCloseTo(5, 12);
    expect(r.hoursSurfaceRhAtLeast80).toBeCloseTo(10, 12);
  });

  it("reports a gap over 3 h and integrates nothing across it; exactly 3 h is integrated", () => {
    // Our convention: over 3 h is a gap. Air-only readings at 85 %: surface RH = 85 %.
    const r = evaluateSeries({ readings: at([0, 1, 2, 7, 8, 9], () => air(20, 85)) });
    expect(r.gaps).toEqual([{ from: "2025-01-06T02:00:00.000Z", to: "2025-01-06T07:00:00.000Z" }]);
    expect(r.hoursSurfaceRhAtLeast80).toBeCloseTo(4, 12); // 0→1, 1→2, 7→8, 8→9
    const three = evaluateSeries({ readings: at([0, 3, 6.5], () => air(20, 85)) });
    expect(three.gaps).toHaveLength(1); // 3 → 6.5 is 3.5 h
    expect(three.hoursSurfaceRhAtLeast80).toBeCloseTo(3, 12); // 0 → 3 counted
  });

  it("estimates the surface from the element for readings with an outdoor temperature", () => {
    // Solid wall fRsi 0.475 (1 − 2.1 × 0.25; U from memory): 0 + 0.475 × 20 = 9.5 °C, below the
    // 12.01 °C dew point of 20 °C / 60 % → condensing for each hour.
    const r = evaluateSeries({
      element: "solid-wall",
      readings: at(range(25), () => ({ ...air(20, 60), outdoorTemperatureC: 0 })),
    });
    expect(r.hoursCondensing).toBeCloseTo(24, 12);
  });
});

describe("worst 30-day rolling mean surface RH", () => {
  it("40 days with days 5–34 at 90 % and the rest at 50 % → 90 %", () => {
    // Constructed: hourly readings, hours 120–839 at 90 % hold [120 h, 840 h) = exactly 30 days.
    const r = evaluateSeries({ readings: at(range(961), (_, h) => air(20, h >= 120 && h < 840 ? 90 : 50)) });
    expect(r.worstRolling30DayMeanSurfaceRhPct).toBeCloseTo(90, 9);
  });

  it("a series shorter than 30 days gives the mean over what there is", () => {
    // Our convention. 120 h at 60 % then 120 h at 80 %: (120 × 60 + 120 × 80)/240 = 70 %.
    const r = evaluateSeries({ readings: at(range(241), (_, h) => air(20, h < 120 ? 60 : 80)) });
    expect(r.worstRolling30DayMeanSurfaceRhPct).toBeCloseTo(70, 9);
  });

  it("skips windows covered for less than 15 days (our convention)", () => {
    // Days 0–10 at 50 %, days 10–20 at 90 %, then nothing until one reading on day 40.
    // A window starting on day s covers 20 − s days, so s ≤ 5; the worst is s = 5:
    // (5 × 50 + 10 × 90)/15 = 1150/15 = 76.667 %. Without the rule, day 19 would give 90 %.
    const hours = [...range(481), 960];
    const r = evaluateSeries({ readings: at(hours, (_, h) => air(20, h < 240 || h === 960 ? 50 : 90)) });
    expect(r.worstRolling30DayMeanSurfaceRhPct).toBeCloseTo(1150 / 15, 9);
  });

  it("matches a brute-force search on random step series", () => {
    // Independent O(n²) reference: direct integration over every window aligned to a reading
    // (start or end), and over a dense grid of other positions. Without a cover minimum, no grid
    // position may beat the aligned windows (a step function's window mean is linear-fractional
    // between alignments). With the 15-day-style cover minimum, the best window can sit where the
    // cover just reaches the minimum, between alignments: we only look at aligned windows there
    // (our convention), so that case is compared with the aligned reference only.
    const W = 24;
    const gap = 3;
    const brute = (t: number[], v: number[], cover: number, step: number | undefined) => {
      const integrate = (a: number, b: number) => {
        let i = 0;
        let c = 0;
        for (let k = 0; k < t.length - 1; k++) {
          if (t[k + 1]! - t[k]! > gap) continue;
          const lo = Math.max(a, t[k]!);
          const hi = Math.min(b, t[k + 1]!);
          if (hi > lo) {
            i += v[k]! * (hi - lo);
            c += hi - lo;
          }
        }
        return [i, c] as const;
      };
      const first = t[0]!;
      const last = t[t.length - 1]!;
      const starts =
        step === undefined
          ? [...t, ...t.map((x) => x - W)]
          : Array.from({ length: Math.floor((last - W - first) / step) + 1 }, (_, k) => first + step * k);
      let m = -Infinity;
      for (const a of starts) {
        if (a < first - 1e-9 || a + W > last + 1e-9) continue;
        const [i, c] = integrate(a, a + W);
        if (c > 0 && c >= cover) m = Math.max(m, i / c);
      }
      return m;
    };
    const series = fc.array(
      fc.tuple(fc.double({ min: 0.25, max: 5, noNaN: true }), fc.double({ min: 30, max: 100, noNaN: true })),
      { minLength: 20, maxLength: 80 },
    );
    const build = (steps: [number, number][]) => {
      const t: number[] = [];
      const v: number[] = [];
      let now = 0;
      for (const [dt, rh] of steps) {
        t.push(now);
        v.push(rh);
        now += dt;
      }
      return { t, v, ms: Float64Array.from(t, (h) => h * H), values: Float64Array.from(v) };
    };
    fc.assert(
      fc.property(series, (steps) => {
        const { t, v, ms, values } = build(steps);
        const aligned = brute(t, v, 12, undefined);
        if (t[t.length - 1]! - t[0]! < W || aligned === -Infinity) return; // fallbacks tested above
        expect(worstRollingMean(ms, values, W, 12, gap)).toBeCloseTo(aligned, 7);
      }),
      { numRuns: 200 },
    );
    fc.assert(
      fc.property(series, (steps) => {
        const { t, v, ms, values } = build(steps);
        const aligned = brute(t, v, 1e-9, undefined);
        if (t[t.length - 1]! - t[0]! < W || aligned === -Infinity) return;
        const ours = worstRollingMean(ms, values, W, 1e-9, gap)!;
        expect(ours).toBeCloseTo(aligned, 7);
        expect(ours + 1e-7).toBeGreaterThanOrEqual(brute(t, v, 1e-9, 0.1));
      }),
      { numRuns: 200 },
    );
  });
});

describe("mould index over a series", () => {
  it("follows the stepper: 7 days at 20 °C / 97 % → 0.674 (very sensitive by default)", () => {
    // Same hand computation as mould-index.test.ts: 168 h × 0.00401232 = 0.6741 (TRADE.md §3 [D] ≈ 0.67).
    const r = evaluateSeries({ readings: at(range(169), () => air(20, 97)) });
    expect(r.mouldIndex.material).toBe("very-sensitive");
    expect(r.mouldIndex.final).toBeCloseTo(0.674, 3);
    expect(r.mouldIndex.max).toBe(r.mouldIndex.final);
  });

  it("uses the readings' own intervals: uneven steps give the same index", () => {
    // Step length independence (see mould-index.test.ts): 30-min and 90-min steps alternate.
    const uneven: number[] = [0];
    while (uneven[uneven.length - 1]! < 168) uneven.push(uneven[uneven.length - 1]! + (uneven.length % 2 ? 0.5 : 1.5));
    const r = evaluateSeries({ readings: at(uneven, () => air(20, 97)) });
    expect(r.mouldIndex.final).toBeCloseTo(evaluateSeries({ readings: at(range(169), () => air(20, 97)) }).mouldIndex.final, 6);
  });

  it("does not integrate across a gap", () => {
    // 72 h, a 10 h gap, 72 h: the index is that of 144 h of growth, not 154 h.
    const hours = [...range(73), ...range(73).map((h) => h + 82)];
    const r = evaluateSeries({ readings: at(hours, () => air(20, 97)) });
    const state = createMouldIndexState("very-sensitive");
    for (let h = 0; h < 144; h++) stepMouldIndex(state, 20, 97, 1);
    expect(r.mouldIndex.final).toBeCloseTo(state.m, 12);
    expect(r.gaps).toHaveLength(1);
  });

  it("takes the surface's temperature and RH, RH capped at 100 %", () => {
    // Window at 9 °C under 19 °C / 78 % air: surface RH 149.3 % (point.test.ts), modelled as 9 °C / 100 %.
    const r = evaluateSeries({ readings: at(range(49), () => ({ ...air(19, 78), surfaceTemperatureC: 9 })) });
    const state = createMouldIndexState("very-sensitive");
    for (let h = 0; h < 48; h++) stepMouldIndex(state, 9, 100, 1);
    expect(r.mouldIndex.final).toBeCloseTo(state.m, 12);
  });

  it("honours the material", () => {
    // TRADE.md §3 [D]: 20 °C / 85 % on medium resistant stays 0.
    const r = evaluateSeries({ material: "medium-resistant", readings: at(range(24 * 30), () => air(20, 85)) });
    expect(r.mouldIndex).toEqual({ final: 0, max: 0, material: "medium-resistant" });
  });

  it("trajectory: one point per reading, or a downsample keeping peaks and the last point", () => {
    // Our convention (series.ts mouldIndexTrajectory): highest point per run, plus the last reading.
    // 5 days wet (20 °C / 97 %), then 5 days dry (20 °C / 50 %): the index rises then declines.
    const readings = at(range(241), (_, h) => air(20, h < 120 ? 97 : 50));
    const full = mouldIndexTrajectory({ readings });
    expect(full).toHaveLength(241);
    expect(full[0]).toEqual({ at: "2025-01-06T00:00:00.000Z", m: 0 });
    const peak = Math.max(...full.map((p) => p.m));
    expect(peak).toBeCloseTo(evaluateSeries({ readings }).mouldIndex.max, 12);
    const small = mouldIndexTrajectory({ readings }, { maxPoints: 12 });
    expect(small.length).toBeLessThanOrEqual(12);
    expect(small[small.length - 1]).toEqual(full[full.length - 1]);
    expect(Math.max(...small.map((p) => p.m))).toBe(peak);
  });
});

describe("moisture excess and load class", () => {
  it("class boundaries: 2, 4, 6, 8, 10 g/m³ at ≤ 0 °C, falling linearly to 0 at 20 °C", () => {
    // ISO 13788 internal moisture load classes — TRADE.md §2, from memory.
    expect([1, 2, 3, 4, 5].map((c) => moistureLoadBoundaryGPerM3(c, -5))).toEqual([2, 4, 6, 8, 10]);
    expect([1, 2, 3, 4, 5].map((c) => moistureLoadBoundaryGPerM3(c, 10))).toEqual([1, 2, 3, 4, 5]);
    expect(moistureLoadBoundaryGPerM3(5, 20)).toBe(0);
    // The class is the lowest whose boundary is ≥ the excess (our reading of the brief).
    expect(moistureLoadClass(1.5, 0)).toBe(1);
    expect(moistureLoadClass(6, 0)).toBe(3);
    expect(moistureLoadClass(6.01, 0)).toBe(4);
    expect(moistureLoadClass(12, -3)).toBe(5);
    expect(moistureLoadClass(2.5, 10)).toBe(3);
  });

  it("20 °C / 60 % inside, 0 °C outside with outdoor RH assumed 85 % → 6.25 g/m³, class 4", () => {
    // By hand (ideal gas, psat from ASHRAE eq. 6, Rv = 461.523):
    //   inside: 0.6 × 2338.80 / (461.523 × 293.15) = 10.3720 g/m³
    //   outside: 0.85 × 611.213 / (461.523 × 273.15) = 4.1211 g/m³ (85 %: common practice, no source;
    //   outdoor RH is over water at 0 °C too, WMO-No. 8 convention: e_w(0 °C) = 611.213 Pa, not e_i = 611.154)
    //   excess 6.2508 g/m³; at 0 °C the class boundaries are 2, 4, 6, 8 (from memory) → class 4.
    const r = evaluateSeries({ readings: at(range(48), () => ({ ...air(20, 60), outdoorTemperatureC: 0 })) });
    expect(r.moistureExcess!.meanGPerM3).toBeCloseTo(6.2508, 4);
    expect(r.moistureExcess!.loadClass).toBe(4);
  });

  it("uses the measured outdoor RH when given", () => {
    // Outside at 0 °C / 100 % over water (WMO-No. 8): 611.213 / (461.523 × 273.15) = 4.8484 g/m³;
    // excess 10.3720 − 4.8484 = 5.5236 → class 3.
    const r = evaluateSeries({
      readings: at(range(48), () => ({ ...air(20, 60), outdoorTemperatureC: 0, outdoorRelativeHumidityPct: 100 })),
    });
    expect(r.moistureExcess!.meanGPerM3).toBeCloseTo(5.5236, 4);
    expect(r.moistureExcess!.loadClass).toBe(3);
    expect(r.diagnosis.reasons.some((s) => s.includes("taken as 85 %"))).toBe(false);
  });

  it("is absent without outdoor readings", () => {
    expect(evaluateSeries({ readings: at(range(48), () => air(20, 60)) }).moistureExcess).toBeUndefined();
  });
});
