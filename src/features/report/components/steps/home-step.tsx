import { useTranslation } from "react-i18next";
import { i18n } from "@/lib/i18n/i18n";
import { VULNERABILITIES } from "@/lib/schemas/case-report";
import type { ReportDraftState } from "../../hooks/use-report-draft";
import { EQUIPMENT_QUESTIONS, choices, equipmentQuestion } from "../../labels";
import { ExclusiveCheckbox } from "../choice-fields";
import { ChoiceField } from "../choice-field";

type HomeStepProps = Pick<ReportDraftState, "form" | "household" | "setHouseholdList" | "setHouseholdExclusive"> & {
  headingId: string;
};

/** Step 3: what is fitted in the home and whether it works, and who lives there (all optional). */
export function HomeStep({ form, household, setHouseholdList, setHouseholdExclusive, headingId }: HomeStepProps) {
  const { t } = useTranslation("report", { i18n });
  const { control, watch } = form;
  const heatingCost = equipmentQuestion(t, "heatingCost");
  const vulnerability = watch("vulnerability");
  return (
    <div className="flex flex-col gap-8">
      <section aria-labelledby={`${headingId}-home`} className="flex flex-col gap-5">
        <h3 id={`${headingId}-home`} className="text-lg font-bold">
          {t("home.homeHeading")}
        </h3>
        <p className="-mt-3">{t("home.homeIntro")}</p>
        {EQUIPMENT_QUESTIONS.map((q) => {
          const question = equipmentQuestion(t, q);
          return (
            <ChoiceField
              key={q}
              control={control}
              name={`equipment.${q}`}
              kind="radio"
              legend={question.question}
              hint={question.hint}
              options={question.choices}
              clearLabel={
                <>
                  {t("form.clearAnswer")}
                  <span className="sr-only">: {question.question}</span>
                </>
              }
            />
          );
        })}
      </section>
      <section aria-labelledby={`${headingId}-household`} className="flex flex-col gap-3">
        <h3 id={`${headingId}-household`} className="text-lg font-bold">
          {t("home.householdHeading")}
        </h3>
        <p>{t("home.householdIntro")}</p>
        <ChoiceField
          control={control}
          name="vulnerability"
          kind="checkbox"
          legend={t("home.householdQuestion")}
          hint={t("form.chooseAll")}
          options={choices(t, "vulnerability", VULNERABILITIES)}
          value={household === "list" ? (vulnerability ?? []) : []}
          onChange={setHouseholdList}
          after={
            <div className="flex flex-col gap-2">
              <p className="text-sm font-semibold text-ink-soft" aria-hidden="true">
                {t("form.or")}
              </p>
              <ExclusiveCheckbox
                label={t("household.none")}
                checked={household === "none"}
                onChange={(c) => setHouseholdExclusive("none", c)}
              />
              <ExclusiveCheckbox
                label={t("household.preferNot")}
                checked={household === "prefer-not"}
                onChange={(c) => setHouseholdExclusive("prefer-not", c)}
              />
            </div>
          }
        />
        <ChoiceField
          control={control}
          name="equipment.heatingCost"
          kind="radio"
          legend={heatingCost.question}
          hint={heatingCost.hint}
          options={heatingCost.choices}
          clearLabel={
            <>
              {t("form.clearAnswer")}
              <span className="sr-only">: {heatingCost.question}</span>
            </>
          }
        />
      </section>
    </div>
  );
}
