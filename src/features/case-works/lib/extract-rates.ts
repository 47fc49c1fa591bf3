// Extract rates for fans, for the people who order fan work. The figures are from
// /work/shared/TRADE.md §6, which gives them as found in the published source:
// Approved Document F (England, 2021), Volume 1. Nothing here is from memory.

export const EXTRACT_RATES_SOURCE = "Approved Document F (England, 2021), Volume 1";

export interface ExtractRate {
  room: string;
  /** Litres per second. */
  litresPerSecond: number;
  note?: string;
}

/** Intermittent extract: a fan that runs while the room is in use (and for a while after). */
export const INTERMITTENT_EXTRACT: readonly ExtractRate[] = [
  { room: "Kitchen", litresPerSecond: 30, note: "with a cooker hood that extracts to the outside" },
  { room: "Kitchen", litresPerSecond: 60, note: "without such a cooker hood" },
  { room: "Utility room", litresPerSecond: 30 },
  { room: "Bathroom", litresPerSecond: 15 },
  { room: "WC", litresPerSecond: 6 },
];

/** Continuous extract, at its high rate. */
export const CONTINUOUS_EXTRACT_HIGH: readonly ExtractRate[] = [
  { room: "Kitchen", litresPerSecond: 13 },
  { room: "Utility room", litresPerSecond: 8 },
  { room: "Bathroom", litresPerSecond: 8 },
];
