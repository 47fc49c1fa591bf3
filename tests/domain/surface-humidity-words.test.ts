// How surface humidity is said (src/lib/domain/wording.ts surfaceHumidity): the engine keeps the raw
// ratio, which goes above 100 % when the surface is colder than the air's dew point; people read
// "condensing" instead of a percentage over 100 (air cannot hold more than saturated — from memory,
// the definition of relative humidity).
import { describe, expect, it } from "vitest";
import { evaluatePoint } from "@/lib/domain";
import { CONDENSING_WORDS, surfaceHumidity } from "@/lib/domain/wording";

describe("surface humidity in words", () => {
  it("says a ratio over 100 % as condensing and keeps percentages up to 100", () => {
    expect(surfaceHumidity(149.4)).toBe("condensing (the surface is below the dew point)");
    expect(surfaceHumidity(100.2)).toBe(CONDENSING_WORDS);
    expect(surfaceHumidity(100)).toBe("100 %");
    expect(surfaceHumidity(79.6)).toBe("80 %");
    expect(surfaceHumidity(42)).toBe("42 %");
  });

  it("leaves the engine's own number as it is", () => {
    // 19 °C at 78 % (dew point ≈ 15.1 °C) on a 9 °C window: e_sat(9 °C) ≈ 1148 Pa against
    // e = 0.78 × 2197 Pa ≈ 1714 Pa, about 149 % (Magnus-type saturation pressures, psychrolib).
    const r = evaluatePoint({ airTemperatureC: 19, relativeHumidityPct: 78, surfaceTemperatureC: 9 });
    expect(r.surface.relativeHumidityPct).toBeGreaterThan(140);
    expect(r.surface.relativeHumidityPct).toBeLessThan(160);
    expect(surfaceHumidity(r.surface.relativeHumidityPct)).toBe(CONDENSING_WORDS);
  });
});
