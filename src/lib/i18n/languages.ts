/**
 * The languages a tenant may read Dewline in. English and Welsh are complete; the two pseudo-locales
 * exist only to test: `en-XA` accents and lengthens every translated string (an English word left on
 * the page is a string that skipped translation), `ar-XB` does the same and turns the page right to left.
 */
export const LANGUAGES = [
  { lng: "en-GB", stored: "en", name: "English", dir: "ltr" },
  { lng: "cy", stored: "cy", name: "Cymraeg", dir: "ltr" },
] as const;

export const PSEUDO_LANGUAGES = [
  { lng: "en-XA", stored: "en-XA", name: "[Pseudo]", dir: "ltr" },
  { lng: "ar-XB", stored: "ar-XB", name: "[Pseudo RTL]", dir: "rtl" },
] as const;

export type Language = (typeof LANGUAGES)[number] | (typeof PSEUDO_LANGUAGES)[number];
export type Lng = Language["lng"];

export const DEFAULT_LNG: Lng = "en-GB";
const ALL: readonly Language[] = [...LANGUAGES, ...PSEUDO_LANGUAGES];

export const languageByLng = (lng: string): Language | undefined => ALL.find((l) => l.lng === lng);

/**
 * The language to show for a stored tag (a user's preferred_language: "en", "cy", "pl"…, or a browser's
 * "cy-GB"). Languages Dewline has no text for fall back to English.
 */
export function lngFromTag(tag: string | null | undefined): Lng {
  if (!tag) return DEFAULT_LNG;
  const exact = ALL.find((l) => l.lng.toLowerCase() === tag.toLowerCase() || l.stored === tag.toLowerCase());
  if (exact) return exact.lng;
  const primary = tag.toLowerCase().split("-")[0];
  return LANGUAGES.find((l) => l.stored === primary)?.lng ?? DEFAULT_LNG;
}
