import i18next, { type PostProcessorModule, type ResourceLanguage } from "i18next";
import ICU from "i18next-icu";
import { initReactI18next } from "react-i18next";
import { DEFAULT_LNG, languageByLng, lngFromTag, type Lng } from "./languages";
import { pseudoLocalise } from "./pseudo";

/**
 * The tenant-facing text, one JSON file per namespace and language under src/locales (ICU MessageFormat:
 * `{count, plural, one {# photo} other {# photos}}`, `{when, date, medium}`). English is built in; the
 * other languages are fetched when first chosen. Staff screens stay in English and never load this module,
 * so the officers' queue does not carry it (bench:queue's first rows).
 */
const english = import.meta.glob<ResourceLanguage[string]>("/src/locales/en-GB/*.json", { eager: true, import: "default" });
const others = import.meta.glob<ResourceLanguage[string]>(["/src/locales/*/*.json", "!/src/locales/en-GB/*.json"], {
  import: "default",
});

const namespaceOf = (path: string) => path.replace(/^.*\/([^/]+)\.json$/, "$1");
const languageOf = (path: string) => path.replace(/^\/src\/locales\/([^/]+)\/.*$/, "$1");

const byNamespace = (files: Record<string, ResourceLanguage[string]>): ResourceLanguage =>
  Object.fromEntries(Object.entries(files).map(([path, messages]) => [namespaceOf(path), messages]));

export const NAMESPACES = Object.keys(english).map(namespaceOf);

const pseudo: PostProcessorModule = {
  type: "postProcessor",
  name: "pseudo",
  process: (value: string, _key: string | string[], _options: unknown, translator: { language?: string }) =>
    translator.language === "en-XA" || translator.language === "ar-XB"
      ? pseudoLocalise(value, translator.language === "ar-XB")
      : value,
};

export const i18n = i18next.createInstance();

void i18n
  .use(ICU)
  .use(pseudo)
  .use(initReactI18next)
  .init({
    lng: DEFAULT_LNG,
    fallbackLng: DEFAULT_LNG,
    // Pseudo-locales have no files: they read English and transform it.
    resources: { [DEFAULT_LNG]: byNamespace(english) },
    partialBundledLanguages: true,
    ns: NAMESPACES,
    defaultNS: "common",
    postProcess: ["pseudo"],
    interpolation: { escapeValue: false },
    returnNull: false,
    react: { useSuspense: false },
    initAsync: false,
  });

async function loadLanguage(lng: Lng): Promise<void> {
  if (lng === DEFAULT_LNG || lng === "en-XA" || lng === "ar-XB" || i18n.hasResourceBundle(lng, "common")) return;
  const files = Object.entries(others).filter(([path]) => languageOf(path) === lng);
  const loaded = await Promise.all(files.map(async ([path, load]) => [namespaceOf(path), await load()] as const));
  for (const [ns, messages] of loaded) i18n.addResourceBundle(lng, ns, messages, true, true);
}

/** Shows the app in the language for `tag` ("cy", "cy-GB", "en"…), loading its text first; sets the page's lang and dir. */
export async function showLanguage(tag: string | null | undefined): Promise<Lng> {
  const lng = lngFromTag(tag);
  await loadLanguage(lng);
  await i18n.changeLanguage(lng);
  document.documentElement.lang = lng;
  document.documentElement.dir = languageByLng(lng)?.dir ?? "ltr";
  return lng;
}
