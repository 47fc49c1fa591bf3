import { EQUIPMENT_ANSWERS, HEATING_COST_ANSWERS, VULNERABILITIES } from "@/lib/schemas/case-report";
import type { ReportDraftState } from "../../hooks/use-report-draft";
import {
  EQUIPMENT_QUESTIONS,
  choices,
  equipmentQuestions,
  householdNoneLabel,
  heatingCostQuestion,
  householdPreferNotLabel,
  vulnerabilityLabels,
} from "../../labels";
import { ExclusiveCheckbox } from "../choice-fields";
import { ChoiceField } from "../choice-field";

type HomeStepProps = Pick<ReportDraftState, "form" | "household" | "setHouseholdList" | "setHouseholdExclusive"> & {
  headingId: string;
};

/** Step 3: what is fitted in the home and whether it works, and who lives there (all optional). */
export function HomeStep({ form, household, setHouseholdList, setHouseholdExclusive, headingId }: HomeStepProps) {
  const { control, watch } = form;
  const vulnerability = watch("vulnerability");
  return (
    <div className="flex flex-col gap-8">
      <section aria-labelledby={`${headingId}-home`} className="flex flex-col gap-5">
        <h3 id={`${headingId}-home`} className="text-lg font-bold">
          About your home
        </h3>
        <p className="-mt-3">
          These questions are about what is fitted in your home and whether it works. The answers help your landlord find the
          cause. You can skip any of them.
        </p>
        {EQUIPMENT_QUESTIONS.map((q) => (
          <ChoiceField
            key={q}
            control={control}
            name={`equipment.${q}`}
            kind="radio"
            legend={equipmentQuestions[q].question}
            hint={equipmentQuestions[q].hint}
            options={EQUIPMENT_ANSWERS.map((value) => ({ value, label: equipmentQuestions[q].answers[value] }))}
            clearLabel={
              <>
                Clear my answer<span className="sr-only">: {equipmentQuestions[q].question}</span>
              </>
            }
          />
        ))}
      </section>
      <section aria-labelledby={`${headingId}-household`} className="flex flex-col gap-3">
        <h3 id={`${headingId}-household`} className="text-lg font-bold">
          About your household
        </h3>
        <p>
          Damp and mould are a bigger risk to some people's health. We ask so your landlord can prioritise, and visit sooner where
          it matters most. You don't have to answer.
        </p>
        <ChoiceField
          control={control}
          name="vulnerability"
          kind="checkbox"
          legend="Does anyone living in your home fit any of these?"
          hint="Choose all that apply."
          options={choices(vulnerabilityLabels, VULNERABILITIES)}
          value={household === "list" ? (vulnerability ?? []) : []}
          onChange={setHouseholdList}
          after={
            <div className="flex flex-col gap-2">
              <p className="text-sm font-semibold text-ink-soft" aria-hidden="true">
                or
              </p>
              <ExclusiveCheckbox
                label={householdNoneLabel}
                checked={household === "none"}
                onChange={(c) => setHouseholdExclusive("none", c)}
              />
              <ExclusiveCheckbox
                label={householdPreferNotLabel}
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
          legend={heatingCostQuestion.question}
          hint={heatingCostQuestion.hint}
          options={choices(heatingCostQuestion.answers, HEATING_COST_ANSWERS)}
          clearLabel={
            <>
              Clear my answer<span className="sr-only">: {heatingCostQuestion.question}</span>
            </>
          }
        />
      </section>
    </div>
  );
}
