/** Shapes and plain-language labels for homes, shared by every feature that shows one. */
import type { PropertyResponse, PropertySummaryResponse, RoomResponse } from "./contracts/properties.js";

export const BUILT_FORMS = ["detached", "semi-detached", "end-terrace", "mid-terrace", "flat", "maisonette", "bungalow"] as const;
export const WALL_TYPES = [
  "solid-brick",
  "solid-stone",
  "unfilled-cavity",
  "filled-cavity",
  "system-built",
  "timber-frame",
  "insulated",
] as const;
export const GLAZING_TYPES = ["single", "old-double", "modern-double", "triple", "mixed"] as const;
export const HEATING_TYPES = [
  "gas-boiler",
  "electric-storage",
  "electric-direct",
  "heat-pump",
  "district",
  "other",
  "none",
] as const;
export const ROOM_KINDS = ["bedroom", "living", "kitchen", "bathroom", "other"] as const;
export const VENTILATION_TYPES = [
  "not-recorded",
  "windows-only",
  "trickle-vents",
  "extract-fans",
  "trickle-vents-and-fans",
  "continuous-extract",
  "piv",
  "mvhr",
] as const;

export type BuiltForm = (typeof BUILT_FORMS)[number];
export type WallType = (typeof WALL_TYPES)[number];
export type GlazingType = (typeof GLAZING_TYPES)[number];
export type HeatingType = (typeof HEATING_TYPES)[number];
export type RoomKind = (typeof ROOM_KINDS)[number];
export type VentilationType = (typeof VENTILATION_TYPES)[number];

// The response shapes come from the API contract (src/lib/contracts/properties.ts), which takes its value lists from here.
export type Room = RoomResponse;
export type PropertySummary = PropertySummaryResponse;
export type Property = PropertyResponse;

export const builtFormLabels: Record<BuiltForm, string> = {
  detached: "Detached house",
  "semi-detached": "Semi-detached house",
  "end-terrace": "End-of-terrace house",
  "mid-terrace": "Mid-terrace house",
  flat: "Flat",
  maisonette: "Maisonette",
  bungalow: "Bungalow",
};

export const wallTypeLabels: Record<WallType, string> = {
  "solid-brick": "Solid brick",
  "solid-stone": "Solid stone",
  "unfilled-cavity": "Cavity wall, not filled",
  "filled-cavity": "Cavity wall, filled",
  "system-built": "System-built",
  "timber-frame": "Timber frame",
  insulated: "Insulated walls",
};

export const glazingTypeLabels: Record<GlazingType, string> = {
  single: "Single glazing",
  "old-double": "Older double glazing",
  "modern-double": "Modern double glazing",
  triple: "Triple glazing",
  mixed: "A mix of glazing",
};

export const heatingTypeLabels: Record<HeatingType, string> = {
  "gas-boiler": "Gas boiler",
  "electric-storage": "Electric storage heaters",
  "electric-direct": "Electric heaters",
  "heat-pump": "Heat pump",
  district: "Shared (district) heating",
  other: "Other heating",
  none: "No fixed heating",
};

export const ventilationLabels: Record<VentilationType, string> = {
  "not-recorded": "Not recorded",
  "windows-only": "Opening windows only",
  "trickle-vents": "Trickle vents, no extract fans",
  "extract-fans": "Extract fans, no trickle vents",
  "trickle-vents-and-fans": "Trickle vents and extract fans",
  "continuous-extract": "Continuous mechanical extract",
  piv: "Positive input ventilation (PIV)",
  mvhr: "Heat-recovery ventilation (MVHR)",
};

export const roomKindLabels: Record<RoomKind, string> = {
  bedroom: "Bedroom",
  living: "Living room",
  kitchen: "Kitchen",
  bathroom: "Bathroom",
  other: "Other room",
};

/** Falls back to the raw value, so a value added on the server still shows something. */
export function labelOf<K extends string>(labels: Record<K, string>, value: string | null | undefined): string {
  if (!value) return "";
  return (labels as Record<string, string>)[value] ?? value;
}

/** "12 Elm Road, Flat 3" — the first lines of the address without the town. */
export function streetAddress(p: Pick<PropertySummary, "addressLine1" | "addressLine2">): string {
  return [p.addressLine1, p.addressLine2].filter(Boolean).join(", ");
}
