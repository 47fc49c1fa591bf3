import { useTranslation } from "react-i18next";
import { isIsoDate, LONDON } from "@/lib/dates";

/**
 * Dates in the reader's language ("3 March 2024", "3 Mawrth 2024"), in London time; a calendar date
 * (YYYY-MM-DD) is shown as it is. It goes through the `home:date` message so the pseudo-locales mark it
 * as translated text like any other.
 */
export function useFormatDate(): (value: string | null | undefined) => string {
  const { t, i18n } = useTranslation("home");
  const locale = i18n.language === "cy" ? "cy" : "en-GB";
  return (value) => {
    if (!value) return "";
    const calendar = isIsoDate(value);
    const d = new Date(calendar ? `${value}T00:00:00Z` : value);
    if (Number.isNaN(d.getTime())) return value;
    const when = new Intl.DateTimeFormat(locale, {
      day: "numeric",
      month: "long",
      year: "numeric",
      timeZone: calendar ? "UTC" : LONDON,
    }).format(d);
    return t("date", { when });
  };
}
