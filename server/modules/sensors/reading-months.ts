// Calendar months of sensor readings (UTC, as `taken_at` is stored) and the names of the monthly
// partitions of `sensor_readings` that hold them: `p202612` holds December 2026. Pure: no I/O.

/** A month as its number of months since January of year 0 (so adding months is plain addition). */
export type MonthIndex = number;

const MONTH_TEXT = /^(\d{4})-(0[1-9]|1[0-2])$/;
const PARTITION_NAME = /^p(\d{4})(0[1-9]|1[0-2])$/;

/** The UTC month an instant falls in. */
export const monthOf = (at: Date): MonthIndex => at.getUTCFullYear() * 12 + at.getUTCMonth();

/** "2026-12" → its month, or null when the text is not a month. */
export function parseMonth(text: string): MonthIndex | null {
  const m = MONTH_TEXT.exec(text);
  return m ? Number(m[1]) * 12 + Number(m[2]) - 1 : null;
}

/** The month of a monthly partition's name (`p202612`), or null for any other partition (`pmax`). */
export function monthOfPartition(name: string): MonthIndex | null {
  const m = PARTITION_NAME.exec(name);
  return m ? Number(m[1]) * 12 + Number(m[2]) - 1 : null;
}

const year = (m: MonthIndex) => Math.floor(m / 12);
const mm = (m: MonthIndex) => String((m % 12) + 1).padStart(2, "0");

/** "2026-12". */
export const monthText = (m: MonthIndex): string => `${year(m)}-${mm(m)}`;

/** `p202612`. */
export const partitionName = (m: MonthIndex): string => `p${year(m)}${mm(m)}`;

/** The first instant of the month, UTC. */
export const monthStart = (m: MonthIndex): Date => new Date(Date.UTC(year(m), m % 12, 1));

/** The partition's upper bound as MariaDB writes it: the first second of the next month. */
export const partitionBound = (m: MonthIndex): string => `${monthText(m + 1)}-01 00:00:00`;

/** The partition clause for one month: `PARTITION p202612 VALUES LESS THAN ('2027-01-01 00:00:00')`. */
export const monthPartitionSql = (m: MonthIndex): string =>
  `PARTITION ${partitionName(m)} VALUES LESS THAN ('${partitionBound(m)}')`;

/** The months from `from` through `through`, in order (empty when `from` is later). */
export function monthsBetween(from: MonthIndex, through: MonthIndex): MonthIndex[] {
  const out: MonthIndex[] = [];
  for (let m = from; m <= through; m++) out.push(m);
  return out;
}
