import { useTranslation } from "react-i18next";
import { rememberChoice } from "@/lib/i18n/choice";
import { showLanguage } from "@/lib/i18n/i18n";
import { LANGUAGES, type Lng } from "@/lib/i18n/languages";
import { cn } from "@/lib/cn";
import { useSetMyLanguage } from "../api/set-my-language";

/**
 * "English | Cymraeg", each name in its own language (and marked so: a screen reader says it in that
 * language, and nobody translates it). Signed out, the choice stays on this device; a signed-in tenant's
 * is saved on their account as well, so it follows them to another phone and into e-mails and texts.
 */
export function LanguageSwitch({ signedIn }: { signedIn: boolean }) {
  const { t, i18n } = useTranslation("common");
  const save = useSetMyLanguage();

  const choose = async (lng: Lng, stored: "en" | "cy") => {
    rememberChoice(lng);
    await showLanguage(lng);
    if (signedIn) save.mutate({ language: stored });
  };

  return (
    <div role="group" aria-label={t("language.label")} className="flex items-center gap-1">
      {LANGUAGES.map((l) => {
        const current = i18n.language === l.lng;
        return (
          <button
            key={l.lng}
            type="button"
            lang={l.lng}
            translate="no"
            aria-pressed={current}
            onClick={() => void choose(l.lng, l.stored)}
            className={cn(
              "min-h-9 rounded-md px-2 font-semibold text-mist underline-offset-4 hover:bg-dew-900 hover:text-paper",
              current && "bg-dew-800 text-paper underline decoration-dew-300 decoration-2",
            )}
          >
            {l.name}
          </button>
        );
      })}
      {save.isError ? (
        <span role="alert" className="text-sm text-paper">
          {t("language.notSaved")}
        </span>
      ) : null}
    </div>
  );
}
