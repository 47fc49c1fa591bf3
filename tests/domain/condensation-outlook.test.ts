import { describe, expect, it } from "vitest";
import {
  NO_SOURCE,
  OUTLOOK_CAUTIONS,
  assumedIndoorConditions,
  coldestSurface,
  levelFor,
  outlookDates,
  outlookTips,
  outlookWindow,
  roomOutlook,
  type IndoorConditions,
  type OutdoorForecastHour,
} from "../../src/lib/domain/condensation-outlook.js";
import { getBuildingElement } from "../../src/lib/domain/surface.js";

// Hand arithmetic uses ISO 13788:2012:
//   θsi = θe + fRsi·(θi − θe)                                    (surface temperature from the temperature factor)
//   psat(θ) = 610.5·exp(17.269·θ / (237.3 + θ)) for θ ≥ 0 °C      (ISO 13788 Annex E saturation pressure)
//   φsi = pi / psat(θsi)                                          (surface relative humidity)
// The engine's saturation pressure is ASHRAE's (psychrolib), which differs from ISO's Magnus form by well
// under 1 % in this range, so relative figures are compared within 1 %.
const isoPsat = (t: number) => 610.5 * Math.exp((17.269 * t) / (237.3 + t));

const INDOOR: IndoorConditions = { airTemperatureC: 20, relativeHumidityPct: 60, source: "sensor", takenAt: null };
const CORNER_F = 0.4; // solid-brick home: the external corner (0.40) is colder than the wall (0.475) or modern glass (0.818)

function hour(iso: string, temperatureC: number): OutdoorForecastHour {
  return { at: new Date(iso), temperatureC, relativeHumidityPct: 90 };
}

/** 2026-12-07 00:00 Z to 2026-12-10 02:00 Z, 15 °C except the cold hours given (December: London = UTC). */
function forecast(cold: Record<string, number>): OutdoorForecastHour[] {
  const out: OutdoorForecastHour[] = [];
  for (let ms = Date.parse("2026-12-07T00:00:00Z"); ms <= Date.parse("2026-12-10T02:00:00Z"); ms += 3_600_000) {
    const iso = new Date(ms).toISOString();
    out.push(hour(iso, cold[iso.slice(0, 13)] ?? 15));
  }
  return out;
}

describe("coldest surface of a home", () => {
  it("takes the lowest temperature factor among windows, walls and a solid wall's corner", () => {
    // modern double 1 − 1.4·0.13 = 0.818; solid wall 1 − 2.1·0.25 = 0.475; corner 0.40 (our assumption)
    expect(coldestSurface({ glazingType: "modern-double", wallType: "solid-brick" }).id).toBe("corner-thermal-bridge");
    // single glazing 1 − 5.7·0.13 = 0.259 beats the corner's 0.40
    expect(coldestSurface({ glazingType: "single", wallType: "solid-brick" }).id).toBe("single-glazing");
    // filled cavity 1 − 0.5·0.25 = 0.875; older double glass 0.636: no corner for a cavity wall
    expect(coldestSurface({ glazingType: "old-double", wallType: "filled-cavity" }).id).toBe("old-double-glazing");
  });
});

describe("room outlook", () => {
  const now = new Date("2026-12-07T09:20:00Z");
  const input = {
    now,
    indoor: INDOOR,
    fRsi: CORNER_F,
    forecast: forecast({
      // day 2: four hours at 10 °C; day 3: three at 0 °C and two at 8 °C
      "2026-12-08T02": 10,
      "2026-12-08T03": 10,
      "2026-12-08T04": 10,
      "2026-12-08T05": 10,
      "2026-12-09T03": 0,
      "2026-12-09T04": 0,
      "2026-12-09T05": 0,
      "2026-12-09T06": 8,
      "2026-12-09T07": 8,
    }),
  };
  const result = roomOutlook(input);
  const pi = 0.6 * isoPsat(20); // 0.6 × 2336.9 = 1402 Pa

  it("covers today from the current hour and the next two London days", () => {
    expect(result.days.map((d) => d.date)).toEqual(["2026-12-07", "2026-12-08", "2026-12-09"]);
    // today 09:00–23:00 = 15 hours (the 00:00–08:00 hours have passed); the 10th is left out
    expect(result.days.map((d) => d.hours)).toEqual([15, 24, 24]);
    expect(result.hours).toHaveLength(63);
  });

  it("estimates each hour's surface temperature and humidity by ISO 13788", () => {
    const at = (iso: string) => result.hours.find((h) => h.at.toISOString() === iso)!;
    // θe 0: θsi = 0 + 0.4·(20 − 0) = 8.0 °C; φ = 1402 / 1072.3 = 130.8 %: condensing
    expect(at("2026-12-09T03:00:00.000Z").surfaceTemperatureC).toBeCloseTo(8.0, 10);
    expect(at("2026-12-09T03:00:00.000Z").surfaceRelativeHumidityPct / ((100 * pi) / isoPsat(8))).toBeCloseTo(1, 2);
    // θe 8: θsi = 8 + 0.4·12 = 12.8 °C; φ = 1402 / 1477 = 94.9 %: at or above 80, not condensing
    expect(at("2026-12-09T06:00:00.000Z").surfaceTemperatureC).toBeCloseTo(12.8, 10);
    expect(at("2026-12-09T06:00:00.000Z").surfaceRelativeHumidityPct / ((100 * pi) / isoPsat(12.8))).toBeCloseTo(1, 2);
    // θe 10: θsi = 10 + 0.4·10 = 14.0 °C; φ = 1402 / 1598 = 87.7 %
    expect(at("2026-12-08T02:00:00.000Z").surfaceRelativeHumidityPct / ((100 * pi) / isoPsat(14))).toBeCloseTo(1, 2);
    // θe 15: θsi = 15 + 0.4·5 = 17.0 °C; φ = 1402 / 1937 = 72.4 %: below 80
    expect(at("2026-12-07T12:00:00.000Z").surfaceRelativeHumidityPct).toBeGreaterThan(71);
    expect(at("2026-12-07T12:00:00.000Z").surfaceRelativeHumidityPct).toBeLessThan(74);
  });

  it("counts the hours per day and says a level for each", () => {
    expect(result.days.map((d) => [d.hoursAtOrAbove80, d.condensingHours])).toEqual([
      [0, 0], // all 72 %
      [4, 0], // four hours at 87.7 %
      [5, 3], // three condensing (130.8 %) and two at 94.9 %
    ]);
    // ours: 4 or more hours at ≥ 80 % = possible; 2 or more condensing hours = likely
    expect(result.days.map((d) => d.level)).toEqual(["unlikely", "possible", "likely"]);
    expect(result.days[2]!.coldestSurfaceTemperatureC).toBeCloseTo(8.0, 10);
    expect(result.days[2]!.lowestOutdoorTemperatureC).toBe(0);
  });

  it("says nothing for a day without forecast hours", () => {
    const short = roomOutlook({ ...input, forecast: input.forecast.filter((h) => h.at < new Date("2026-12-09T00:00:00Z")) });
    expect(short.days[2]).toMatchObject({ hours: 0, level: null, coldestSurfaceTemperatureC: null });
    expect(roomOutlook({ ...input, forecast: [] }).days.every((d) => d.level === null)).toBe(true);
  });

  it("reads the levels' edges as documented", () => {
    expect(levelFor({ hours: 24, hoursAtOrAbove80: 3, condensingHours: 0 })).toBe("unlikely");
    expect(levelFor({ hours: 24, hoursAtOrAbove80: 1, condensingHours: 1 })).toBe("possible");
    expect(levelFor({ hours: 24, hoursAtOrAbove80: 2, condensingHours: 2 })).toBe("likely");
  });

  it("groups hours by the London day in summer time", () => {
    // 1 June 2026: London is UTC+1, so 23:00 Z on the 1st is already 00:00 on the 2nd.
    const summer = roomOutlook({
      now: new Date("2026-06-01T22:10:00Z"), // 23:10 London, 1 June
      indoor: INDOOR,
      fRsi: CORNER_F,
      forecast: [
        hour("2026-06-01T22:00:00Z", 15),
        hour("2026-06-01T23:00:00Z", 15),
        hour("2026-06-03T22:00:00Z", 15),
        hour("2026-06-03T23:00:00Z", 15),
      ],
    });
    expect(summer.days.map((d) => [d.date, d.hours])).toEqual([
      ["2026-06-01", 1], // 22:00 Z = 23:00 London
      ["2026-06-02", 1], // 23:00 Z on the 1st = 00:00 London on the 2nd
      ["2026-06-03", 1], // 22:00 Z on the 3rd = 23:00 London; 23:00 Z is already the 4th
    ]);
    expect(outlookDates(new Date("2026-06-01T23:30:00Z"))).toEqual(["2026-06-02", "2026-06-03", "2026-06-04"]);
    // from 23:00 Z (the current hour) to London midnight ending the 4th = 23:00 Z on the 4th
    const w = outlookWindow(new Date("2026-06-01T23:30:00Z"));
    expect([w.from.toISOString(), w.to.toISOString()]).toEqual(["2026-06-01T23:00:00.000Z", "2026-06-04T23:00:00.000Z"]);
  });
});

describe("assumed indoor conditions", () => {
  it("are ours, and say so", () => {
    expect(assumedIndoorConditions(new Date("2026-12-07T12:00:00Z"))).toEqual({
      airTemperatureC: 18,
      relativeHumidityPct: 60,
      source: "assumed",
      takenAt: null,
    });
    expect(assumedIndoorConditions(new Date("2026-07-07T12:00:00Z")).airTemperatureC).toBe(20);
  });
});

describe("tips and cautions", () => {
  const now = new Date("2026-12-07T09:20:00Z");
  const wall = getBuildingElement("solid-wall");

  it("match the outlook", () => {
    const cold = roomOutlook({
      now,
      indoor: INDOOR,
      fRsi: CORNER_F,
      forecast: forecast({ "2026-12-09T03": 0, "2026-12-09T04": 0 }),
    });
    const ids = outlookTips({ days: cold.days, surface: getBuildingElement("corner-thermal-bridge"), wall, forecast: true }).map(
      (t) => t.id,
    );
    // condensing on a corner in a cold spell (0 °C < 5 °C, ours): ventilation, steady heat, furniture; no windows to wipe
    expect(ids).toEqual(["trickle-vents", "extract-fans", "steady-heating", "furniture-off-walls"]);

    const glass = getBuildingElement("single-glazing");
    const wet = roomOutlook({
      now,
      indoor: INDOOR,
      fRsi: glass.fRsi,
      forecast: forecast({ "2026-12-08T03": 8, "2026-12-08T04": 8 }),
    });
    // θsi = 8 + 0.259·12 = 11.1 °C; φ = 1402 / 1320 = 106 %: condensing on the glass, so wipe the windows
    expect(outlookTips({ days: wet.days, surface: glass, wall, forecast: true }).map((t) => t.id)).toContain("wipe-windows");

    const mild = roomOutlook({ now, indoor: INDOOR, fRsi: CORNER_F, forecast: forecast({}) });
    expect(outlookTips({ days: mild.days, surface: glass, wall, forecast: true }).map((t) => t.id)).toEqual(["keep-airing"]);

    expect(outlookTips({ days: [], surface: glass, wall, forecast: false }).map((t) => t.id)).toEqual([
      "trickle-vents",
      "extract-fans",
    ]);
  });

  it("always carry the usual cautions, each with its basis, and never blame or turn away a report", () => {
    const text = OUTLOOK_CAUTIONS.map((c) => c.text).join(" ");
    expect(text).toMatch(/oven or hob/);
    expect(text).toMatch(/Do not block air bricks/);
    expect(text).toMatch(/report it to your landlord, whatever this outlook says/);
    expect(text).toMatch(/breathing problems.*seek health advice/);
    for (const c of OUTLOOK_CAUTIONS) expect(c.basis.length).toBeGreaterThan(0);
    expect(text).not.toMatch(/lifestyle|your fault|no need to report/i);
    expect(NO_SOURCE).toBe("common practice, no source");
  });
});
