// What the calculator's figures mean, in plain words.
import { useId } from "react";
import { useTranslation } from "react-i18next";
import { BORDERLINE_SURFACE_RH_PCT, CRITICAL_TEMPERATURE_FACTOR, MOULD_SURFACE_RH_PCT } from "@/lib/domain";
import { i18n } from "@/lib/i18n/i18n";

const TERMS = ["dewPoint", "frostPoint", "surfaceHumidity", "temperatureFactor", "absoluteHumidity"] as const;

export function AboutTheNumbers() {
  const { t } = useTranslation("calculator", { i18n });
  const headingId = useId();
  const values = { mould: MOULD_SURFACE_RH_PCT, borderline: BORDERLINE_SURFACE_RH_PCT, critical: CRITICAL_TEMPERATURE_FACTOR };
  return (
    <section aria-labelledby={headingId} className="max-w-reading">
      <h2 id={headingId} className="text-xl font-bold">
        {t("about.heading")}
      </h2>
      <dl className="mt-2 flex flex-col gap-3">
        {TERMS.map((term) => (
          <div key={term}>
            <dt className="font-bold">{t(`about.${term}`)}</dt>
            <dd>{t(`about.${term}Text`, values)}</dd>
          </div>
        ))}
      </dl>
      <p className="mt-3 text-sm text-ink-soft">{t("about.snapshot")}</p>
    </section>
  );
}
