import { DEFAULT_LNG, LANGUAGES, PSEUDO_LANGUAGES, lngFromTag, type Lng } from "./languages";

/**
 * Which language to show, without loading any text (the router and the signed-in shell use this, and
 * staff screens must not carry i18next). In order:
 * 1. `?lang=` on the address, kept for this tab (sessionStorage): e-mail links and tests open a page
 *    in a language; the pseudo-locales come only this way and are never stored on the server;
 * 2. for a signed-in tenant, the language stored on their account;
 * 3. the choice made on this device while signed out (localStorage);
 * 4. the browser's languages (navigator.languages): Welsh when it lists Welsh before English.
 * Staff always see English.
 */
const TAB_KEY = "dewline.language.tab";
const DEVICE_KEY = "dewline.language";

const URL_LANGUAGES: readonly string[] = [...LANGUAGES, ...PSEUDO_LANGUAGES].map((l) => l.lng);

/** A stored value only if it is one of ours, else null (storage can hold anything). */
const known = (value: string | null | undefined): Lng | null => {
  if (!value) return null;
  const lng = lngFromTag(value);
  return URL_LANGUAGES.includes(lng) && (lng !== DEFAULT_LNG || value.toLowerCase().startsWith("en")) ? lng : null;
};

// Storage can be switched off or full (private windows): a language then lasts for the page only.
function read(storage: () => Storage, key: string): string | null {
  try {
    return storage().getItem(key);
  } catch {
    return null;
  }
}
function write(storage: () => Storage, key: string, value: string | null): void {
  try {
    if (value === null) storage().removeItem(key);
    else storage().setItem(key, value);
  } catch {
    // Not kept; nothing else to do.
  }
}

/** `?lang=` on this address, if it names a language we have (cy, en, en-GB, en-XA, ar-XB). */
export function languageFromUrl(search: string): Lng | null {
  return known(new URLSearchParams(search).get("lang"));
}

/** The language picked for this tab by a `?lang=` address (kept as the tab moves on), or null. */
export function tabLanguage(search: string = window.location.search): Lng | null {
  const fromUrl = languageFromUrl(search);
  if (fromUrl) write(() => window.sessionStorage, TAB_KEY, fromUrl);
  return fromUrl ?? known(read(() => window.sessionStorage, TAB_KEY));
}

/** The browser's first language that Dewline has, English when none. */
function browserLanguage(): Lng {
  for (const tag of navigator.languages ?? [navigator.language]) {
    const primary = tag.toLowerCase().split("-")[0];
    const match = LANGUAGES.find((l) => l.stored === primary);
    if (match) return match.lng;
  }
  return DEFAULT_LNG;
}

/** Signed out: this tab's `?lang=`, else this device's choice, else the browser's languages. */
export function deviceLanguage(search?: string): Lng {
  return tabLanguage(search) ?? known(read(() => window.localStorage, DEVICE_KEY)) ?? browserLanguage();
}

/** The language for whoever is (or is not) signed in; see the order above. */
export function languageFor(user: { role: string; language: string | null } | null, search?: string): Lng {
  if (!user) return deviceLanguage(search);
  if (user.role !== "tenant") return DEFAULT_LNG;
  return tabLanguage(search) ?? (user.language ? lngFromTag(user.language) : deviceLanguage(search));
}

/**
 * A choice made with the language switch: kept on this device, and it replaces this tab's `?lang=`
 * pick (someone who chose has said what they want).
 */
export function rememberChoice(lng: Lng): void {
  write(() => window.localStorage, DEVICE_KEY, lng);
  write(() => window.sessionStorage, TAB_KEY, null);
}

/** Staff screens never load the language machinery: they only put the page back to English. */
export function markPageEnglish(): void {
  document.documentElement.lang = DEFAULT_LNG;
  document.documentElement.dir = "ltr";
}
