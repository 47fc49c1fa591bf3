// Sensor health on constructed series. Sources beside each check: the offline rule is the issue's
// ("no data for twice its interval"); the low-battery, flat-line and jump thresholds are our own
// (common practice, no source). "Now" is always given, so nothing here depends on the machine's clock.
import { describe, expect, it } from "vitest";
import { formatDuration, sensorHealth, type HealthReading } from "../../src/lib/domain/sensor-health.js";

const NOW = new Date("2026-11-20T12:00:00Z");
const MIN = 60_000;
const ago = (ms: number) => new Date(NOW.getTime() - ms);
const INSTALLED = ago(30 * 24 * 60 * MIN);

/** A reading `minutesAgo` before now: 20 °C and 60 % unless told, a battery of 80 %. */
const r = (minutesAgo: number, over: Partial<HealthReading> = {}): HealthReading => ({
  takenAt: ago(minutesAgo * MIN),
  airTemperatureC: 20,
  relativeHumidityPct: 60,
  surfaceTemperatureC: null,
  batteryPct: 80,
  ...over,
});

/** Readings every 15 minutes from `fromMin` to `toMin` minutes ago, each varying a little unless `value` pins it. */
function series(fromMin: number, toMin: number, value?: Partial<HealthReading>): HealthReading[] {
  const out: HealthReading[] = [];
  for (let m = fromMin; m >= toMin; m -= 15) out.push(r(m, value ?? { airTemperatureC: 20 + (m % 30) / 100 }));
  return out;
}

const health = (readings: HealthReading[], over: { intervalS?: number; lastReadingAt?: Date | null } = {}) =>
  sensorHealth({
    intervalS: over.intervalS ?? 900,
    lastReadingAt:
      over.lastReadingAt === undefined
        ? (readings
            .map((x) => x.takenAt)
            .sort((a, b) => +a - +b)
            .at(-1) ?? null)
        : over.lastReadingAt,
    watchedSince: INSTALLED,
    readings,
    now: NOW,
  });
const problems = (h: ReturnType<typeof health>) => h.findings.map((f) => f.problem);

describe("a working sensor", () => {
  it("is ok: reporting, moving values, a full battery", () => {
    const h = health(series(600, 0));
    expect(h.ok).toBe(true);
    expect(h.findings).toEqual([]);
  });
});

describe("offline: no data for twice its interval (the issue's rule)", () => {
  it("at exactly twice the interval it is offline; one second earlier it is not", () => {
    // 15-minute interval: offline at 30 minutes of silence.
    expect(problems(health(series(600, 30)))).toEqual(["offline"]);
    const justBefore = sensorHealth({
      intervalS: 900,
      lastReadingAt: new Date(NOW.getTime() - 30 * MIN + 1000),
      watchedSince: INSTALLED,
      readings: [],
      now: NOW,
    });
    expect(justBefore.ok).toBe(true);
  });

  it("follows the sensor's own interval (an hourly sensor is fine after 90 minutes, offline at 2 h)", () => {
    expect(health([], { intervalS: 3600, lastReadingAt: ago(90 * MIN) }).ok).toBe(true);
    const off = health([], { intervalS: 3600, lastReadingAt: ago(120 * MIN) });
    expect(off.findings).toEqual([
      {
        problem: "offline",
        since: ago(120 * MIN),
        reason: "No reading for 2 h (it reports every 1 h, so it counts as offline after 2 h).",
      },
    ]);
  });

  it("a sensor that never reported counts from when it was set up", () => {
    const h = sensorHealth({ intervalS: 900, lastReadingAt: null, watchedSince: ago(45 * MIN), readings: [], now: NOW });
    expect(h.findings).toEqual([
      {
        problem: "offline",
        since: ago(45 * MIN),
        reason: "No reading since it was set up 45 min ago (it reports every 15 min, so it counts as offline after 30 min).",
      },
    ]);
    expect(sensorHealth({ intervalS: 900, lastReadingAt: null, watchedSince: ago(29 * MIN), readings: [], now: NOW }).ok).toBe(
      true,
    );
  });
});

describe("low battery at 20 % or less (ours)", () => {
  it("20 % is low, 21 % is not; since is the first of the low run", () => {
    const readings = series(120, 0);
    readings.forEach((x, i) => (x.batteryPct = i < readings.length - 3 ? 22 : 20));
    const low = health(readings);
    expect(problems(low)).toEqual(["low-battery"]);
    expect(low.findings[0]!.since).toEqual(ago(30 * MIN));
    expect(low.findings[0]!.reason).toBe("Battery at 20 % (ours: 20 % or less is low; change it soon).");
    readings.at(-1)!.batteryPct = 21;
    expect(health(readings).ok).toBe(true);
  });

  it("a reading without a battery figure leaves the last known level standing", () => {
    const readings = series(60, 0);
    readings.forEach((x) => (x.batteryPct = 12));
    readings.at(-1)!.batteryPct = null;
    expect(problems(health(readings))).toEqual(["low-battery"]);
  });
});

describe("flat-lined: air temperature and RH unchanged for 6 h or more (ours)", () => {
  it("exactly 6 h of identical readings is flat-lined; 5 h 45 min is not", () => {
    const moving = series(600, 375);
    const flat = series(360, 0, { airTemperatureC: 19.5, relativeHumidityPct: 64 });
    const h = health([...moving, ...flat]);
    expect(problems(h)).toEqual(["flat-lined"]);
    expect(h.findings[0]).toEqual({
      problem: "flat-lined",
      since: ago(360 * MIN),
      reason:
        "The same 19.5 °C and 64.0 % RH in 25 readings over 6 h (ours: no change at all for 6 h or more means a stuck sensor).",
    });
    expect(health([...series(600, 360), ...series(345, 0, { airTemperatureC: 19.5, relativeHumidityPct: 64 })]).ok).toBe(true);
  });

  it("RH moving while the temperature stays put is not flat", () => {
    const readings = series(600, 0, { airTemperatureC: 19.5 });
    readings.forEach((x, i) => (x.relativeHumidityPct = 60 + (i % 2)));
    expect(health(readings).ok).toBe(true);
  });

  it("two readings 6 h apart are not a stretch: three are needed", () => {
    const two = [r(360, { relativeHumidityPct: 64 }), r(0, { relativeHumidityPct: 64 })];
    expect(problems(health(two, { intervalS: 6 * 3600 }))).toEqual([]);
    const three = [r(360, { relativeHumidityPct: 64 }), r(180, { relativeHumidityPct: 64 }), r(0, { relativeHumidityPct: 64 })];
    expect(problems(health(three, { intervalS: 3 * 3600 }))).toEqual(["flat-lined"]);
  });
});

describe("jumping: more than 5 K or 25 RH points between readings within 15 min (ours)", () => {
  it("5.0 K in 15 min is a real change; 5.1 K is a jump", () => {
    const base = series(240, 0, { airTemperatureC: 20 });
    base.forEach((x, i) => (x.relativeHumidityPct = 60 + (i % 3)));
    base[8] = { ...base[8]!, airTemperatureC: 25 };
    expect(health(base).ok).toBe(true);
    base[8] = { ...base[8]!, airTemperatureC: 25.1 };
    const h = health(base);
    expect(problems(h)).toEqual(["jumping"]);
    // base[8] is 120 minutes ago; the step back down from it is a second jump.
    expect(h.findings[0]!.since).toEqual(ago(120 * MIN));
    expect(h.findings[0]!.reason).toBe(
      "2 implausible steps in the last 24 h, the latest air 25.1 → 20.0 °C in 15 min (ours: more than 5 K or 25 RH points within 15 min is not a real room).",
    );
  });

  it("25 RH points is allowed, 25.5 is not; readings more than 15 min apart are not compared", () => {
    const pair = (rh: number, gapMin: number) => [r(gapMin + 5, { relativeHumidityPct: 50 }), r(5, { relativeHumidityPct: rh })];
    expect(health(pair(75, 15)).ok).toBe(true);
    expect(problems(health(pair(75.5, 15)))).toEqual(["jumping"]);
    expect(problems(health(pair(75.5, 16), { intervalS: 1200 }))).toEqual([]);
  });

  it("a surface probe jumping counts too", () => {
    const pair = [r(20, { surfaceTemperatureC: 14 }), r(5, { surfaceTemperatureC: 2 })];
    expect(health(pair).findings[0]!.reason).toMatch(
      /^1 implausible step in the last 24 h, the latest surface 14.0 → 2.0 °C in 15 min/,
    );
  });

  it("a jump more than 24 h ago is no longer shown", () => {
    const old = [r(25 * 60 + 15, { airTemperatureC: 10 }), r(25 * 60), ...series(600, 0)];
    expect(health(old).ok).toBe(true);
  });
});

describe("several problems at once", () => {
  it("offline, low battery and flat-lined together, in that order", () => {
    const readings = series(600, 60, { airTemperatureC: 18, relativeHumidityPct: 70, batteryPct: 5 });
    expect(problems(health(readings))).toEqual(["offline", "low-battery", "flat-lined"]);
  });
});

describe("durations in words", () => {
  it("reads as a person would say it", () => {
    expect(formatDuration(45 * MIN)).toBe("45 min");
    expect(formatDuration(125 * MIN)).toBe("2 h 5 min");
    expect(formatDuration(52 * 60 * MIN)).toBe("2 days 4 h");
    expect(formatDuration(30_000)).toBe("30 s");
  });
});
