import { describe, expect, it } from "vitest";
import {
  DEFAULT_SENSOR_ALERT_SETTINGS,
  alertsToRaise,
  sensorElement,
  watchRoom,
  type SensorSample,
} from "../../src/lib/domain/sensor-alerts.js";
import { evaluateSeries, getBuildingElement, mouldIndexTrajectory } from "../../src/lib/domain/index.js";

const H = 3_600_000;
// 2 November 2026, 00:00 UTC: London is on GMT (UTC+0) from 25 October, so London days are UTC days here.
const T0 = Date.UTC(2026, 10, 2);
const quarterHours = (hours: number) => Array.from({ length: hours * 4 + 1 }, (_, i) => T0 + i * 0.25 * H);
const sample = (ms: number, rh: number, surface: number | null = 20): SensorSample => ({
  at: new Date(ms),
  airTemperatureC: 20,
  relativeHumidityPct: rh,
  surfaceTemperatureC: surface,
});
// Only the rule under test can fire.
const only = (rule: "mould-index" | "hours-at-80" | "condensing-days") => ({
  ...DEFAULT_SENSOR_ALERT_SETTINGS,
  mouldIndexAtLeast: rule === "mould-index" ? 1 : 99,
  hoursAt80In7Days: rule === "hours-at-80" ? 72 : 999,
  condensingDaysIn7Days: rule === "condensing-days" ? 3 : 99,
});

describe("watchRoom: the hour each rule first holds", () => {
  it("≥ 72 h at ≥ 80 % surface RH first holds at T0 + 72 h", () => {
    // Readings every 15 min from T0 to T0 + 96 h, air 20 °C / 90 %, probe on the surface at 20 °C → surface RH 90 %.
    // Each reading holds until the next: by the whole hour T0 + h, h complete hours are at ≥ 80 %.
    // 71 h at T0 + 71 h (not yet), 72 h at T0 + 72 h → first held at 2026-11-05T00:00Z.
    const w = watchRoom({ samples: quarterHours(96).map((ms) => sample(ms, 90)), settings: only("hours-at-80") });
    const first = w.held.find((h) => h.rule === "hours-at-80")!;
    expect(first.at.toISOString()).toBe("2026-11-05T00:00:00.000Z");
    expect(first.figures.hoursAt80).toBe(72);
    expect(w.basis).toBe("measured");
    // Over the last 7 days (all 96 h of data): 96 h, matching the engine's own count.
    expect(w.last7Days.hoursAt80).toBe(96);
    const asSeries = quarterHours(96).map((ms) => ({ at: new Date(ms), airTemperatureC: 20, relativeHumidityPct: 90, surfaceTemperatureC: 20 }));
    expect(evaluateSeries({ readings: asSeries }).hoursSurfaceRhAtLeast80).toBe(96);
    expect(w.days.map((d) => d.hoursAt80).slice(-5)).toEqual([24, 24, 24, 24, 0]);
  });

  it("condensing on 3 of the last 7 days first holds at the end of the third day's first condensing hour", () => {
    // Air 20 °C / 60 %; on 2, 3 and 4 November from 03:00 to 04:00 the probe reads 5 °C, well below the dew point
    // (≈ 12 °C at 20 °C / 60 %), so surface RH is 100 % (capped). The 03:00 reading holds until 03:15, so by the whole
    // hour 04:00 on 4 November three days have condensing hours: first held at 2026-11-04T04:00Z, not at 03:00.
    const samples = quarterHours(96).map((ms) => {
      const hourOfDay = ((ms - T0) / H) % 24;
      return sample(ms, 60, hourOfDay >= 3 && hourOfDay < 4 ? 5 : 20);
    });
    const w = watchRoom({ samples, settings: only("condensing-days") });
    const first = w.held.find((h) => h.rule === "condensing-days")!;
    expect(first.at.toISOString()).toBe("2026-11-04T04:00:00.000Z");
    expect(first.figures.condensingDays).toBe(3);
    expect(w.last7Days.hoursCondensing).toBe(4);
  });

  it("the mould index rule holds from the first whole hour after the engine's index reaches the threshold", () => {
    const samples = quarterHours(24 * 14).map((ms) => sample(ms, 97));
    const w = watchRoom({ samples, settings: only("mould-index") });
    const trajectory = mouldIndexTrajectory({
      readings: samples.map((s) => ({ at: s.at, airTemperatureC: 20, relativeHumidityPct: 97, surfaceTemperatureC: 20 })),
    });
    const crossing = trajectory.find((p) => p.m >= 1)!;
    // The engine crosses 1 at 2026-11-12T09:15Z (10.4 days at 20 °C / 97 %); the next whole hour is 10:00.
    expect(crossing.at).toBe("2026-11-12T09:15:00.000Z");
    const expected = Math.ceil(Date.parse(crossing.at) / H) * H;
    expect(w.held.find((h) => h.rule === "mould-index")!.at.getTime()).toBe(expected);
  });

  it("says when the surface is only the air's: no probe and no outdoor temperature", () => {
    const w = watchRoom({
      samples: quarterHours(4).map((ms) => sample(ms, 70, null)),
      element: "solid-wall",
      settings: DEFAULT_SENSOR_ALERT_SETTINGS,
    });
    expect(w.basis).toBe("air");
    expect(w.latest!.surfaceRelativeHumidityPct).toBe(70);
  });

  it("estimates the surface from the element's fRsi and the outdoor temperature (θsi = θe + fRsi·(θi − θe), ISO 13788)", () => {
    const fRsi = getBuildingElement("solid-wall").fRsi;
    const w = watchRoom({
      samples: [{ ...sample(T0, 60, null), outdoorTemperatureC: 0 }],
      element: "solid-wall",
      settings: DEFAULT_SENSOR_ALERT_SETTINGS,
    });
    expect(w.basis).toBe("estimated");
    const surfaceT = 0 + fRsi * 20;
    // Vapour pressure at 20 °C / 60 % over the saturation pressure at the surface, from psychrolib (as the engine).
    expect(w.latest!.surfaceRelativeHumidityPct).toBeGreaterThan(60);
    expect(surfaceT).toBeLessThan(20);
  });
});

describe("alertsToRaise: cooldown", () => {
  const held = (hours: number[]) =>
    hours.map((h) => ({ rule: "hours-at-80" as const, at: new Date(T0 + h * H), figures: {} as never }));
  it("a rule that keeps holding raises once, then again only after the cooldown", () => {
    // Held every hour from 72 h to 72 h + 8 days; cooldown 7 days → raised at 72 h and at 72 h + 168 h.
    const hours = Array.from({ length: 8 * 24 + 1 }, (_, i) => 72 + i);
    expect(alertsToRaise(held(hours), {}, 7).map((h) => (h.at.getTime() - T0) / H)).toEqual([72, 72 + 168]);
    // The same again with the first already stored: nothing new before the cooldown ends.
    expect(alertsToRaise(held(hours), { "hours-at-80": new Date(T0 + 72 * H) }, 7).map((h) => (h.at.getTime() - T0) / H)).toEqual(
      [240],
    );
  });
});

describe("sensorElement", () => {
  it("reads the fitter's placement", () => {
    const home = { glazingType: "single" as const, wallType: "filled-cavity" as const };
    expect(sensorElement(home, "by the bedroom window")).toBe("single-glazing");
    expect(sensorElement(home, "external wall corner, 0.3 m above floor")).toBe("corner-thermal-bridge");
    expect(sensorElement(home, "external wall behind the wardrobe")).toBe("filled-cavity-wall");
  });
});
