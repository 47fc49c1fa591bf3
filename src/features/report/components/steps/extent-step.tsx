import type { Control } from "react-hook-form";
import { AREAS, DURATIONS, type CaseReport } from "@/lib/schemas/case-report";
import { areaLabels, choices, durationLabels } from "../../labels";
import type { ReportFormValues } from "../../lib/draft";
import { ChoiceField } from "../choice-field";

/** Step 2: how long it has been happening, and how big the biggest patch is. */
export function ExtentStep({ control }: { control: Control<ReportFormValues, unknown, CaseReport> }) {
  return (
    <div className="flex flex-col gap-6">
      <p>A rough idea is fine. You can skip either question.</p>
      <ChoiceField
        control={control}
        name="since"
        kind="radio"
        legend="How long has this been happening?"
        options={choices(durationLabels, DURATIONS)}
        clearLabel={
          <>
            Clear my answer<span className="sr-only">: how long</span>
          </>
        }
      />
      <ChoiceField
        control={control}
        name="area"
        kind="radio"
        legend="How big is the biggest patch?"
        hint="If there is no patch, only water on the windows, you can skip this."
        options={choices(areaLabels, AREAS)}
        clearLabel={
          <>
            Clear my answer<span className="sr-only">: how big</span>
          </>
        }
      />
    </div>
  );
}
