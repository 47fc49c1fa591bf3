// UK postcodes and UPRNs as typed by people and exported by registers: one check for the homes form
// (src/lib/schemas/homes.ts) and the stock import alike.

/**
 * A UK postcode: an outward code (area letters, district digit, maybe a letter or digit) and an inward
 * code (a digit and two letters), e.g. "A9 9AA", "AA9A 9AA". The shapes are Royal Mail's published
 * postcode formats (from memory); "GIR 0AA" is the one historical exception kept.
 */
const POSTCODE = /^(?:GIR0AA|[A-Z]{1,2}\d[A-Z\d]?\d[A-Z]{2})$/;

/** Whether the text is a UK postcode, whatever its spacing and case. */
export function isUkPostcode(value: string): boolean {
  return POSTCODE.test(value.replace(/\s+/g, "").toUpperCase());
}

/** "ab12cd", "AB1  2CD" → "AB1 2CD"; anything that is not a postcode is returned as typed (trimmed). */
export function normalisePostcode(value: string): string {
  const compact = value.replace(/\s+/g, "").toUpperCase();
  if (!POSTCODE.test(compact)) return value.trim();
  return `${compact.slice(0, -3)} ${compact.slice(-3)}`;
}

/** The postcode normalised ("ab12cd" → "AB1 2CD"), or null when the text is not a UK postcode. */
export function readPostcode(value: string): string | null {
  const compact = value.replace(/\s+/g, "").toUpperCase();
  if (!POSTCODE.test(compact)) return null;
  return `${compact.slice(0, -3)} ${compact.slice(-3)}`;
}

/** A Unique Property Reference Number: up to 12 digits (OS AddressBase; from memory). */
export const UPRN = /^\d{1,12}$/;
