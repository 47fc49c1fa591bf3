import { useTranslation } from "react-i18next";
import { formatDateIn } from "@/lib/dates";

/**
 * Dates in the reader's language ("3 March 2024", "3 Mawrth 2024"), in London time; a calendar date
 * (YYYY-MM-DD) is shown as it is. It is formatDateIn's "day", through the `home:date` message so the
 * pseudo-locales mark it as translated text like any other.
 */
export function useFormatDate(): (value: string | null | undefined) => string {
  const { t, i18n } = useTranslation("home");
  return (value) => {
    if (!value) return "";
    const when = formatDateIn(i18n.language, value, "day");
    // Not a date: shown as it came, as formatDateIn does.
    return when === value ? value : t("date", { when });
  };
}
