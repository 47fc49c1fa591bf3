// The dashboard's figures that are not plain counts: percentiles of working days, rates per 100 homes,
// London months, and the smallest group that may be shown. Pure; the server's SQL hands over counts.
//
// Conventions:
// - Median: the middle value, or the mean of the two middle values for an even count (the usual
//   definition; from memory). 90th percentile: the nearest-rank method, the ⌈0.9·n⌉-th smallest value
//   (Wikipedia, "Percentile", nearest-rank method; from memory). Both always give a value the data
//   can hold for the percentile, and need no interpolation between working days.
// - The SQL groups durations by value (working days → how many cases), so a percentile is read from
//   that frequency table: 100 000 cases become a few dozen rows.
// - Groups under MIN_GROUP_SIZE cases are never shown (ours: a lead must not read a fix's worth from
//   two or three homes, and small groups can point at one household).
// - Months are London calendar months: each runs from 00:00 London on the 1st (a UTC instant that
//   moves with BST) to the next month's start.
import { endOfLocalDay, localDate, type IsoDate } from "./working-days.js";

export const MIN_GROUP_SIZE = 5;

/** How many cases took each value (e.g. working days). Values need not be sorted. */
export interface Frequency {
  value: number;
  count: number;
}

function sorted(freq: readonly Frequency[]): Frequency[] {
  return freq.filter((f) => f.count > 0).sort((a, b) => a.value - b.value);
}

/** The k-th smallest value (1-based) of a frequency table. */
function kth(freq: readonly Frequency[], k: number): number {
  let seen = 0;
  for (const f of freq) {
    seen += f.count;
    if (seen >= k) return f.value;
  }
  throw new RangeError(`kth: only ${seen} values, asked for the ${k}th`);
}

export const totalOf = (freq: readonly Frequency[]): number => freq.reduce((s, f) => s + f.count, 0);

/** Median of a frequency table; null when empty. */
export function medianOf(freq: readonly Frequency[]): number | null {
  const s = sorted(freq);
  const n = totalOf(s);
  if (n === 0) return null;
  if (n % 2 === 1) return kth(s, (n + 1) / 2);
  return (kth(s, n / 2) + kth(s, n / 2 + 1)) / 2;
}

/** Nearest-rank percentile (0 < p ≤ 100) of a frequency table; null when empty. */
export function percentileOf(freq: readonly Frequency[], p: number): number | null {
  if (!(p > 0 && p <= 100)) throw new RangeError(`percentile must be in (0, 100], got ${p}`);
  const s = sorted(freq);
  const n = totalOf(s);
  if (n === 0) return null;
  return kth(s, Math.ceil((p / 100) * n - 1e-9));
}

/** Median of plain values; null when empty. */
export const medianOfValues = (values: readonly number[]): number | null =>
  medianOf(values.map((value) => ({ value, count: 1 })));

/** Cases per 100 homes, to one decimal; null when there are no homes. */
export function perHundredHomes(cases: number, homes: number): number | null {
  if (homes <= 0) return null;
  return Math.round((cases / homes) * 1000) / 10;
}

/** Share as a percentage to one decimal; null when the whole is 0. */
export function percentOf(part: number, whole: number): number | null {
  if (whole <= 0) return null;
  return Math.round((part / whole) * 1000) / 10;
}

/** Whether a group is big enough to show. */
export const showable = (count: number): boolean => count >= MIN_GROUP_SIZE;

export interface LondonMonth {
  /** "YYYY-MM" */
  month: string;
  /** 00:00 London on the 1st, as a UTC instant. */
  start: Date;
  /** The next month's start. */
  end: Date;
}

const startOfLondonDay = (date: IsoDate): Date => {
  const [y, m, d] = date.split("-").map(Number) as [number, number, number];
  const before = new Date(Date.UTC(y, m - 1, d - 1));
  return new Date(endOfLocalDay(before.toISOString().slice(0, 10)).getTime() + 1);
};

/** The London months that overlap [from, to), oldest first. */
export function londonMonths(from: Date, to: Date): LondonMonth[] {
  const out: LondonMonth[] = [];
  const first = localDate(from);
  let y = Number(first.slice(0, 4));
  let m = Number(first.slice(5, 7));
  for (;;) {
    const start = startOfLondonDay(`${y}-${String(m).padStart(2, "0")}-01`);
    if (start.getTime() >= to.getTime()) break;
    const ny = m === 12 ? y + 1 : y;
    const nm = m === 12 ? 1 : m + 1;
    const end = startOfLondonDay(`${ny}-${String(nm).padStart(2, "0")}-01`);
    out.push({ month: `${y}-${String(m).padStart(2, "0")}`, start, end });
    y = ny;
    m = nm;
  }
  return out;
}

/** The start of the London day of `date` (YYYY-MM-DD). */
export const londonDayStart = startOfLondonDay;
