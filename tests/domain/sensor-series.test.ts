// The simulator's series generator: deterministic, and each scripted sensor shows its story. Surface
// humidity is worked out here with the domain's psychrolib (ASHRAE Handbook—Fundamentals 2017 ch. 1),
// not with the generator's own Magnus formula, and the surface relation is ISO 13788's
// θsi = θe + fRsi·(θi − θe).
import { describe, expect, it } from "vitest";
import { saturationVapourPressurePa, vapourPressurePa } from "../../src/lib/domain/psychrometrics.js";
import {
  magnusSaturationPa,
  outdoorAt,
  plannedSensors,
  readingTimes,
  simulatedReading,
  simulatedReadings,
  type SeriesSensor,
  type SimulatedReading,
} from "../../scripts/lib/sensor-series.js";

const SEED = 20261205;
const H = 3_600_000;
const DAY = 24 * H;
const START = Date.UTC(2026, 10, 23); // a Monday in late November

function sensor(overrides: Partial<SeriesSensor>): SeriesSensor {
  return {
    serial: "SIM-TEST-1",
    home: "home-1",
    room: "bedroom",
    temperatureFactor: 0.75,
    measuresSurface: true,
    intervalS: 900,
    installedAtMs: START - 30 * DAY,
    script: { kind: "normal" },
    ...overrides,
  };
}

/** Surface RH, %: the air's vapour pressure over saturation at the surface (ISO 13788 §4). */
const surfaceRh = (r: SimulatedReading) =>
  (100 * vapourPressurePa(r.airTemperatureC, r.relativeHumidityPct)) / saturationVapourPressurePa(r.surfaceTemperatureC!);

const day = (s: SeriesSensor, n: number) => simulatedReadings(SEED, s, START + n * DAY, START + (n + 1) * DAY);
const hoursWhere = (readings: SimulatedReading[], test: (r: SimulatedReading) => boolean) => readings.filter(test).length / 4;
const mean = (values: number[]) => values.reduce((a, b) => a + b, 0) / values.length;

describe("the series generator", () => {
  it("gives the same reading for the same seed, sensor and time, in any order; another seed differs", () => {
    const s = sensor({});
    const times = readingTimes(s, START, START + 2 * DAY);
    const forwards = times.map((t) => simulatedReading(SEED, s, t));
    const backwards = [...times]
      .reverse()
      .map((t) => simulatedReading(SEED, s, t))
      .reverse();
    expect(backwards).toEqual(forwards);
    expect(simulatedReading(SEED, s, times[37]!)).toEqual(forwards[37]);
    const otherSeed = times.map((t) => simulatedReading(SEED + 1, s, t));
    expect(otherSeed).not.toEqual(forwards);
  });

  it("reports every interval from the sensor's own phase, at whole seconds", () => {
    const s = sensor({ intervalS: 900 });
    const times = readingTimes(s, START, START + DAY);
    expect(times).toHaveLength(96);
    expect(new Set(times.map((t) => t % 900_000)).size).toBe(1);
    expect(times.every((t) => t % 1000 === 0)).toBe(true);
    const fiveMinutes = readingTimes({ ...s, intervalS: 300 }, START, START + DAY);
    expect(fiveMinutes).toHaveLength(288);
    // Another serial reports at another moment of the quarter hour (spreading a fleet's load).
    const phases = new Set(["A", "B", "C", "D", "E"].map((x) => readingTimes(sensor({ serial: x }), START, START + DAY)[0]));
    expect(phases.size).toBeGreaterThan(1);
  });

  it("uses a saturation pressure that matches published values", () => {
    // Vapour pressure of water at 20 °C is 2.3393 kPa and at 0 °C 0.6113 kPa (CRC Handbook of Chemistry
    // and Physics, "Vapor pressure of water"; from memory). Alduchov and Eskridge give their Magnus
    // constants as good to 0.4 % from −40 to 50 °C (from memory).
    expect(Math.abs(magnusSaturationPa(20) / 2339.3 - 1)).toBeLessThan(0.004);
    expect(Math.abs(magnusSaturationPa(0) / 611.3 - 1)).toBeLessThan(0.004);
  });

  it("puts an ordinary probe where the wall's temperature factor says (ISO 13788), within the noise", () => {
    const s = sensor({ temperatureFactor: 0.7 });
    for (const r of day(s, 2)) {
      const out = outdoorAt(SEED, Date.parse(r.takenAt)).temperatureC;
      const expected = out + 0.7 * (r.airTemperatureC - out);
      expect(Math.abs(r.surfaceTemperatureC! - expected)).toBeLessThan(0.5);
    }
    // A heated home in late November: room air mostly 12–22 °C, humid outdoors.
    const readings = simulatedReadings(SEED, s, START, START + 7 * DAY);
    expect(mean(readings.map((r) => r.airTemperatureC))).toBeGreaterThan(14);
    expect(mean(readings.map((r) => r.airTemperatureC))).toBeLessThan(21);
    expect(mean(readings.map((r) => r.relativeHumidityPct))).toBeLessThan(70);
  });

  it("develops condensation over days on a cold wall: surface RH ≥ 80 % all day and condensing by the end", () => {
    const [, bedroom] = plannedSensors(0, START);
    expect(bedroom!.script.kind).toBe("developing-condensation");
    const s = sensor({ ...bedroom!, serial: "SIM-COND" });
    const before = day(s, 0);
    const after = day(s, 6);
    // Before the story starts, the cold corner is humid at night only; at the end, all day and condensing.
    expect(hoursWhere(before, (r) => surfaceRh(r) >= 80)).toBeLessThan(12);
    expect(hoursWhere(before, (r) => surfaceRh(r) >= 100)).toBeLessThanOrEqual(1);
    expect(hoursWhere(after, (r) => surfaceRh(r) >= 80)).toBe(24);
    expect(hoursWhere(after, (r) => surfaceRh(r) >= 100)).toBeGreaterThanOrEqual(12);
    // The room air's RH creeps up: each day's mean above the one two days before.
    const dailyRh = [0, 2, 4, 6].map((n) => mean(day(s, n).map((r) => r.relativeHumidityPct)));
    for (let i = 1; i < dailyRh.length; i++) expect(dailyRh[i]).toBeGreaterThan(dailyRh[i - 1]!);
    // 72 h at ≥ 80 % surface RH within the story's 7 days (the default alert rule's shape).
    const week = simulatedReadings(SEED, s, START + DAY, START + 8 * DAY);
    expect(hoursWhere(week, (r) => surfaceRh(r) >= 80)).toBeGreaterThanOrEqual(72);
  });

  it("shows a leak as a cold, wet-looking probe in dry air", () => {
    const [wall] = plannedSensors(1, START);
    expect(wall!.script.kind).toBe("leak");
    const s = sensor({ ...wall!, serial: "SIM-LEAK" });
    const readings = simulatedReadings(SEED, s, START, START + 3 * DAY);
    expect(Math.max(...readings.map((r) => r.relativeHumidityPct))).toBeLessThan(50);
    for (const r of readings) {
      // Several kelvin below where a sound wall with its factor would be…
      const out = outdoorAt(SEED, Date.parse(r.takenAt)).temperatureC;
      expect(out + wall!.temperatureFactor * (r.airTemperatureC - out) - r.surfaceTemperatureC!).toBeGreaterThan(2);
      // …yet never at the air's dew point: the water is not condensation.
      expect(surfaceRh(r)).toBeLessThan(100);
    }
  });

  it("lets the dead sensor's battery sink, then sends nothing", () => {
    const kitchen = plannedSensors(2, START).find((p) => p.script.kind === "dead")!;
    const s = sensor({ ...kitchen, serial: "SIM-DEAD" });
    const diesAt = START + 5 * DAY;
    const lastDay = simulatedReadings(SEED, s, diesAt - DAY, diesAt);
    expect(lastDay).toHaveLength(96);
    expect(lastDay.at(-1)!.batteryPct).toBeLessThanOrEqual(3);
    expect(simulatedReadings(SEED, s, START, START + DAY)[0]!.batteryPct).toBeGreaterThan(90);
    expect(simulatedReadings(SEED, s, diesAt, diesAt + 3 * DAY)).toEqual([]);
  });

  it("drifts: the drifting sensor reads exactly pctPerDay × days above the same sensor without drift", () => {
    const bathroom = plannedSensors(3, START).find((p) => p.script.kind === "drifting")!;
    const s = sensor({ ...bathroom, serial: "SIM-DRIFT" });
    const steady = { ...s, script: { kind: "normal" as const } };
    // Midnight readings (long after a shower, RH well below 100 so nothing is capped), 1 and 4 days into the drift.
    for (const daysIn of [1, 4]) {
      const at = START + (2 + daysIn) * DAY;
      const drift = simulatedReading(SEED, s, at)!.relativeHumidityPct - simulatedReading(SEED, steady, at)!.relativeHumidityPct;
      expect(drift).toBeCloseTo(3 * daysIn, 0);
    }
    expect(simulatedReading(SEED, s, START + DAY)).toEqual(simulatedReading(SEED, steady, START + DAY));
  });

  it("flat-lines: every reading after the moment repeats it exactly", () => {
    const [, bedroom] = plannedSensors(4, START);
    const s = sensor({ ...bedroom!, serial: "SIM-FLAT" });
    const stuckAt = START + 4 * DAY;
    const after = simulatedReadings(SEED, s, stuckAt + 1000, stuckAt + 2 * DAY);
    const values = (r: SimulatedReading) => [r.airTemperatureC, r.relativeHumidityPct, r.surfaceTemperatureC];
    expect(new Set(after.map((r) => values(r).join())).size).toBe(1);
    const before = simulatedReadings(SEED, s, stuckAt - DAY, stuckAt);
    expect(new Set(before.map((r) => values(r).join())).size).toBeGreaterThan(90);
  });

  it("sends nothing before the sensor was fitted", () => {
    const s = sensor({ installedAtMs: START + DAY });
    expect(simulatedReadings(SEED, s, START, START + DAY)).toEqual([]);
    expect(simulatedReadings(SEED, s, START + DAY, START + 2 * DAY)).toHaveLength(96);
  });
});
