// The readings chart's data and its time labels: a pause in the readings is drawn as a gap, and the
// axis reads "26 Nov 14:00" in London time (never "11/26"). The instants are fixed; the London
// wall-clock times were worked out by hand (from memory: BST = UTC+1 from the last Sunday of March
// to the last Sunday of October, GMT = UTC otherwise).
import { describe, expect, it } from "vitest";
import { chartSeries, GAP_FACTOR, usualInterval } from "@/features/cases/lib/derived";
import { formatChartTime } from "@/lib/dates";

const HOUR = 3600;
const reading = (id: number, at: number) => ({
  id,
  roomId: 1,
  takenAt: new Date(at * 1000).toISOString(),
  airTemperatureC: 18,
  relativeHumidityPct: 70,
  surfaceTemperatureC: 12,
  outdoorTemperatureC: null,
  source: "manual" as const,
  importId: null,
});

describe("the readings chart's data", () => {
  const start = Date.UTC(2026, 10, 20, 0) / 1000;

  it("puts one empty point in each pause longer than three usual intervals, and none elsewhere", () => {
    // Hourly for 10 hours, a 2-day pause, hourly for 5 hours; then a pause of exactly 3 hours (not a gap).
    const times = [
      ...Array.from({ length: 10 }, (_, i) => start + i * HOUR),
      ...Array.from({ length: 5 }, (_, i) => start + 57 * HOUR + i * HOUR),
      start + 64 * HOUR,
    ];
    const data = chartSeries(times.map((t, i) => reading(i + 1, t)));
    expect(usualInterval(times)).toBe(HOUR);
    expect(GAP_FACTOR).toBe(3);
    expect(data.t.length).toBe(times.length + 1);
    const empty = data.air.flatMap((v, i) => (v === null ? [i] : []));
    expect(empty).toEqual([10]);
    // The empty point sits inside the pause, so the lines stop either side of it.
    expect(data.t[10]).toBeGreaterThan(start + 9 * HOUR);
    expect(data.t[10]).toBeLessThan(start + 57 * HOUR);
    expect([data.rh[10], data.dewPoint[10], data.surfaceRh[10]]).toEqual([null, null, null]);
    expect(data.air.filter((v) => v !== null)).toHaveLength(times.length);
  });

  it("draws an evenly spaced series with no gap, sorted oldest first", () => {
    const data = chartSeries([reading(2, start + HOUR), reading(1, start), reading(3, start + 2 * HOUR)]);
    expect(Array.from(data.t)).toEqual([start, start + HOUR, start + 2 * HOUR]);
    expect(data.air.every((v) => v !== null)).toBe(true);
  });
});

describe("the chart's time labels", () => {
  it("reads 26 Nov 14:00 in London (GMT) and 30 Jun 23:59 in summer (BST), with the time under the day on the axis", () => {
    expect(formatChartTime(Date.UTC(2026, 10, 26, 14, 0) / 1000)).toBe("26 Nov 14:00");
    expect(formatChartTime(Date.UTC(2026, 5, 30, 22, 59) / 1000)).toBe("30 Jun 23:59");
    expect(formatChartTime(Date.UTC(2026, 10, 26, 0, 0) / 1000, "\n")).toBe("26 Nov\n00:00");
  });
});
