// Extract rates for the guidance note beside fan work, on the Works page and in the case's works.
// Every figure is copied from the project's trade reference (/work/shared/TRADE.md §6), which marks
// them [S]: found in the named published source. Nothing here is from memory.
// TRADE.md gives no continuous rate for a WC, so none is listed here.

export type ExtractRoom = "kitchen" | "utility" | "bathroom" | "wc";

export interface ExtractRate {
  room: ExtractRoom;
  /** The room in words. */
  label: string;
  /** Litres per second. */
  litresPerSecond: number;
  /** When the figure applies, if it depends on something ("with a cooker hood extracting outside"). */
  condition?: string;
  /** Where the figure comes from, named as TRADE.md names it. */
  source: string;
}

/** The published document the figures come from, its title written out ("Vol. 1" in TRADE.md). */
export const EXTRACT_RATES_DOCUMENT = "Approved Document F (England, 2021), Volume 1";

const INTERMITTENT_SOURCE = "Approved Document F (England, 2021), Vol. 1, intermittent extract rates";
const CONTINUOUS_SOURCE = "Approved Document F (England, 2021), Vol. 1, continuous extract (high rate)";

/** Intermittent extract: the fan runs while the room is in use (and a while after). */
export const INTERMITTENT_EXTRACT_RATES: readonly ExtractRate[] = [
  {
    room: "kitchen",
    label: "Kitchen",
    litresPerSecond: 30,
    condition: "with a cooker hood extracting outside",
    source: INTERMITTENT_SOURCE,
  },
  {
    room: "kitchen",
    label: "Kitchen",
    litresPerSecond: 60,
    condition: "without such a cooker hood",
    source: INTERMITTENT_SOURCE,
  },
  { room: "utility", label: "Utility room", litresPerSecond: 30, source: INTERMITTENT_SOURCE },
  { room: "bathroom", label: "Bathroom", litresPerSecond: 15, source: INTERMITTENT_SOURCE },
  { room: "wc", label: "WC", litresPerSecond: 6, source: INTERMITTENT_SOURCE },
];

/** Continuous extract at its high rate, where Approved Document F gives one (no WC figure in TRADE.md). */
export const CONTINUOUS_EXTRACT_RATES: readonly ExtractRate[] = [
  { room: "kitchen", label: "Kitchen", litresPerSecond: 13, source: CONTINUOUS_SOURCE },
  { room: "utility", label: "Utility room", litresPerSecond: 8, source: CONTINUOUS_SOURCE },
  { room: "bathroom", label: "Bathroom", litresPerSecond: 8, source: CONTINUOUS_SOURCE },
];

/** The work types that fit or change an extractor fan: the guidance is shown beside them. */
export const FAN_WORK_TYPES: readonly string[] = ["extractor-fan", "fan-upgrade"];
export const isFanWork = (type: string) => FAN_WORK_TYPES.includes(type);

/** The caution that goes with every fan note (TRADE.md §7: electrical work is for qualified trades). */
export const ELECTRICAL_CAUTION =
  "Fitting or rewiring a fan is electrical work: it must be done by a qualified electrician, to local regulations " +
  "(in England, Part P of the Building Regulations).";
