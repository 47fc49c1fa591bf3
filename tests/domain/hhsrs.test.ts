import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  BANDS,
  CATEGORY_1_MIN_SCORE,
  CLASS_WEIGHTS,
  LIKELIHOOD_POINTS,
  SPREAD_POINTS,
  bandFor,
  categoryFor,
  hhsrsScore,
  validateAssessment,
} from "../../src/lib/domain/index.js";
import type { Band, HhsrsAssessment } from "../../src/lib/domain/index.js";

type Spread = HhsrsAssessment["spread"];

describe("HHSRS scale points and weights", () => {
  it("likelihood points are SI 2005/3208's representative scale points", () => {
    // TRADE.md §4 [S]: the HHSRS (England) Regulations 2005, SI 2005/3208.
    expect([...LIKELIHOOD_POINTS]).toEqual([5600, 3200, 1800, 1000, 560, 320, 180, 100, 56, 32, 18, 10, 6, 3, 2, 1]);
  });

  it("spread points are the remembered list", () => {
    // TRADE.md §4, from memory [M].
    expect([...SPREAD_POINTS]).toEqual([0, 0.1, 0.2, 0.5, 1.0, 2.2, 4.6, 10.0, 21.5, 46.4, 100]);
  });

  it("spread points above 0 are 10^(k/3) to one decimal place, which catches a mistyped point", () => {
    // Derived: the remembered points follow a third-of-a-decade geometric scale (our observation,
    // not a source), so a typo in the [M] list would break the pattern.
    const geometric = [-3, -2, -1, 0, 1, 2, 3, 4, 5, 6].map((k) => Math.round(10 ** (k / 3) * 10) / 10);
    expect(SPREAD_POINTS.slice(1)).toEqual(geometric);
  });

  it("class weights are 10000, 1000, 300, 10", () => {
    // TRADE.md §4 [S] formula: (10000·O1 + 1000·O2 + 300·O3 + 10·O4) / L.
    expect([...CLASS_WEIGHTS]).toEqual([10000, 1000, 300, 10]);
  });
});

describe("hhsrsScore: TRADE.md check vectors", () => {
  it("L = 3, O = (0, 1.0, 10.0, 89.0) → 4890/3 = 1630.0, band C, Category 1", () => {
    // TRADE.md §4 check vector [D], derived.
    const r = hhsrsScore({ likelihood: 3, spread: [0, 1.0, 10.0, 89.0] });
    expect(r.score).toBeCloseTo(1630.0, 10);
    expect(r.displayScore).toBe(1630);
    expect(r.band).toBe("C");
    expect(r.category).toBe(1);
  });

  it("L = 100, O = (0, 0.1, 4.6, 95.3) → 2433/100 = 24.33, band H, Category 2", () => {
    // TRADE.md §4 check vector [D], derived; Category 2 because H is below C (TRADE.md §4 [S]).
    const r = hhsrsScore({ likelihood: 100, spread: [0, 0.1, 4.6, 95.3] });
    expect(r.score).toBeCloseTo(24.33, 10);
    expect(r.displayScore).toBe(24.33);
    expect(r.band).toBe("H");
    expect(r.category).toBe(2);
  });
});

describe("bands: our rounding rule (half-open [lower edge, next edge up), decided on the unrounded score)", () => {
  it("the table holds edges 5000 … 10 and 0, half-open and contiguous", () => {
    // Edges: TRADE.md §4 bands, from memory [M]; half-open intervals: our own documented rule.
    expect(BANDS.map((b) => [b.band, b.min, b.below])).toEqual([
      ["A", 5000, null],
      ["B", 2000, 5000],
      ["C", 1000, 2000],
      ["D", 500, 1000],
      ["E", 200, 500],
      ["F", 100, 200],
      ["G", 50, 100],
      ["H", 20, 50],
      ["I", 10, 20],
      ["J", 0, 10],
    ]);
    for (let i = 1; i < BANDS.length; i++) expect(BANDS[i].below).toBe(BANDS[i - 1].min);
  });

  it.each([
    // [score, band]. Edges: TRADE.md §4 bands, from memory [M]. Placement at and just below each
    // edge, and of non-whole scores in the gaps of the whole-number bands: our own documented rule.
    [1_000_000, "A"], // the highest possible score: L = 1, O1 = 100 (derived)
    [5000, "A"],
    [4999.99, "B"],
    [4999.5, "B"], // between the published "B 2000–4999" and "A ≥ 5000": the lower band
    [2000, "B"],
    [1999.99, "C"],
    [1000, "C"],
    [999.99, "D"], // not rounded up into Category 1
    [500, "D"],
    [499.99, "E"],
    [200, "E"],
    [199.99, "F"],
    [100, "F"],
    [99.99, "G"],
    [50, "G"],
    [49.99, "H"],
    [20, "H"],
    [19.99, "I"],
    [10, "I"],
    [9.99, "J"],
    [9.5, "J"], // between the published "I 10–19" and "J ≤ 9": the lower band
    [0, "J"],
  ] as const)("score %d → band %s", (score, band) => {
    expect(bandFor(score)).toBe(band);
  });

  it("the published whole-number ranges agree with ours on every whole score up to 6000", () => {
    // TRADE.md §4 bands as written (from memory [M]): A ≥ 5000; B 2000–4999; … ; I 10–19; J ≤ 9.
    const published = (s: number): Band =>
      s >= 5000
        ? "A"
        : s >= 2000
          ? "B"
          : s >= 1000
            ? "C"
            : s >= 500
              ? "D"
              : s >= 200
                ? "E"
                : s >= 100
                  ? "F"
                  : s >= 50
                    ? "G"
                    : s >= 20
                      ? "H"
                      : s >= 10
                        ? "I"
                        : "J";
    for (let s = 0; s <= 6000; s++) expect(bandFor(s)).toBe(published(s));
  });

  it("Category 1 is exactly bands A–C, a score of 1000 or more", () => {
    // TRADE.md §4 [S]: Category 1 = bands A–C (score ≥ 1000).
    expect(CATEGORY_1_MIN_SCORE).toBe(1000);
    expect(BANDS.filter((b) => categoryFor(b.band) === 1).map((b) => b.band)).toEqual(["A", "B", "C"]);
    expect(categoryFor(bandFor(1000))).toBe(1);
    expect(categoryFor(bandFor(999.99))).toBe(2);
  });

  it("refuses a negative or non-finite score", () => {
    // Our own choice: the formula cannot give a negative score, so one means a bug upstream.
    expect(() => bandFor(-0.01)).toThrow(RangeError);
    expect(() => bandFor(Number.NaN)).toThrow(RangeError);
    expect(() => bandFor(Number.POSITIVE_INFINITY)).toThrow(RangeError);
  });
});

describe("hhsrsScore at and around the band edges", () => {
  // Vectors: every one a valid assessment found by enumerating the representative points with one
  // remainder class; expected scores by hand from the TRADE.md §4 formula (derived). Bands: our rule.
  it.each([
    [6, [0, 0, 100, 0], 5000, "A"], // 300·100/6
    [10, [0.1, 46.4, 7.1, 46.4], 4999.4, "B"], // (1000 + 46400 + 2130 + 464)/10
    [2, [0, 0.1, 10, 89.9], 1999.5, "C"], // (100 + 3000 + 899)/2
    [1000, [100, 0, 0, 0], 1000, "C"], // 10000·100/1000
    [100, [0.1, 98.7, 1, 0.2], 1000.02, "C"], // (1000 + 98700 + 300 + 2)/100
    [180, [10, 79.8, 0.2, 10], 179960 / 180, "D"], // (100000 + 79800 + 60 + 100)/180 = 999.78 (derived)
    [2, [0, 0, 0, 100], 500, "D"], // 1000/2
    [100, [0.1, 46.4, 7.1, 46.4], 499.94, "E"], // 49994/100
    [10, [0.1, 0, 0, 99.9], 199.9, "F"], // (1000 + 999)/10
    [10, [0, 0, 0, 100], 100, "F"], // 1000/10
    [1800, [10, 79.8, 0.2, 10], 179960 / 1800, "G"], // 99.98 (derived)
    [1000, [2.2, 0, 93.2, 4.6], 50.006, "G"], // (22000 + 27960 + 46)/1000
    [1000, [0.1, 46.4, 7.1, 46.4], 49.994, "H"], // 49994/1000
    [5600, [2.2, 88.6, 4.6, 4.6], 112026 / 5600, "H"], // (22000 + 88600 + 1380 + 46)/5600 = 20.0046 (derived)
    [100, [0.1, 0, 0, 99.9], 19.99, "I"], // 1999/100
    [100, [0, 0, 0, 100], 10, "I"], // 1000/100
    [3200, [0.2, 0.1, 99.6, 0.1], 31981 / 3200, "J"], // (2000 + 100 + 29880 + 1)/3200 = 9.994 (derived)
  ] as const)("L = %d, O = %j → %d, band %s", (likelihood, spread, score, band) => {
    const r = hhsrsScore({ likelihood, spread: spread as unknown as Spread });
    expect(r.score).toBeCloseTo(score, 9);
    expect(r.band).toBe(band);
    expect(r.category).toBe(["A", "B", "C"].includes(band) ? 1 : 2);
  });

  it("an exact edge is exact: 1000, 500, 100, 10 come out as whole numbers", () => {
    // Derived: the numerator is a whole number (tenths of a per cent), so Q/L is exact at an edge.
    expect(hhsrsScore({ likelihood: 1000, spread: [100, 0, 0, 0] }).score).toBe(1000);
    expect(hhsrsScore({ likelihood: 2, spread: [0, 0, 0, 100] }).score).toBe(500);
    expect(hhsrsScore({ likelihood: 6, spread: [0, 0, 100, 0] }).score).toBe(5000);
    expect(hhsrsScore({ likelihood: 100, spread: [0, 0, 0, 100] }).score).toBe(10);
  });

  it("display cuts to two decimals instead of rounding: 999.777… shows 999.77", () => {
    // Our own documented rule: cut, so the shown figure never reaches an edge the score has not.
    const r = hhsrsScore({ likelihood: 180, spread: [10, 79.8, 0.2, 10] });
    expect(r.displayScore).toBe(999.77);
    expect(r.band).toBe("D");
    expect(hhsrsScore({ likelihood: 1800, spread: [89, 10, 0, 1] }).displayScore).toBe(500); // 500.0055… (derived)
  });

  it("at L = 1 every valid spread is Category 1", () => {
    // Derived: with the four totalling 100 the numerator is at least 10·100 = 1000.
    expect(hhsrsScore({ likelihood: 1, spread: [0, 0, 0, 100] })).toMatchObject({ score: 1000, band: "C", category: 1 });
  });
});

describe("validateAssessment", () => {
  it("accepts the check vectors, all-representative spreads and a remainder in any one class", () => {
    // TRADE.md §4 check vectors [D]; the one-remainder-class rule is our own documented choice.
    expect(validateAssessment({ likelihood: 3, spread: [0, 1.0, 10.0, 89.0] })).toEqual([]);
    expect(validateAssessment({ likelihood: 100, spread: [0, 0.1, 4.6, 95.3] })).toEqual([]);
    expect(validateAssessment({ likelihood: 5600, spread: [0, 0, 0, 100] })).toEqual([]);
    expect(validateAssessment({ likelihood: 1, spread: [53.6, 46.4, 0, 0] })).toEqual([]);
    expect(validateAssessment({ likelihood: 18, spread: [0.1, 0.2, 0.5, 99.2] })).toEqual([]);
  });

  it.each([4, 0, -3, 5601, 3.2, 2.5, 1000.5])("refuses likelihood 1 in %d: not a representative scale point", (likelihood) => {
    // TRADE.md §4 [S]: SI 2005/3208 representative scale points only.
    const problems = validateAssessment({ likelihood, spread: [0, 0, 0, 100] });
    expect(problems).toHaveLength(1);
    expect(problems[0].field).toBe("likelihood");
    expect(() => hhsrsScore({ likelihood, spread: [0, 0, 0, 100] })).toThrow(RangeError);
  });

  it("refuses a likelihood that is not a number", () => {
    // Our own choice: a guard against NaN and JSON nulls reaching the formula.
    expect(validateAssessment({ likelihood: Number.NaN, spread: [0, 0, 0, 100] })[0].field).toBe("likelihood");
    expect(validateAssessment({ likelihood: null as unknown as number, spread: [0, 0, 0, 100] })[0].field).toBe("likelihood");
  });

  it("refuses a spread that is not four numbers", () => {
    // TRADE.md §4 [S]: one percentage for each of classes I–IV.
    expect(validateAssessment({ likelihood: 3, spread: [0, 0, 100] as unknown as Spread })).toMatchObject([{ field: "spread" }]);
    expect(validateAssessment({ likelihood: 3, spread: [0, 0, 0, 0, 100] as unknown as Spread })).toMatchObject([
      { field: "spread" },
    ]);
    expect(validateAssessment({ likelihood: 3, spread: [0, Number.NaN, 0, 100] })).toMatchObject([{ field: "spread", index: 1 }]);
  });

  it("refuses a value outside 0–100 or finer than one decimal place", () => {
    // 0–100: they are percentages (TRADE.md §4 [S]); one decimal place: the precision of the
    // representative points, our own documented rule.
    expect(validateAssessment({ likelihood: 3, spread: [0, -1, 1, 100] })).toContainEqual(
      expect.objectContaining({ field: "spread", index: 1 }),
    );
    expect(validateAssessment({ likelihood: 3, spread: [0, 0, 0, 100.1] })).toContainEqual(
      expect.objectContaining({ field: "spread", index: 3 }),
    );
    expect(validateAssessment({ likelihood: 3, spread: [0, 1.0, 10.0, 89.05] })).toContainEqual(
      expect.objectContaining({ field: "spread", index: 3 }),
    );
  });

  it("takes 0.1 + 0.2 style binary noise as the decimal it stands for", () => {
    // Derived: 0.1 + 0.2 is 0.30000000000000004 in binary floating point, and 100 − 10 − 1 is exact.
    expect(validateAssessment({ likelihood: 3, spread: [0, 1.0, 10.0, 100 - 10 - 1] })).toEqual([]);
    expect(validateAssessment({ likelihood: 3, spread: [0, 0.1 + 0.1, 0.1 * 46, 100 - 0.2 - 4.6] })).toEqual([]);
  });

  it("refuses more than one class off the representative points", () => {
    // Our own documented rule: every class on a point except one remainder class.
    const problems = validateAssessment({ likelihood: 3, spread: [0, 1.0, 10.5, 88.5] });
    expect(problems).toHaveLength(1);
    expect(problems[0].message).toMatch(/III \(10\.5\), IV \(88\.5\)/);
  });

  it.each([
    // [spread, total]. The four must total 100 (TRADE.md §4 [S]); exactly 100.0 at one decimal: our own documented rule.
    [[0, 1.0, 10.0, 88.9], "99.9"],
    [[0, 1.0, 10.0, 89.1], "100.1"],
    [[0, 0, 46.4, 46.4], "92.8"], // all on points, but short of 100
    [[0, 46.4, 46.4, 4.6], "97.4"],
    [[0, 46.4, 46.4, 10], "102.8"],
    [[0, 0, 0, 0], "0.0"],
    [[100, 100, 0, 0], "200.0"],
  ] as const)("refuses spread %j: totals %s", (spread, total) => {
    const problems = validateAssessment({ likelihood: 3, spread: spread as unknown as Spread });
    expect(problems).toContainEqual({ field: "spread", message: `The four percentages must total 100; they total ${total}.` });
    expect(() => hhsrsScore({ likelihood: 3, spread: spread as unknown as Spread })).toThrow(RangeError);
  });

  it("lists every problem at once", () => {
    // Our own choice: an officer's form can show them all together.
    const problems = validateAssessment({ likelihood: 4, spread: [0, 1.5, 10.5, 80] });
    expect(problems.map((p) => p.field)).toEqual(["likelihood", "spread", "spread"]);
  });
});

describe("hhsrsScore properties", () => {
  // Valid assessments: three classes on representative points, the fourth holding the remainder.
  const assessment = fc
    .tuple(
      fc.constantFrom(...LIKELIHOOD_POINTS),
      fc.constantFrom(0, 1, 2, 3),
      fc.tuple(fc.constantFrom(...SPREAD_POINTS), fc.constantFrom(...SPREAD_POINTS), fc.constantFrom(...SPREAD_POINTS)),
    )
    .filter(([, , points]) => points.reduce<number>((a, b) => a + b, 0) <= 100)
    .map(([likelihood, free, points]) => {
      const rest: number[] = [...points];
      const remainder = Math.round((100 - rest.reduce((a, b) => a + b, 0)) * 10) / 10;
      rest.splice(free, 0, remainder);
      return { likelihood, spread: rest as unknown as Spread };
    });

  it("the score matches the formula and the displayed figure never crosses into another band", () => {
    // TRADE.md §4 [S] formula; display rule: our own documented choice.
    fc.assert(
      fc.property(assessment, ({ likelihood, spread }) => {
        expect(validateAssessment({ likelihood, spread })).toEqual([]);
        const r = hhsrsScore({ likelihood, spread });
        const formula = (10000 * spread[0] + 1000 * spread[1] + 300 * spread[2] + 10 * spread[3]) / likelihood;
        expect(r.score).toBeCloseTo(formula, 6);
        expect(r.displayScore).toBeLessThanOrEqual(r.score);
        expect(r.score - r.displayScore).toBeLessThan(0.01);
        expect(bandFor(r.displayScore)).toBe(r.band);
        expect(r.category).toBe(r.score >= 1000 ? 1 : 2);
      }),
    );
  });

  it("a likelier occurrence (smaller L) never lowers the score or the band", () => {
    // Derived: the score is proportional to 1/L.
    const order = BANDS.map((b) => b.band);
    fc.assert(
      fc.property(assessment, ({ likelihood, spread }) => {
        const i = LIKELIHOOD_POINTS.indexOf(likelihood as (typeof LIKELIHOOD_POINTS)[number]);
        if (i === LIKELIHOOD_POINTS.length - 1) return;
        const here = hhsrsScore({ likelihood, spread });
        const likelier = hhsrsScore({ likelihood: LIKELIHOOD_POINTS[i + 1], spread });
        expect(likelier.score).toBeGreaterThan(here.score);
        expect(order.indexOf(likelier.band)).toBeLessThanOrEqual(order.indexOf(here.band));
      }),
    );
  });
});
