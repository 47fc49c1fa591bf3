// Which building elements a report points at, from the home's construction and where the tenant
// sees the damp. Used to estimate a surface temperature when none was measured.
import type { ElementId } from "./surface.js";

export type GlazingKind = "single" | "old-double" | "modern-double" | "triple" | "mixed";
export type WallKind =
  "solid-brick" | "solid-stone" | "unfilled-cavity" | "filled-cavity" | "system-built" | "timber-frame" | "insulated";

export function glazingElement(glazing: GlazingKind): ElementId {
  if (glazing === "single") return "single-glazing";
  if (glazing === "modern-double" || glazing === "triple") return "modern-double-glazing";
  // "mixed" is judged by its older panes: the colder surface is where water settles first.
  return "old-double-glazing";
}

export function wallElement(wall: WallKind): ElementId {
  switch (wall) {
    case "unfilled-cavity":
      return "unfilled-cavity-wall";
    case "filled-cavity":
      return "filled-cavity-wall";
    case "insulated":
    case "timber-frame":
      return "insulated-wall";
    default:
      // Solid brick or stone and 1960s system-built panels are all taken as the solid-wall case.
      return "solid-wall";
  }
}

/** The distinct elements behind the places a report names, in the order window, wall, corner. */
export function elementsForReport(
  home: { glazingType: GlazingKind; wallType: WallKind },
  locations: readonly string[],
): ElementId[] {
  const out = new Set<ElementId>();
  if (locations.includes("window")) out.add(glazingElement(home.glazingType));
  if (
    locations.some(
      (l) =>
        l === "external-wall" ||
        l === "behind-furniture" ||
        l === "ceiling" ||
        l === "floor" ||
        l === "other" ||
        l === "bath-or-shower",
    )
  ) {
    out.add(wallElement(home.wallType));
  }
  if (locations.includes("corner")) out.add("corner-thermal-bridge");
  if (out.size === 0) out.add(wallElement(home.wallType));
  return [...out];
}
