// Safety cautions and common-practice suggestions shown beside any damp or mould result
// (TRADE.md §6 and §7, in our own words). The suggestions are about the home, never the people in it.
import { useId } from "react";
import { useTranslation } from "react-i18next";
import { cn } from "@/lib/cn";
import { i18n } from "@/lib/i18n/i18n";

interface SafetyCautionsProps {
  /** Heading level of the two headings, so the page outline stays right (2 by default). */
  headingLevel?: 2 | 3;
  className?: string;
}

export function SafetyCautions({ headingLevel = 2, className }: SafetyCautionsProps) {
  const { t } = useTranslation("risk", { i18n });
  const safetyId = useId();
  const helpsId = useId();
  const Heading = headingLevel === 2 ? "h2" : "h3";
  const headingClass = cn("font-bold text-ink", headingLevel === 2 ? "text-xl" : "text-lg");

  return (
    <div className={cn("flex flex-col gap-6", className)}>
      <section aria-labelledby={safetyId} className="rounded-lg border-l-4 border-ember-400 bg-ember-50 p-4 sm:p-5">
        <Heading id={safetyId} className={headingClass}>
          {t("cautions.safeHeading")}
        </Heading>
        <ul className="mt-2 list-disc space-y-2 pl-5">
          {(["noOven", "clean", "notClean", "bleach", "vents", "trades"] as const).map((key) => (
            <li key={key}>
              <strong>{t(`cautions.${key}Strong`)}</strong>
              {t(`cautions.${key}`)}
            </li>
          ))}
        </ul>
      </section>

      <section aria-labelledby={helpsId}>
        <Heading id={helpsId} className={headingClass}>
          {t("cautions.helpsHeading")}
        </Heading>
        <p className="mt-1 text-ink-soft">{t("cautions.helpsIntro")}</p>
        <ul className="mt-2 list-disc space-y-2 pl-5">
          {(["helpVents", "helpFans", "helpWarmth", "helpWipe", "helpSurveyor"] as const).map((key) => (
            <li key={key}>{t(`cautions.${key}`)}</li>
          ))}
        </ul>
      </section>
    </div>
  );
}

/** Said wherever numbers are shown: the numbers never decide whether damp or mould is worth reporting. */
export function ReportStillMatters({ className }: { className?: string }) {
  const { t } = useTranslation("risk", { i18n });
  return (
    <div className={cn("flex items-start gap-3 rounded-md border-2 border-dew-600 bg-dew-50 px-4 py-3 text-ink", className)}>
      <svg viewBox="0 0 24 24" className="mt-0.5 size-6 shrink-0 text-dew-700" aria-hidden="true" focusable="false">
        <path d="M4 5h16v11H9l-5 4z" fill="none" stroke="currentColor" strokeWidth="2" strokeLinejoin="round" />
        <path d="M8 9h8M8 12h5" stroke="currentColor" strokeWidth="2" strokeLinecap="round" />
      </svg>
      <p>
        <strong>{t("cautions.stillMattersStrong")}</strong>
        {t("cautions.stillMatters")}
      </p>
    </div>
  );
}
