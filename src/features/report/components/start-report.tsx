import { useTranslation } from "react-i18next";
import { Link } from "react-router-dom";
import { buttonClasses } from "@/components/ui/button";
import { LogoMark } from "@/components/ui/logo";

export const REPORT_PATH = "/report";

/** The way in to a new report, for My home. */
export function StartReport() {
  const { t } = useTranslation("home");
  return (
    <section aria-labelledby="start-report-heading" className="rounded-lg border-2 border-dew-600 bg-dew-50 p-5">
      <div className="flex flex-col items-start gap-3 sm:flex-row">
        <LogoMark className="size-10 shrink-0 text-dew-600" />
        <div className="flex flex-col items-start gap-3">
          <h2 id="start-report-heading" className="text-xl font-bold">
            {t("start.heading")}
          </h2>
          <p>{t("start.text")}</p>
          <Link to={REPORT_PATH} className={buttonClasses("primary", "lg")}>
            {t("start.button")}
          </Link>
        </div>
      </div>
    </section>
  );
}
