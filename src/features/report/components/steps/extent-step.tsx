import type { Control } from "react-hook-form";
import { useTranslation } from "react-i18next";
import { i18n } from "@/lib/i18n/i18n";
import { AREAS, DURATIONS, type CaseReport } from "@/lib/schemas/case-report";
import { choices } from "../../labels";
import type { ReportFormValues } from "../../lib/draft";
import { ChoiceField } from "../choice-field";

/** Step 2: how long it has been happening, and how big the biggest patch is. */
export function ExtentStep({ control }: { control: Control<ReportFormValues, unknown, CaseReport> }) {
  const { t } = useTranslation("report", { i18n });
  return (
    <div className="flex flex-col gap-6">
      <p>{t("extent.intro")}</p>
      <ChoiceField
        control={control}
        name="since"
        kind="radio"
        legend={t("extent.since")}
        options={choices(t, "duration", DURATIONS)}
        clearLabel={
          <>
            {t("form.clearAnswer")}
            <span className="sr-only">: {t("extent.sinceShort")}</span>
          </>
        }
      />
      <ChoiceField
        control={control}
        name="area"
        kind="radio"
        legend={t("extent.area")}
        hint={t("extent.areaHint")}
        options={choices(t, "area", AREAS)}
        clearLabel={
          <>
            {t("form.clearAnswer")}
            <span className="sr-only">: {t("extent.areaShort")}</span>
          </>
        }
      />
    </div>
  );
}
