// VTT mould growth model: Hukka & Viitanen (1999), with the sensitivity classes of the 2010
// update (Ojanen et al. 2010; Viitanen et al. 2010), W = SQ = 0. Mould index M: 0 none,
// 1 microscopic traces, 3 first visible growth, 4 10–50 % visible cover, 6 ~100 % cover.
//
// Units are the classic trap: the growth rate is published PER DAY, the decline PER HOUR.
// Everything here steps in hours and converts growth explicitly (÷ 24).

export type MaterialSensitivity = "very-sensitive" | "sensitive" | "medium-resistant" | "resistant";

export const MATERIAL_SENSITIVITIES: readonly MaterialSensitivity[] = [
  "very-sensitive",
  "sensitive",
  "medium-resistant",
  "resistant",
];

export interface MaterialClass {
  id: MaterialSensitivity;
  label: string;
  /** k1 while M < 1. */
  k1BelowOne: number;
  /** k1 once M ≥ 1. */
  k1FromOne: number;
  /** Mmax = A + B·x − C·x². */
  a: number;
  b: number;
  c: number;
  /** RHmin, %: the critical RH above 20 °C and the floor below it. */
  rhMinPct: number;
  /** Relative decline coefficient. */
  declineFactor: number;
}

// k1, A, B, C and RHmin: TRADE.md §3 [S]. Decline factors: 1 for very sensitive [S]; 0.5, 0.25
// and 0.1 for the others are the relative coefficients commonly quoted from Ojanen et al. (2010)
// — from memory, not checked against the paper.
export const MATERIAL_CLASSES: Readonly<Record<MaterialSensitivity, MaterialClass>> = {
  "very-sensitive": {
    id: "very-sensitive",
    label: "Very sensitive (e.g. untreated pine sapwood)",
    k1BelowOne: 1,
    k1FromOne: 2,
    a: 1,
    b: 7,
    c: 2,
    rhMinPct: 80,
    declineFactor: 1,
  },
  sensitive: {
    id: "sensitive",
    label: "Sensitive (e.g. planed wood, paper-faced boards)",
    k1BelowOne: 0.578,
    k1FromOne: 0.386,
    a: 0.3,
    b: 6,
    c: 1,
    rhMinPct: 80,
    declineFactor: 0.5,
  },
  "medium-resistant": {
    id: "medium-resistant",
    label: "Medium resistant (e.g. concrete, mineral wool)",
    k1BelowOne: 0.072,
    k1FromOne: 0.097,
    a: 0,
    b: 5,
    c: 1.5,
    rhMinPct: 85,
    declineFactor: 0.25,
  },
  resistant: {
    id: "resistant",
    label: "Resistant (e.g. glass, metal)",
    k1BelowOne: 0.033,
    k1FromOne: 0.014,
    a: 0,
    b: 3,
    c: 1,
    rhMinPct: 85,
    declineFactor: 0.1,
  },
};

export const MAX_MOULD_INDEX = 6;

/** Decline rates, index units per hour, by time since conditions turned unfavourable. */
export const DECLINE_FIRST_6H_PER_HOUR = 0.00133;
export const DECLINE_AFTER_24H_PER_HOUR = 0.000667;

export function materialClass(material: MaterialSensitivity): MaterialClass {
  const found = MATERIAL_CLASSES[material];
  if (!found) throw new RangeError(`unknown material sensitivity "${String(material)}"`);
  return found;
}

/**
 * Critical RH, %. Published: the polynomial −0.00267·T³ + 0.160·T² − 3.13·T + 100 for T ≤ 20 °C
 * and RHmin above. Our convention: at T ≤ 20 °C we take max(polynomial, RHmin), so the class's
 * RHmin is a floor everywhere (this matters for the 85 % classes, where the polynomial falls
 * below 85 from about 7 °C); above 20 °C exactly RHmin. The polynomial gives 80.04 at 20 °C, so
 * very sensitive and sensitive materials step down by 0.04 %RH just above 20 °C.
 */
export function criticalRelativeHumidityPct(temperatureC: number, material: MaterialSensitivity): number {
  const { rhMinPct } = materialClass(material);
  if (temperatureC > 20) return rhMinPct;
  const t = temperatureC;
  const polynomial = -0.00267 * t * t * t + 0.16 * t * t - 3.13 * t + 100;
  return polynomial > rhMinPct ? polynomial : rhMinPct;
}

/** Growth is possible only between 0 and 50 °C and at or above the critical RH. */
export function isFavourableForGrowth(temperatureC: number, relativeHumidityPct: number, material: MaterialSensitivity): boolean {
  return temperatureC > 0 && temperatureC < 50 && relativeHumidityPct >= criticalRelativeHumidityPct(temperatureC, material);
}

/** Mmax = A + B·x − C·x² with x = (RHcrit − RH)/(RHcrit − 100). */
export function maximumMouldIndex(temperatureC: number, relativeHumidityPct: number, material: MaterialSensitivity): number {
  const cls = materialClass(material);
  const rhCrit = criticalRelativeHumidityPct(temperatureC, material);
  const x = (rhCrit - relativeHumidityPct) / (rhCrit - 100);
  return cls.a + cls.b * x - cls.c * x * x;
}

/**
 * dM/dt in index units PER DAY (Hukka & Viitanen 1999, W = SQ = 0):
 * k1·k2 / (7·exp(−0.68·ln T − 13.9·ln RH + 66.02)); 0 when conditions are not favourable.
 * RH above 100 % is taken as 100 %.
 */
export function mouldGrowthRatePerDay(
  mouldIndex: number,
  temperatureC: number,
  relativeHumidityPct: number,
  material: MaterialSensitivity,
): number {
  const rh = relativeHumidityPct > 100 ? 100 : relativeHumidityPct;
  if (!isFavourableForGrowth(temperatureC, rh, material)) return 0;
  const cls = materialClass(material);
  return growthRate(cls, mouldIndex, temperatureC, rh, criticalRelativeHumidityPct(temperatureC, material));
}

function growthRate(cls: MaterialClass, m: number, t: number, rh: number, rhCrit: number): number {
  const x = (rhCrit - rh) / (rhCrit - 100);
  const mMax = cls.a + cls.b * x - cls.c * x * x;
  const k2 = 1 - Math.exp(2.3 * (m - mMax));
  if (!(k2 > 0)) return 0;
  const k1 = m < 1 ? cls.k1BelowOne : cls.k1FromOne;
  return (k1 * k2) / (7 * Math.exp(-0.68 * Math.log(t) - 13.9 * Math.log(rh) + 66.02));
}

/**
 * Decline, index units, over the stretch of an unfavourable period from `fromHour` to `toHour`
 * after it began: −0.00133/h up to 6 h, 0 from 6 h to 24 h, −0.000667/h after 24 h, times the
 * material's decline factor. Integrated exactly, so the answer does not depend on step length.
 */
export function mouldDecline(fromHour: number, toHour: number, material: MaterialSensitivity): number {
  return declineOver(fromHour, toHour) * materialClass(material).declineFactor;
}

function declineOver(fromHour: number, toHour: number): number {
  const early = Math.max(0, Math.min(toHour, 6) - Math.min(fromHour, 6));
  const late = Math.max(0, toHour - Math.max(fromHour, 24));
  return DECLINE_FIRST_6H_PER_HOUR * early + DECLINE_AFTER_24H_PER_HOUR * late;
}

/** The model's running state. `unfavourableHours` is the time since conditions last allowed growth. */
export interface MouldIndexState {
  material: MaterialSensitivity;
  m: number;
  max: number;
  unfavourableHours: number;
}

export function createMouldIndexState(material: MaterialSensitivity = "very-sensitive", initial = 0): MouldIndexState {
  materialClass(material);
  return { material, m: initial, max: initial, unfavourableHours: 0 };
}

/**
 * Advance the state by `hours` under constant conditions (explicit Euler for growth, with k1 and
 * k2 taken at the start of the step; exact integration for decline). Mutates and returns `state`.
 */
export function stepMouldIndex(
  state: MouldIndexState,
  temperatureC: number,
  relativeHumidityPct: number,
  hours: number,
): MouldIndexState {
  if (!(hours >= 0)) throw new RangeError(`a mould index step needs a non-negative duration, got ${hours}`);
  const cls = MATERIAL_CLASSES[state.material];
  const rh = relativeHumidityPct > 100 ? 100 : relativeHumidityPct;
  const rhCrit = criticalRelativeHumidityPct(temperatureC, state.material);
  let m = state.m;
  if (temperatureC > 0 && temperatureC < 50 && rh >= rhCrit) {
    m += (growthRate(cls, m, temperatureC, rh, rhCrit) * hours) / 24;
    if (m > MAX_MOULD_INDEX) m = MAX_MOULD_INDEX;
    state.unfavourableHours = 0;
  } else {
    const from = state.unfavourableHours;
    const to = from + hours;
    m -= declineOver(from, to) * cls.declineFactor;
    if (m < 0) m = 0;
    state.unfavourableHours = to;
  }
  state.m = m;
  if (m > state.max) state.max = m;
  return state;
}
