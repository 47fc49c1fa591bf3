// Triage priority: a score from 0 to 100 that orders the officers' queue, shown on the case page
// as the parts it is made of. It ranks; it does not decide. Every report is investigated whatever
// its score, and the statutory deadlines run whatever its score.
//
// The weights are our own choice (no standard sets them), all in TRIAGE_WEIGHTS. Principles:
// - An emergency hazard past a deadline comes first (make-safe, or any later stage of an
//   emergency case): it scores 100 whatever else is true, and nothing else can. The ordinary
//   factor maxima total 99, so every other case scores at most 99; for an overdue emergency a
//   last part, "emergency-overdue", makes up the difference to 100 (listed only when it applies).
//   The parts always add up to the score, and the cap at 100 never has to cut anything. Before
//   this rule an emergency 8 hours past its make-safe scored 46 and sat below a case due in 4 days.
// - The tenant saying it has got worse raises the score at once, for 14 days (TRIAGE_WEIGHTS
//   .reportedWorse): a worsening the readings or an inspection have not caught up with yet.
// - An HHSRS Category 1 finding is the largest single factor: it is a legal finding that the
//   hazard must be dealt with. Children under 15 are the HHSRS vulnerable group for damp and mould
//   growth (TRADE.md §4), so they count among the most.
// - A missing answer is never scored as the safest one: no readings yet count like a borderline
//   reading, an unknown area like an A4-sized patch, a skipped vulnerability question above
//   "none of these", and a case not yet assessed like a Category 2 hazard, so an assessment can
//   raise a case (Category 1) but never lower it.
// - Every factor is monotone: a wetter state, a higher mould index, a larger area, another
//   vulnerable group, Category 1, a recurrence, a nearer deadline or a recent "it's got worse"
//   never lowers the score.
import type { SurfaceState } from "./surface.js";
import { isAbsent, requireFinite } from "./guards.js";
import { MAX_MOULD_INDEX } from "./mould-index.js";
import { fixed } from "./wording.js";

// The same values as AREAS and VULNERABILITIES in src/lib/schemas/case-report.ts (a test checks);
// repeated here so domain code does not depend on the schema module.
export const TRIAGE_AREAS = ["hand", "a4", "door", "larger"] as const;
export type TriageArea = (typeof TRIAGE_AREAS)[number];
export const TRIAGE_VULNERABILITIES = ["children-under-15", "over-65", "breathing-or-immune", "pregnancy", "disability"] as const;
export type TriageVulnerability = (typeof TRIAGE_VULNERABILITIES)[number];

export const TRIAGE_FACTORS = [
  "surface-state",
  "mould-index",
  "affected-area",
  "vulnerability",
  "hhsrs",
  "recurrence",
  "deadline",
  "reported-worse",
  "emergency-overdue",
] as const;
export type TriageFactor = (typeof TRIAGE_FACTORS)[number];

export interface TriageInput {
  /** The risk engine's state for the worst surface; "unknown" when there are no readings. */
  surfaceState: SurfaceState | "unknown";
  /** VTT mould index, 0–6; null when none has been worked out. */
  mouldIndex: number | null;
  /** The size the tenant reported. */
  affectedArea: TriageArea | "unknown";
  /** An empty list means "none of these"; "skipped" means the question was not answered. */
  vulnerabilities: readonly TriageVulnerability[] | "skipped" | "unknown";
  /** HHSRS category if an assessment has been made; null when not assessed. */
  hhsrsCategory: 1 | 2 | null;
  /** Another case at the same property within the last 12 months. */
  recurrence: boolean;
  /** Hours until the case's next deadline, negative when overdue; null when none is running. */
  hoursUntilDeadline: number | null;
  /** The case is classified an emergency hazard (absent: not known to be one). */
  emergency?: boolean;
  /** Hours since the tenant last said it has got worse; null or absent when they have not. */
  hoursSinceReportedWorse?: number | null;
}

export interface TriagePart {
  factor: TriageFactor;
  points: number;
  max: number;
  explanation: string;
}

export interface TriagePriority {
  score: number;
  parts: TriagePart[];
}

/** Our own choice: every weight of the triage priority, in one place. */
export const TRIAGE_WEIGHTS = {
  surfaceState: { max: 18, condensing: 18, "mould-risk": 13, borderline: 6, unknown: 6, dry: 0 },
  /** One point per whole step of the mould index, up to 6. */
  mouldIndex: { max: 6, perWholeStep: 1, unknown: 0 },
  affectedArea: { max: 10, larger: 10, door: 8, a4: 5, unknown: 5, hand: 2 },
  /** The highest group counts in full, each further group adds a little, up to the maximum. */
  vulnerability: {
    max: 20,
    groups: { "children-under-15": 16, "breathing-or-immune": 16, pregnancy: 12, "over-65": 10, disability: 10 },
    eachFurtherGroup: 2,
    skippedOrUnknown: 4,
    none: 0,
  },
  hhsrs: { max: 24, category1: 24, category2: 4, notAssessed: 4 },
  recurrence: { max: 4, yes: 4, no: 0 },
  /** Steps by hours until the next deadline; a step applies up to and including its hours. */
  deadline: {
    max: 12,
    overdue: 12,
    steps: [
      { withinHours: 24, points: 11 },
      { withinHours: 72, points: 8 },
      { withinHours: 168, points: 4 },
      { withinHours: 336, points: 2 },
    ],
    later: 0,
    none: 0,
  },
  /** The tenant said it has got worse within the last `withinHours` (14 days). */
  reportedWorse: { max: 5, recent: 5, withinHours: 336, none: 0 },
} as const;

export const MAX_TRIAGE_SCORE = 100;
/** The highest score any case but an overdue emergency can reach (the TRIAGE_WEIGHTS maxima total). */
export const MAX_ORDINARY_TRIAGE_SCORE = 99;

const VULNERABILITY_WORDS: Record<TriageVulnerability, string> = {
  "children-under-15": "children under 15",
  "over-65": "someone aged 65 or over",
  "breathing-or-immune": "someone with a breathing condition or a weakened immune system",
  pregnancy: "someone who is pregnant",
  disability: "someone with a disability or long-term illness",
};

function surfaceStatePart(state: TriageInput["surfaceState"]): TriagePart {
  const w = TRIAGE_WEIGHTS.surfaceState;
  const explanation: Record<TriageInput["surfaceState"], string> = {
    condensing: "The readings show water condensing on the surface.",
    "mould-risk": "The readings show the surface damp enough for mould to grow.",
    borderline: "The readings show the surface close to damp enough for mould to grow.",
    dry: "The readings show the surface dry enough that mould is not expected to grow.",
    unknown: "There are no readings yet, so this counts the same as a borderline reading until there are.",
  };
  return { factor: "surface-state", points: w[state], max: w.max, explanation: explanation[state] };
}

function mouldIndexPart(mouldIndex: number | null): TriagePart {
  const w = TRIAGE_WEIGHTS.mouldIndex;
  if (isAbsent(mouldIndex)) {
    return {
      factor: "mould-index",
      points: w.unknown,
      max: w.max,
      explanation: "No mould index has been worked out from readings yet.",
    };
  }
  requireFinite(mouldIndex, "mould index");
  if (mouldIndex < 0 || mouldIndex > MAX_MOULD_INDEX) {
    throw new RangeError(`mould index must be within 0..${MAX_MOULD_INDEX}, got ${mouldIndex}`);
  }
  const steps = Math.floor(mouldIndex);
  // Stages of the VTT scale as TRADE.md §3 describes them.
  const stage =
    mouldIndex >= 4
      ? "visible mould covering a tenth of the surface or more"
      : mouldIndex >= 3
        ? "the first visible mould"
        : mouldIndex >= 1
          ? "early mould growth, too small to see"
          : "no mould growth to speak of yet";
  return {
    factor: "mould-index",
    points: Math.min(w.max, steps * w.perWholeStep),
    max: w.max,
    explanation: `The mould index from the readings is ${fixed(mouldIndex, 1)} of 6, which means ${stage}.`,
  };
}

function affectedAreaPart(area: TriageInput["affectedArea"]): TriagePart {
  const w = TRIAGE_WEIGHTS.affectedArea;
  const explanation: Record<TriageInput["affectedArea"], string> = {
    larger: "The report describes damp or mould over an area bigger than a door.",
    door: "The report describes damp or mould over an area about the size of a door.",
    a4: "The report describes damp or mould over an area about the size of a sheet of A4 paper.",
    hand: "The report describes damp or mould over an area about the size of a hand or smaller.",
    unknown: "The report does not say how large the area is, so it counts as about A4 size until someone checks.",
  };
  return { factor: "affected-area", points: w[area], max: w.max, explanation: explanation[area] };
}

function vulnerabilityPart(vulnerabilities: TriageInput["vulnerabilities"]): TriagePart {
  const w = TRIAGE_WEIGHTS.vulnerability;
  if (vulnerabilities === "skipped" || vulnerabilities === "unknown") {
    const said =
      vulnerabilities === "skipped"
        ? "The question about who lives in the home was not answered"
        : "It is not recorded who lives in the home";
    return {
      factor: "vulnerability",
      points: w.skippedOrUnknown,
      max: w.max,
      explanation: `${said}, so a few points are added in case someone there is more at risk; it is worth asking and recording.`,
    };
  }
  const groups = [...new Set(vulnerabilities)].sort((a, b) => w.groups[b] - w.groups[a]);
  if (groups.length === 0) {
    return {
      factor: "vulnerability",
      points: w.none,
      max: w.max,
      explanation: "The household said none of the listed groups lives in the home.",
    };
  }
  const points = Math.min(w.max, w.groups[groups[0]] + w.eachFurtherGroup * (groups.length - 1));
  const children = groups.includes("children-under-15")
    ? " Children under 15 are the group most at risk from damp and mould in the housing health and safety rating system."
    : "";
  return {
    factor: "vulnerability",
    points,
    max: w.max,
    explanation: `The household includes ${listWords(groups.map((g) => VULNERABILITY_WORDS[g]))}, who can be harmed more by damp and mould.${children}`,
  };
}

function hhsrsPart(category: 1 | 2 | null): TriagePart {
  const w = TRIAGE_WEIGHTS.hhsrs;
  if (category === 1) {
    return {
      factor: "hhsrs",
      points: w.category1,
      max: w.max,
      explanation: "An HHSRS assessment found a Category 1 hazard, which must be dealt with.",
    };
  }
  if (category === 2) {
    return { factor: "hhsrs", points: w.category2, max: w.max, explanation: "An HHSRS assessment found a Category 2 hazard." };
  }
  return {
    factor: "hhsrs",
    points: w.notAssessed,
    max: w.max,
    explanation: "No HHSRS assessment has been made yet; this counts the same as a Category 2 hazard until one is.",
  };
}

function recurrencePart(recurrence: boolean): TriagePart {
  const w = TRIAGE_WEIGHTS.recurrence;
  return recurrence
    ? {
        factor: "recurrence",
        points: w.yes,
        max: w.max,
        explanation: "There has been another case at this home in the last 12 months, so the cause may not have been fixed.",
      }
    : {
        factor: "recurrence",
        points: w.no,
        max: w.max,
        explanation: "There has been no other case at this home in the last 12 months.",
      };
}

function deadlinePart(hours: number | null): TriagePart {
  const w = TRIAGE_WEIGHTS.deadline;
  if (isAbsent(hours)) {
    return { factor: "deadline", points: w.none, max: w.max, explanation: "No deadline is running for this case." };
  }
  requireFinite(hours, "hours until deadline");
  if (hours < 0) {
    return { factor: "deadline", points: w.overdue, max: w.max, explanation: "The next deadline has passed." };
  }
  const step = w.steps.find((s) => hours <= s.withinHours);
  if (step) {
    return {
      factor: "deadline",
      points: step.points,
      max: w.max,
      explanation: `The next deadline is ${dueWithin(step.withinHours)}.`,
    };
  }
  const last = w.steps[w.steps.length - 1].withinHours;
  return {
    factor: "deadline",
    points: w.later,
    max: w.max,
    explanation: `The next deadline is more than ${dueWithinWords(last)} away.`,
  };
}

function dueWithin(withinHours: number): string {
  return `due within ${dueWithinWords(withinHours)}`;
}

function dueWithinWords(withinHours: number): string {
  if (withinHours === 24) return "a day";
  if (withinHours % 168 === 0) return withinHours === 168 ? "a week" : `${withinHours / 168} weeks`;
  if (withinHours % 24 === 0) return `${withinHours / 24} days`;
  return `${withinHours} hours`;
}

function listWords(words: string[]): string {
  if (words.length <= 1) return words.join("");
  return `${words.slice(0, -1).join(", ")} and ${words[words.length - 1]}`;
}

function reportedWorsePart(hours: number | null | undefined): TriagePart {
  const w = TRIAGE_WEIGHTS.reportedWorse;
  if (isAbsent(hours)) {
    return { factor: "reported-worse", points: w.none, max: w.max, explanation: "The tenant has not said it has got worse." };
  }
  requireFinite(hours, "hours since the tenant said it got worse");
  if (hours <= w.withinHours) {
    return {
      factor: "reported-worse",
      points: w.recent,
      max: w.max,
      explanation: `The tenant said it has got worse ${hours < 24 ? "today or yesterday" : `${Math.floor(hours / 24)} days ago`}, which the readings may not show yet.`,
    };
  }
  return {
    factor: "reported-worse",
    points: w.none,
    max: w.max,
    explanation: `The tenant last said it has got worse more than ${dueWithinWords(w.withinHours)} ago.`,
  };
}

/** An emergency hazard whose next deadline has passed (make-safe, or a later stage). */
export function isOverdueEmergency(input: Pick<TriageInput, "emergency" | "hoursUntilDeadline">): boolean {
  return input.emergency === true && !isAbsent(input.hoursUntilDeadline) && input.hoursUntilDeadline < 0;
}

export function triagePriority(input: TriageInput): TriagePriority {
  const parts = [
    surfaceStatePart(input.surfaceState),
    mouldIndexPart(input.mouldIndex),
    affectedAreaPart(input.affectedArea),
    vulnerabilityPart(input.vulnerabilities),
    hhsrsPart(input.hhsrsCategory),
    recurrencePart(input.recurrence),
    deadlinePart(input.hoursUntilDeadline),
    reportedWorsePart(input.hoursSinceReportedWorse),
  ];
  const ordinary = parts.reduce((sum, part) => sum + part.points, 0);
  if (isOverdueEmergency(input)) {
    const lift = MAX_TRIAGE_SCORE - ordinary;
    parts.push({
      factor: "emergency-overdue",
      points: lift,
      max: lift,
      explanation:
        "This is an emergency hazard and its deadline has passed, so it goes to the top of the queue whatever else it scores.",
    });
    return { score: MAX_TRIAGE_SCORE, parts };
  }
  // The ordinary maxima total 99, so this clamp is a guard that never cuts: parts always add up to the score.
  return { score: Math.max(0, Math.min(MAX_ORDINARY_TRIAGE_SCORE, ordinary)), parts };
}

/**
 * Hours from now until the deadline factor of a case whose next deadline is `hoursUntilDeadline`
 * away next changes by the clock alone (a step boundary is crossed, or the deadline passes);
 * null when it will not change again (already overdue, or no deadline). A queue keeps its stored
 * scores true by working them out again at that moment.
 */
export function hoursUntilDeadlinePartChanges(hoursUntilDeadline: number | null): number | null {
  if (isAbsent(hoursUntilDeadline)) return null;
  requireFinite(hoursUntilDeadline, "hours until deadline");
  if (hoursUntilDeadline < 0) return null;
  // Steps apply up to and including their hours, so the part changes once `hours` reaches the next
  // step down; at 0 it is still "due", and overdue strictly after.
  const boundaries = [...TRIAGE_WEIGHTS.deadline.steps.map((s) => s.withinHours), 0].sort((a, b) => b - a);
  const next = boundaries.find((b) => b < hoursUntilDeadline);
  return next === undefined ? hoursUntilDeadline : hoursUntilDeadline - next;
}
