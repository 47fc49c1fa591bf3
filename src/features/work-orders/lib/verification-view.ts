// Numbers of the before/after comparison as people read them, and the chart's series.
import { formatDay } from "@/lib/dates";
import { fixed, surfaceHumidity } from "@/lib/domain/wording";
import type { BeforeAfter, PeriodSummary } from "../api/case-types";

/** Surface humidity: above 100 % is said as condensing (src/lib/domain/wording.ts). */
export const pct = (v: number | null) => (v === null ? "–" : surfaceHumidity(v));
export const hours = (v: number | null) => (v === null ? "–" : `${fixed(v, 1)} h`);
export const index = (v: number | null) => (v === null ? "–" : fixed(v, 2));

const when = (iso: string | null) => (iso ? formatDay(iso) : null);

/** "3 Nov 2026 to 24 Nov 2026", or a dash without readings. */
export function period(p: PeriodSummary): string {
  const from = when(p.from);
  const to = when(p.to);
  if (!from || !to) return "–";
  return from === to ? from : `${from} to ${to}`;
}

export type Verdict = "improved" | "not-improved" | "too-few";

export const verdictOf = (c: BeforeAfter): Verdict =>
  c.improved === null ? "too-few" : c.improved ? "improved" : "not-improved";

export const VERDICT_WORDS: Record<Verdict, string> = {
  improved: "Improved",
  "not-improved": "Not improved",
  "too-few": "Not enough readings yet",
};

/** The rows of the comparison table: what, before, after. */
export function comparisonRows(c: BeforeAfter): [string, string, string][] {
  const { before: b, after: a } = c;
  return [
    ["Mean surface humidity", pct(b.meanSurfaceRhPct), pct(a.meanSurfaceRhPct)],
    ["Highest surface humidity", pct(b.maxSurfaceRhPct), pct(a.maxSurfaceRhPct)],
    [
      "Hours at or above 80 % surface humidity",
      hours(b.count ? b.hoursSurfaceRhAtLeast80 : null),
      hours(a.count ? a.hoursSurfaceRhAtLeast80 : null),
    ],
    ["… per day of readings", hours(b.hoursAtLeast80PerDay), hours(a.hoursAtLeast80PerDay)],
    ["Mould index at the end", index(b.mouldIndexFinal), index(a.mouldIndexFinal)],
    ["Number of readings", b.count.toLocaleString("en-GB"), a.count.toLocaleString("en-GB")],
    ["Period", period(b), period(a)],
  ];
}

/** The chart's text alternative: the same story in a sentence or two. */
export function chartSummary(roomName: string, c: BeforeAfter): string {
  const part = (label: string, p: PeriodSummary) =>
    p.count === 0
      ? `${label}: no readings`
      : `${label}: ${p.count.toLocaleString("en-GB")} ${p.count === 1 ? "reading" : "readings"}, mean ${pct(p.meanSurfaceRhPct)}, highest ${pct(p.maxSurfaceRhPct)}, ${hours(p.hoursSurfaceRhAtLeast80)} at or above 80 %`;
  return `Surface humidity in ${roomName} over time, with the works on ${when(c.worksDoneAt) ?? "–"} marked. ${part("Before the works", c.before)}. ${part("After the works", c.after)}.`;
}

export interface VerificationSeries {
  /** Unix seconds, ascending. */
  t: number[];
  before: (number | null)[];
  after: (number | null)[];
  /** Unix seconds of the works. */
  worksAt: number;
}

export function verificationSeries(c: BeforeAfter): VerificationSeries {
  const points = [...c.points].sort((x, y) => Date.parse(x.at) - Date.parse(y.at));
  return {
    t: points.map((p) => Date.parse(p.at) / 1000),
    before: points.map((p) => (p.phase === "before" ? Math.min(100, p.surfaceRhPct) : null)),
    after: points.map((p) => (p.phase === "after" ? Math.min(100, p.surfaceRhPct) : null)),
    worksAt: Date.parse(c.worksDoneAt) / 1000,
  };
}
