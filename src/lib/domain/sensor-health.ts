// Is a sensor working? From its reporting interval, when it last reported and its recent readings,
// at a given "now" (the app clock, never the wall clock). A sensor may have several problems at once.
// The offline rule is the issue's (no data for twice its interval); every threshold below it is our
// own choice (common practice, no source), and each reason says so.

/** The problems a sensor can have, in the order they are shown. */
export const SENSOR_PROBLEMS = ["offline", "low-battery", "flat-lined", "jumping"] as const;
export type SensorProblem = (typeof SENSOR_PROBLEMS)[number];

/** Offline once nothing has arrived for this many reporting intervals (the issue's rule). */
export const OFFLINE_AFTER_INTERVALS = 2;
/** A battery at or below this is low (ours). */
export const LOW_BATTERY_PCT = 20;
/** Air temperature and RH unchanged for at least this long, over at least FLAT_LINE_MIN_READINGS readings (ours). */
export const FLAT_LINE_MIN_MS = 6 * 3600_000;
export const FLAT_LINE_MIN_READINGS = 3;
/** A step between consecutive readings this close together is compared (ours). */
export const JUMP_MAX_GAP_MS = 15 * 60_000;
/** More than this between consecutive readings is not a room changing but a faulty sensor (ours). */
export const JUMP_TEMPERATURE_K = 5;
export const JUMP_RH_POINTS = 25;
/** The readings looked at: those of the last 24 hours before "now". */
export const HEALTH_WINDOW_MS = 24 * 3600_000;

export interface HealthReading {
  takenAt: Date;
  airTemperatureC: number;
  relativeHumidityPct: number;
  surfaceTemperatureC: number | null;
  batteryPct: number | null;
}

export interface SensorHealthInput {
  /** Its reporting interval, in seconds. */
  intervalS: number;
  /** The newest reading time stored for it, or null when it never reported. */
  lastReadingAt: Date | null;
  /** When it was set up to report (its key issued, or registered): the start of the silence when it never reported. */
  watchedSince: Date;
  /** Its readings of (at least) the last 24 hours, in any order. */
  readings: readonly HealthReading[];
  now: Date;
}

export interface SensorHealthFinding {
  problem: SensorProblem;
  /** When the behaviour began: its last reading (offline), the first low or unchanged reading, the first implausible step. */
  since: Date;
  /** In plain words, with the figures and the rule. */
  reason: string;
}

export interface SensorHealth {
  ok: boolean;
  findings: SensorHealthFinding[];
}

/** "45 min", "2 h", "3 h 5 min", "2 days 4 h": a duration rounded down to the minute. */
export function formatDuration(ms: number): string {
  const minutes = Math.max(0, Math.floor(ms / 60_000));
  const days = Math.floor(minutes / 1440);
  const hours = Math.floor((minutes % 1440) / 60);
  const mins = minutes % 60;
  if (days > 0) return `${days} ${days === 1 ? "day" : "days"}${hours ? ` ${hours} h` : ""}`;
  if (hours > 0) return `${hours} h${mins ? ` ${mins} min` : ""}`;
  if (minutes > 0) return `${mins} min`;
  return `${Math.max(0, Math.floor(ms / 1000))} s`;
}

const fixed = (n: number, digits = 1) => n.toFixed(digits);

/**
 * Offline: nothing for at least twice its interval since its last reading (or, when it never reported,
 * since it was set up). Exactly twice the interval counts as offline. Null when it is not offline.
 */
export function offlineFinding(
  intervalS: number,
  lastReadingAt: Date | null,
  watchedSince: Date,
  now: Date,
): SensorHealthFinding | null {
  const since = lastReadingAt ?? watchedSince;
  const silentMs = now.getTime() - since.getTime();
  const limitMs = OFFLINE_AFTER_INTERVALS * intervalS * 1000;
  if (silentMs < limitMs) return null;
  const rule = `it reports every ${formatDuration(intervalS * 1000)}, so it counts as offline after ${formatDuration(limitMs)}`;
  return {
    problem: "offline",
    since,
    reason: lastReadingAt
      ? `No reading for ${formatDuration(silentMs)} (${rule}).`
      : `No reading since it was set up ${formatDuration(silentMs)} ago (${rule}).`,
  };
}

function lowBatteryFinding(readings: readonly HealthReading[]): SensorHealthFinding | null {
  const withBattery = readings.filter((r) => r.batteryPct !== null);
  const newest = withBattery.at(-1);
  if (!newest || newest.batteryPct! > LOW_BATTERY_PCT) return null;
  let first = withBattery.length - 1;
  while (first > 0 && withBattery[first - 1]!.batteryPct! <= LOW_BATTERY_PCT) first--;
  return {
    problem: "low-battery",
    since: withBattery[first]!.takenAt,
    reason: `Battery at ${newest.batteryPct} % (ours: ${LOW_BATTERY_PCT} % or less is low; change it soon).`,
  };
}

function flatLineFinding(readings: readonly HealthReading[]): SensorHealthFinding | null {
  const newest = readings.at(-1);
  if (!newest) return null;
  const same = (r: HealthReading) =>
    r.airTemperatureC === newest.airTemperatureC && r.relativeHumidityPct === newest.relativeHumidityPct;
  let first = readings.length - 1;
  while (first > 0 && same(readings[first - 1]!)) first--;
  const count = readings.length - first;
  const spanMs = newest.takenAt.getTime() - readings[first]!.takenAt.getTime();
  if (spanMs < FLAT_LINE_MIN_MS || count < FLAT_LINE_MIN_READINGS) return null;
  return {
    problem: "flat-lined",
    since: readings[first]!.takenAt,
    reason:
      `The same ${fixed(newest.airTemperatureC)} °C and ${fixed(newest.relativeHumidityPct)} % RH in ${count} readings ` +
      `over ${formatDuration(spanMs)} (ours: no change at all for ${formatDuration(FLAT_LINE_MIN_MS)} or more means a stuck sensor).`,
  };
}

interface Step {
  at: Date;
  what: string;
}

function stepOf(a: HealthReading, b: HealthReading): Step | null {
  const gapMs = b.takenAt.getTime() - a.takenAt.getTime();
  if (gapMs <= 0 || gapMs > JUMP_MAX_GAP_MS) return null;
  const gap = formatDuration(gapMs);
  if (Math.abs(b.airTemperatureC - a.airTemperatureC) > JUMP_TEMPERATURE_K)
    return { at: b.takenAt, what: `air ${fixed(a.airTemperatureC)} → ${fixed(b.airTemperatureC)} °C in ${gap}` };
  if (Math.abs(b.relativeHumidityPct - a.relativeHumidityPct) > JUMP_RH_POINTS)
    return { at: b.takenAt, what: `RH ${fixed(a.relativeHumidityPct)} → ${fixed(b.relativeHumidityPct)} % in ${gap}` };
  if (
    a.surfaceTemperatureC !== null &&
    b.surfaceTemperatureC !== null &&
    Math.abs(b.surfaceTemperatureC - a.surfaceTemperatureC) > JUMP_TEMPERATURE_K
  )
    return { at: b.takenAt, what: `surface ${fixed(a.surfaceTemperatureC)} → ${fixed(b.surfaceTemperatureC)} °C in ${gap}` };
  return null;
}

function jumpFinding(readings: readonly HealthReading[]): SensorHealthFinding | null {
  const steps: Step[] = [];
  for (let i = 1; i < readings.length; i++) {
    const step = stepOf(readings[i - 1]!, readings[i]!);
    if (step) steps.push(step);
  }
  const latest = steps.at(-1);
  if (!latest) return null;
  const count = steps.length === 1 ? "1 implausible step" : `${steps.length} implausible steps`;
  return {
    problem: "jumping",
    since: steps[0]!.at,
    reason:
      `${count} in the last 24 h, the latest ${latest.what} (ours: more than ${JUMP_TEMPERATURE_K} K or ` +
      `${JUMP_RH_POINTS} RH points within ${formatDuration(JUMP_MAX_GAP_MS)} is not a real room).`,
  };
}

/** The sensor's problems at "now", or ok when it has none. Readings after "now" or older than 24 h are not looked at. */
export function sensorHealth(input: SensorHealthInput): SensorHealth {
  const nowMs = input.now.getTime();
  const recent = input.readings
    .filter((r) => r.takenAt.getTime() <= nowMs && r.takenAt.getTime() > nowMs - HEALTH_WINDOW_MS)
    .slice()
    .sort((a, b) => a.takenAt.getTime() - b.takenAt.getTime());
  const newestStored = recent.at(-1)?.takenAt ?? null;
  const lastReadingAt =
    input.lastReadingAt && (!newestStored || input.lastReadingAt >= newestStored) ? input.lastReadingAt : newestStored;
  const findings = [
    offlineFinding(input.intervalS, lastReadingAt, input.watchedSince, input.now),
    lowBatteryFinding(recent),
    flatLineFinding(recent),
    jumpFinding(recent),
  ].filter((f): f is SensorHealthFinding => f !== null);
  return { ok: findings.length === 0, findings };
}
