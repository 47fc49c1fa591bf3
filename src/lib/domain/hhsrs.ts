// HHSRS (England) hazard 1, damp and mould growth: checking an officer's assessment, the hazard
// score, its band and its category. Formula and scale points: TRADE.md §4.
//
// Rounding rule (ours; TRADE.md §4 asks for one):
// - The band is decided on the exact, unrounded score. Bands are half-open, [lower edge, next
//   edge up): A ≥ 5000, B 2000 ≤ s < 5000, C 1000 ≤ s < 2000, D 500 ≤ s < 1000, E 200 ≤ s < 500,
//   F 100 ≤ s < 200, G 50 ≤ s < 100, H 20 ≤ s < 50, I 10 ≤ s < 20, J 0 ≤ s < 10.
//   The published bands are written in whole numbers (B 2000–4999, J ≤ 9), which leaves scores
//   such as 4999.5 or 9.5 between bands; half-open bands agree with the published ones on every
//   whole number and give a score in such a gap to the lower band. A score reaches a band only
//   when it reaches that band's edge, so 999.99 is band D and Category 2: rounding never turns a
//   hazard into Category 1, which carries a duty to act.
// - For display the score is cut (not rounded) to two decimal places, so the figure shown never
//   reaches an edge the score has not: 999.9998 shows as 999.99, never 1000.00 next to band D.
// - Exactness: every spread value is a whole number of tenths of a per cent, so the numerator
//   10000·O1 + 1000·O2 + 300·O3 + 10·O4 is a whole number and the score is one whole number
//   divided by another. Below an edge such a quotient sits at least 1/L under it, far more than
//   floating-point error, so comparing it with the whole-number edges is exact.
//
// Spread rule (ours): each class takes a representative point, except that at most one class may
// hold the remainder that makes the four total 100 (TRADE.md's check vectors put 89.0 and 95.3 in
// class IV, neither a representative point). Values are given to one decimal place, the precision
// of the representative points, so the total can be checked exactly: it must be 100.0. No wider
// tolerance (such as 99–101) is needed, because the remainder class absorbs the rounding of the
// representative points; and a wider one would hide real weight: a missing 1 % of class I is
// worth 100/L score points, enough to move a hazard across a band edge.
import { requireFinite } from "./guards.js";

/** "1 in L": the likelihood's representative scale points (SI 2005/3208; TRADE.md §4). */
export const LIKELIHOOD_POINTS = [5600, 3200, 1800, 1000, 560, 320, 180, 100, 56, 32, 18, 10, 6, 3, 2, 1] as const;

/** Spread-of-harm representative points, % (TRADE.md §4, from memory). */
export const SPREAD_POINTS = [0, 0.1, 0.2, 0.5, 1.0, 2.2, 4.6, 10.0, 21.5, 46.4, 100] as const;

/** Weights for classes of harm I–IV (TRADE.md §4 formula). */
export const CLASS_WEIGHTS = [10000, 1000, 300, 10] as const;

export const HARM_CLASSES = ["I", "II", "III", "IV"] as const;
export type HarmClass = (typeof HARM_CLASSES)[number];

export type Band = "A" | "B" | "C" | "D" | "E" | "F" | "G" | "H" | "I" | "J";

export interface BandRange {
  band: Band;
  /** Lowest score in the band (inclusive). */
  min: number;
  /** First score above the band (exclusive); null for band A. */
  below: number | null;
  category: 1 | 2;
}

/** Highest band first. Edges: TRADE.md §4 (from memory); half-open intervals: our rounding rule above. */
export const BANDS: readonly BandRange[] = [
  { band: "A", min: 5000, below: null, category: 1 },
  { band: "B", min: 2000, below: 5000, category: 1 },
  { band: "C", min: 1000, below: 2000, category: 1 },
  { band: "D", min: 500, below: 1000, category: 2 },
  { band: "E", min: 200, below: 500, category: 2 },
  { band: "F", min: 100, below: 200, category: 2 },
  { band: "G", min: 50, below: 100, category: 2 },
  { band: "H", min: 20, below: 50, category: 2 },
  { band: "I", min: 10, below: 20, category: 2 },
  { band: "J", min: 0, below: 10, category: 2 },
];

/** Category 1 = bands A–C, a score of 1000 or more (TRADE.md §4). */
export const CATEGORY_1_MIN_SCORE = 1000;

export function bandFor(score: number): Band {
  requireFinite(score, "HHSRS score");
  if (score < 0) throw new RangeError(`HHSRS score cannot be negative, got ${score}`);
  // BANDS is ordered from the top, and J starts at 0, so a band is always found.
  return BANDS.find((range) => score >= range.min)!.band;
}

export function categoryFor(band: Band): 1 | 2 {
  return BANDS.find((range) => range.band === band)!.category;
}

export interface HhsrsAssessment {
  /** L in "1 in L": a representative scale point. */
  likelihood: number;
  /** Spread of harm over classes I–IV, %. */
  spread: readonly [number, number, number, number];
}

export interface AssessmentProblem {
  field: "likelihood" | "spread";
  /** 0–3 for a problem with one class's value (class I–IV). */
  index?: number;
  message: string;
}

// Slack when turning a percentage into tenths: absorbs binary noise (0.1 + 0.2), nothing more.
const TENTHS_EPSILON = 1e-6;
const SPREAD_POINT_TENTHS = new Set<number>(SPREAD_POINTS.map((p) => Math.round(p * 10)));
const LIKELIHOOD_SET = new Set<number>(LIKELIHOOD_POINTS);

function toTenths(value: number): number | null {
  const scaled = value * 10;
  const tenths = Math.round(scaled);
  return Math.abs(scaled - tenths) <= TENTHS_EPSILON ? tenths : null;
}

function formatTenths(tenths: number): string {
  return (tenths / 10).toFixed(1);
}

export function validateAssessment(assessment: HhsrsAssessment): AssessmentProblem[] {
  const problems: AssessmentProblem[] = [];
  const { likelihood, spread } = assessment;

  if (typeof likelihood !== "number" || !Number.isFinite(likelihood)) {
    problems.push({ field: "likelihood", message: 'The likelihood must be a number: the L in "1 in L".' });
  } else if (!LIKELIHOOD_SET.has(likelihood)) {
    problems.push({
      field: "likelihood",
      message: `The likelihood must be one of the representative scale points: 1 in ${LIKELIHOOD_POINTS.join(", ")}; got 1 in ${likelihood}.`,
    });
  }

  if (!Array.isArray(spread) || spread.length !== 4) {
    problems.push({
      field: "spread",
      message: "The spread of harm needs four percentages, one for each class of harm, I to IV.",
    });
    return problems;
  }

  const tenths: number[] = [];
  spread.forEach((value, index) => {
    const name = `Class ${HARM_CLASSES[index]}`;
    if (typeof value !== "number" || !Number.isFinite(value)) {
      problems.push({ field: "spread", index, message: `${name} must be a percentage.` });
    } else if (value < 0 || value > 100) {
      problems.push({ field: "spread", index, message: `${name} must be between 0 and 100 %, got ${value}.` });
    } else {
      const t = toTenths(value);
      if (t === null) {
        problems.push({ field: "spread", index, message: `${name} must be given to one decimal place at most, got ${value}.` });
      } else {
        tenths[index] = t;
      }
    }
  });
  if (tenths.filter((t) => t !== undefined).length !== 4) return problems;

  const offPoint = tenths.flatMap((t, index) => (SPREAD_POINT_TENTHS.has(t) ? [] : [index]));
  if (offPoint.length > 1) {
    const names = offPoint.map((index) => `${HARM_CLASSES[index]} (${formatTenths(tenths[index])})`).join(", ");
    problems.push({
      field: "spread",
      message:
        `Each class takes a representative point (${SPREAD_POINTS.join(", ")}), except one class that holds ` +
        `the remainder to make 100; these classes are not on a point: ${names}.`,
    });
  }

  const total = tenths.reduce((sum, t) => sum + t, 0);
  if (total !== 1000) {
    problems.push({ field: "spread", message: `The four percentages must total 100; they total ${formatTenths(total)}.` });
  }
  return problems;
}

export interface HhsrsResult {
  /** The exact score, unrounded: bands are decided on this. */
  score: number;
  /** The score cut to two decimal places, for display (never rounded up across a band edge). */
  displayScore: number;
  band: Band;
  category: 1 | 2;
}

/** Throws a RangeError listing the problems when the assessment is not valid. */
export function hhsrsScore(assessment: HhsrsAssessment): HhsrsResult {
  const problems = validateAssessment(assessment);
  if (problems.length > 0) {
    throw new RangeError(`Invalid HHSRS assessment: ${problems.map((p) => p.message).join(" ")}`);
  }
  const { likelihood, spread } = assessment;
  // 10000·O1 with O1 in tenths is 1000·tenths: the numerator as a whole number.
  const numerator = spread.reduce((sum, value, index) => sum + (CLASS_WEIGHTS[index] / 10) * toTenths(value)!, 0);
  const score = numerator / likelihood;
  const band = bandFor(score);
  return {
    score,
    displayScore: Math.floor((numerator * 100) / likelihood) / 100,
    band,
    category: categoryFor(band),
  };
}
