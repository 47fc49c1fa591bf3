// The risk engine's "why this result" sentences: the domain gives them by id with their figures; tenant
// screens say them through the risk namespace (English or Welsh), staff and the API keep the domain's
// English. The en-GB messages and the domain's English must be one wording.
import { afterEach, describe, expect, it } from "vitest";
import { evaluatePoint, type PointInput } from "@/lib/domain";
import { reasonIn } from "@/components/risk/risk-panel";
import { i18n, showLanguage } from "@/lib/i18n/i18n";

// Inputs that reach every reason id (figures from the domain tests; no new numbers are checked here).
const inputs: PointInput[] = [
  { airTemperatureC: 20, relativeHumidityPct: 60, outdoorTemperatureC: 0, element: "solid-wall" },
  { airTemperatureC: 20, relativeHumidityPct: 60, outdoorTemperatureC: 0, element: "corner-thermal-bridge" },
  { airTemperatureC: 20, relativeHumidityPct: 40, outdoorTemperatureC: 5, element: "modern-double-glazing" },
  { airTemperatureC: 20, relativeHumidityPct: 60, element: "single-glazing" },
  { airTemperatureC: 20, relativeHumidityPct: 60 },
  { airTemperatureC: 20, relativeHumidityPct: 100 },
  { airTemperatureC: -2, relativeHumidityPct: 100 },
  { airTemperatureC: 20, relativeHumidityPct: 60, surfaceTemperatureC: 12, outdoorTemperatureC: 0 },
  { airTemperatureC: 20, relativeHumidityPct: 60, surfaceTemperatureC: 16, outdoorTemperatureC: 18 },
  { airTemperatureC: 20, relativeHumidityPct: 70, surfaceTemperatureC: 15.5 },
  { airTemperatureC: 20, relativeHumidityPct: 70, surfaceTemperatureC: 16.5 },
  { airTemperatureC: 20, relativeHumidityPct: 60, surfaceTemperatureC: -3 },
  { airTemperatureC: 5, relativeHumidityPct: 90, surfaceTemperatureC: -6 },
  { airTemperatureC: 10, relativeHumidityPct: 30, surfaceTemperatureC: -1 },
  { airTemperatureC: -2, relativeHumidityPct: 80, surfaceTemperatureC: -5 },
  { airTemperatureC: 19, relativeHumidityPct: 78, surfaceTemperatureC: 9 },
];

describe("the risk engine's reasons", () => {
  afterEach(async () => {
    await showLanguage("en");
  });

  it("read the same in the en-GB messages as in the domain's English, for every reason id", async () => {
    await showLanguage("en");
    const t = i18n.getFixedT("en-GB", "risk");
    const seen = new Set<string>();
    for (const input of inputs) {
      const r = evaluatePoint(input);
      r.reasonIds.forEach((reason) => seen.add(reason.id));
      expect(r.reasonIds.map((reason) => reasonIn(t, reason))).toEqual(r.reasons);
    }
    expect([...seen].sort()).toEqual(
      [
        "air-element",
        "air-none",
        "borderline",
        "dew",
        "dry",
        "estimated",
        "factor-measured",
        "factor-typical",
        "frost",
        "mould-risk",
        "no-factor",
        "saturated",
      ].sort(),
    );
  });

  it("are said in Welsh with the same figures", async () => {
    await showLanguage("cy");
    const t = i18n.getFixedT("cy", "risk");
    const r = evaluatePoint({ airTemperatureC: 20, relativeHumidityPct: 60, outdoorTemperatureC: 0, element: "solid-wall" });
    const welsh = r.reasonIds.map((reason) => reasonIn(t, reason));
    expect(welsh[0]).toContain("Mae arwyneb y wal tua 9.5 °C yn ôl ein hamcangyfrif");
    expect(welsh[0]).toContain("ffactor tymheredd arferol o 0.48 ar gyfer wal frics solet");
    expect(welsh[2]).toContain("o dan y 0.75 y mae BRE IP 1/06");
    expect(welsh.join(" ")).not.toMatch(/surface|temperature/);
  });
});
