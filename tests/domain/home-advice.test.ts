import { describe, expect, it } from "vitest";
import { ADVICE_SOURCES, MAX_ADVICE_ITEMS, adviseForHome, type HomeAdviceFacts } from "../../src/lib/domain/index.js";

// Two homes from our own demo fiction: an older terrace and a recent flat.
const oldTerrace: HomeAdviceFacts = {
  wallType: "solid-brick",
  glazingType: "single",
  heatingType: "gas-boiler",
  ventilation: "trickle-vents-and-fans",
  roomKinds: ["bedroom"],
  riskState: null,
  observations: ["mould-spots"],
};
const newFlat: HomeAdviceFacts = {
  wallType: "filled-cavity",
  glazingType: "modern-double",
  heatingType: "gas-boiler",
  ventilation: "trickle-vents-and-fans",
  roomKinds: ["bedroom"],
  riskState: null,
  observations: ["mould-spots"],
};
const ids = (f: HomeAdviceFacts) => adviseForHome(f).items.map((i) => i.id);

describe("advice for this home", () => {
  it("single glazing and solid walls get window film, reflector panels and draught-proofing; a modern flat does not", () => {
    expect(ids(oldTerrace)).toEqual(["steady-low-heat", "window-film", "radiator-reflector", "draught-proofing"]);
    expect(ids(newFlat)).toEqual(["steady-low-heat"]);
  });

  it("window film only on single (or mixed) glazing, and only with the landlord's agreement", () => {
    expect(ids({ ...newFlat, glazingType: "mixed" })).toContain("window-film");
    expect(ids({ ...newFlat, glazingType: "old-double" })).not.toContain("window-film");
    const film = adviseForHome(oldTerrace).items.find((i) => i.id === "window-film")!;
    // The words ("Ask your landlord first", the glass's temperature) are the client's: tests/client/home-advice.
    expect(film).toMatchObject({ facts: { glass: "single" }, cautions: ["film-not-repair"], source: "iso-13788" });
  });

  it("reflector panels only on uninsulated outside walls with radiators", () => {
    expect(ids({ ...newFlat, wallType: "unfilled-cavity" })).toContain("radiator-reflector");
    expect(ids({ ...newFlat, wallType: "solid-stone" })).toContain("radiator-reflector");
    expect(ids({ ...newFlat, wallType: "insulated" })).not.toContain("radiator-reflector");
    expect(ids({ ...oldTerrace, heatingType: "electric-storage" })).not.toContain("radiator-reflector");
  });

  it("draught-proofing always warns never to block trickle vents, air bricks or extractor fans", () => {
    const d = adviseForHome(oldTerrace).items.find((i) => i.id === "draught-proofing")!;
    expect(d.cautions).toContain("never-block-vents");
  });

  it("heating that does not work, or no heating, is the landlord's job and comes first; no warmth tips then", () => {
    for (const f of [
      { ...newFlat, heatingUsable: "no" as const },
      { ...newFlat, heatingType: "none" as const },
    ]) {
      const advice = adviseForHome(f);
      expect(advice.items[0]).toMatchObject({ id: "heating-repair", cost: "landlords-job" });
      expect(advice.items.map((i) => i.id)).not.toContain("steady-low-heat");
    }
  });

  it("a missing or broken fan in a kitchen or bathroom case is the landlord's job", () => {
    expect(ids({ ...newFlat, roomKinds: ["bathroom"], extractorFanWorks: "no" })[0]).toBe("fan-repair");
    expect(ids({ ...newFlat, roomKinds: ["kitchen"], ventilation: "windows-only" })[0]).toBe("fan-repair");
    expect(ids({ ...newFlat, roomKinds: ["bedroom"], extractorFanWorks: "no" })).not.toContain("fan-repair");
    const fan = adviseForHome({ ...newFlat, roomKinds: ["kitchen"], extractorFanWorks: "no" }).items[0];
    expect(fan.cost).toBe("landlords-job");
    expect(fan).toMatchObject({ facts: { fan: "broken" }, source: "approved-document-f" });
  });

  it("warmth advice fits the heating: storage heaters versus radiator valves and the thermostat", () => {
    const heat = (f: HomeAdviceFacts) => adviseForHome(f).items.find((i) => i.id === "steady-low-heat")!.facts;
    expect(heat(newFlat)).toMatchObject({ heating: "radiators", walls: "none", glass: "none" });
    expect(heat({ ...newFlat, heatingType: "electric-storage" })).toMatchObject({ heating: "storage" });
    expect(heat(oldTerrace)).toMatchObject({ heating: "radiators", walls: "solid-brick", glass: "single" });
  });

  it("condensing readings move airing and warmth up the list", () => {
    const wet = adviseForHome({ ...oldTerrace, riskState: "condensing" }).items.map((i) => i.id);
    expect(wet.slice(0, 2)).toEqual(["steady-low-heat", "wipe-and-air"]);
  });

  it("wet patches on a surface the readings show as dry point to a surveyor (landlord's job)", () => {
    const advice = adviseForHome({ ...newFlat, riskState: "dry", observations: ["wet-patches"] });
    expect(advice.items[0]).toMatchObject({ id: "possible-leak", cost: "landlords-job" });
    expect(ids({ ...newFlat, riskState: "condensing", observations: ["wet-patches"] })).not.toContain("possible-leak");
  });

  it("never more than the few most helpful items", () => {
    const busy = adviseForHome({
      ...oldTerrace,
      roomKinds: ["kitchen"],
      extractorFanWorks: "no",
      heatingUsable: "sometimes",
      riskState: "dry",
      observations: ["condensation", "leak"],
    });
    expect(busy.items).toHaveLength(MAX_ADVICE_ITEMS);
    expect(busy.items.map((i) => i.id)).toEqual(["heating-repair", "fan-repair", "possible-leak", "window-film"]);
  });

  it("the oven, hob and unflued heater caution is always there, whatever the home", () => {
    for (const f of [oldTerrace, newFlat, { ...newFlat, heatingType: "none" as const }]) {
      const { safety } = adviseForHome(f);
      expect(safety).toMatchObject({ id: "no-oven-for-warmth", cautions: ["co-symptoms", "co-alarm", "trades"] });
    }
  });

  it("the support route is offered only when heating is hard to afford, and the warmth tip says help is below", () => {
    expect(adviseForHome({ ...newFlat, heatingCost: "hard-to-afford" }).offerSupportRoute).toBe(true);
    expect(adviseForHome({ ...newFlat, heatingCost: "rather-not-say" }).offerSupportRoute).toBe(false);
    expect(adviseForHome(newFlat).offerSupportRoute).toBe(false);
    const heat = adviseForHome({ ...newFlat, heatingCost: "hard-to-afford" }).items[0];
    expect(heat).toMatchObject({ id: "steady-low-heat", facts: { costs: "hard" } });
  });

  it("every item names its source and never talks about the tenant's lifestyle", () => {
    const all = adviseForHome({
      ...oldTerrace,
      roomKinds: ["kitchen"],
      riskState: "condensing",
      observations: ["condensation"],
    });
    for (const item of [...all.items, all.safety]) {
      expect(ADVICE_SOURCES).toContain(item.source);
      expect(JSON.stringify(item)).not.toMatch(/lifestyle|your fault|you caused/i);
    }
  });
});
