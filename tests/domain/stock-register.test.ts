// The register's wording onto our vocabularies. The vocabularies are the engine's own; the register
// wording is what housing asset registers commonly hold (common practice, no source) unless a check
// names one.
import { describe, expect, it } from "vitest";
import { glazingElement, wallElement } from "../../src/lib/domain/home-elements.js";
import {
  builtFormFrom,
  convertStockRow,
  epcBandFrom,
  floorAreaFrom,
  glazingFrom,
  heatingFrom,
  heatingFuelFrom,
  presenceFrom,
  proposeStockMapping,
  roofInsulationMmFrom,
  roomsFrom,
  splitAddress,
  ventilationFrom,
  wallFrom,
  yearOrBandFrom,
} from "../../src/lib/domain/stock-register.js";

describe("column detection", () => {
  it("finds the fields from the usual header names, whatever their case, spacing and units", () => {
    expect(
      proposeStockMapping([
        "Unique Property Reference Number",
        "Address 1",
        "Address 2",
        "Town",
        "Post Code",
        "Wall Construction",
        "Floor Area (m²)",
        "Notes",
      ]),
    ).toEqual({ uprn: 0, addressLine1: 1, addressLine2: 2, town: 3, postcode: 4, wallConstruction: 5, floorArea: 6 });
  });
  it("keeps a merged address column only when there is no first-line column", () => {
    expect(proposeStockMapping(["UPRN", "Address"])).toEqual({ uprn: 0, address: 1 });
    expect(proposeStockMapping(["UPRN", "Address", "Address Line 1"])).toEqual({ uprn: 0, addressLine1: 2 });
  });
});

describe("vocabulary", () => {
  it("maps wall wording onto the engine's wall elements", () => {
    expect(wallFrom("Cavity – filled")).toBe("filled-cavity");
    expect(wallFrom("cavity wall, insulated")).toBe("filled-cavity");
    expect(wallFrom("Cavity", "Filled")).toBe("filled-cavity");
    expect(wallFrom("Cavity", "As built, no insulation")).toBe("unfilled-cavity");
    expect(wallFrom("Cavity wall, uninsulated")).toBe("unfilled-cavity");
    expect(wallFrom("Cavity")).toBe("unfilled-cavity"); // nothing said: the colder case
    expect(wallFrom("Solid brick")).toBe("solid-brick");
    expect(wallFrom("Solid brick", "External wall insulation")).toBe("insulated");
    expect(wallFrom("Sandstone or limestone")).toBe("solid-stone");
    expect(wallFrom("System built (no-fines)")).toBe("system-built");
    expect(wallFrom("Timber frame")).toBe("timber-frame");
    expect(wallFrom("Wattle")).toBeNull();
    expect(wallElement(wallFrom("Cavity – filled")!)).toBe("filled-cavity-wall");
  });
  it("maps glazing, taking undated double glazing as the older kind", () => {
    expect(glazingFrom("Double glazed (post 2002)")).toBe("modern-double");
    expect(glazingFrom("Double glazed (pre 2002)")).toBe("old-double");
    expect(glazingFrom("Double")).toBe("old-double");
    expect(glazingFrom("Single glazed")).toBe("single");
    expect(glazingFrom("Triple glazed")).toBe("triple");
    expect(glazingElement(glazingFrom("single")!)).toBe("single-glazing");
    expect(glazingFrom("Curtains")).toBeNull();
  });
  it("maps built forms, heating, fuel and ventilation", () => {
    expect(builtFormFrom("End of terrace")).toBe("end-terrace");
    expect(builtFormFrom("Mid terrace house")).toBe("mid-terrace");
    expect(builtFormFrom("Semi-detached house")).toBe("semi-detached");
    expect(builtFormFrom("Purpose-built flat")).toBe("flat");
    expect(heatingFrom("Gas combi boiler", "mains-gas")).toBe("gas-boiler");
    expect(heatingFrom("Oil boiler", null)).toBe("other");
    expect(heatingFrom("Electric storage heaters", null)).toBe("electric-storage");
    expect(heatingFrom("Air source heat pump", null)).toBe("heat-pump");
    expect(heatingFuelFrom("District heat network")).toBe("district-heat");
    expect(heatingFuelFrom("LPG")).toBe("lpg");
    expect(presenceFrom("2")).toBe(true);
    expect(presenceFrom("No")).toBe(false);
    expect(ventilationFrom("", true, true)).toBe("trickle-vents-and-fans");
    expect(ventilationFrom("Positive input ventilation", null, null)).toBe("piv");
    expect(ventilationFrom("MVHR", false, false)).toBe("mvhr");
    expect(ventilationFrom("", false, false)).toBe("windows-only");
    expect(ventilationFrom("", null, null)).toBeNull();
  });
  it("reads years and age bands, insulation depths, floor areas and EPC bands", () => {
    expect(yearOrBandFrom("1965", 2026)).toEqual({ year: 1965, band: null });
    expect(yearOrBandFrom("1945 to 1964", 2026)).toEqual({ year: null, band: "1945-1964" });
    expect(yearOrBandFrom("pre 1919", 2026)).toEqual({ year: null, band: "before 1919" });
    expect(yearOrBandFrom("2012 onwards", 2026)).toEqual({ year: null, band: "2012 onwards" });
    expect(yearOrBandFrom("2090", 2026)).toBeNull();
    expect(roofInsulationMmFrom("270mm")).toBe(270);
    expect(roofInsulationMmFrom("None")).toBe(0);
    // 4 inches × 25.4 mm = 101.6 mm (the international inch; from memory)
    expect(roofInsulationMmFrom("4 inches")).toBe(102);
    expect(floorAreaFrom("72.5")).toBe(72.5);
    // 1 000 sq ft × 0.09290304 m²/sq ft = 92.90 m² (the international foot; from memory)
    expect(floorAreaFrom("1,000 sq ft")).toBe(92.9);
    expect(floorAreaFrom("1000", "Floor area (sq ft)")).toBe(92.9);
    expect(epcBandFrom("C (72)")).toBe("C");
    expect(epcBandFrom("Band D")).toBe("D");
    expect(epcBandFrom("H")).toBeNull();
  });
  it("names rooms once each and guesses their kind", () => {
    expect(roomsFrom("Bedroom 1; Kitchen; Bathroom; bedroom 1; Lounge; Box room")).toEqual([
      { name: "Bedroom 1", kind: "bedroom" },
      { name: "Kitchen", kind: "kitchen" },
      { name: "Bathroom", kind: "bathroom" },
      { name: "Lounge", kind: "living" },
      { name: "Box room", kind: "other" },
    ]);
  });
});

describe("addresses", () => {
  it("splits a merged address into its lines, town and normalised postcode", () => {
    expect(splitAddress("12 Elm Road, Flat 3, Leeds, ls1 4ab")).toEqual({
      addressLine1: "12 Elm Road",
      addressLine2: "Flat 3",
      town: "Leeds",
      postcode: "LS1 4AB",
    });
    expect(splitAddress("4 Kiln Lane, Otley LS21 1AA")).toEqual({
      addressLine1: "4 Kiln Lane",
      addressLine2: null,
      town: "Otley",
      postcode: "LS21 1AA",
    });
    expect(splitAddress("Somewhere")).toBeNull();
  });
  it("refuses a row with every reason at once", () => {
    const row = convertStockRow(["12ab", "", "Tiptree", "Igloo"], { uprn: 0, addressLine1: 1, town: 2, builtForm: 3 }, [], 2026);
    expect(row).toEqual({
      ok: false,
      uprn: "12ab",
      reasons: [
        'UPRN "12ab" is not a number of up to 12 digits.',
        "No first line of address.",
        "No postcode.",
        'Built form "Igloo" is not one we recognise.',
      ],
    });
  });
});
