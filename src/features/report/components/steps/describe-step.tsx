import type { UseFormReturn } from "react-hook-form";
import { Textarea } from "@/components/ui/field";
import { LOCATIONS, OBSERVATIONS, type CaseReport } from "@/lib/schemas/case-report";
import type { RoomOption } from "../../api/types";
import { choices, locationLabels, observationLabels } from "../../labels";
import type { ReportFormValues } from "../../lib/draft";
import { ChoiceField } from "../choice-field";

const DESCRIBE_HINT =
  "In your own words. For example: black spots on the bedroom ceiling, and water on the windows every morning.";

/** Step 1: what the tenant can see, where, and in which rooms. */
export function DescribeStep({
  form,
  rooms,
  describe = { label: "What can you see?", hint: DESCRIBE_HINT },
}: {
  form: UseFormReturn<ReportFormValues, unknown, CaseReport>;
  rooms: readonly RoomOption[];
  /** Staff logging a report word the first question for themselves; the choices stay the same. */
  describe?: { label: string; hint: string };
}) {
  const { control, register, formState } = form;
  return (
    <div className="flex flex-col gap-6">
      <Textarea
        label={describe.label}
        hint={describe.hint}
        rows={4}
        error={formState.errors.description?.message}
        {...register("description")}
      />
      <ChoiceField
        control={control}
        name="locations"
        kind="checkbox"
        legend="Where is it?"
        hint="Choose all that apply."
        columns
        options={choices(locationLabels, LOCATIONS)}
      />
      <ChoiceField
        control={control}
        name="observations"
        kind="checkbox"
        legend="What have you noticed?"
        hint="Choose all that apply."
        columns
        options={choices(observationLabels, OBSERVATIONS)}
      />
      {rooms.length ? (
        <ChoiceField
          control={control}
          name="roomIds"
          kind="checkbox"
          legend="Which rooms? (optional)"
          hint="Choose all that apply."
          columns
          options={rooms.map((r) => ({ value: r.id, label: r.name }))}
        />
      ) : null}
    </div>
  );
}
