import type { UseFormReturn } from "react-hook-form";
import { useTranslation } from "react-i18next";
import { Textarea } from "@/components/ui/field";
import { i18n } from "@/lib/i18n/i18n";
import { LOCATIONS, OBSERVATIONS, type CaseReport } from "@/lib/schemas/case-report";
import type { RoomOption } from "../../api/types";
import { choices } from "../../labels";
import { fieldErrorText } from "../../lib/field-errors";
import type { ReportFormValues } from "../../lib/draft";
import { ChoiceField } from "../choice-field";

/** Step 1: what the tenant can see, where, and in which rooms. */
export function DescribeStep({
  form,
  rooms,
  describe,
}: {
  form: UseFormReturn<ReportFormValues, unknown, CaseReport>;
  rooms: readonly RoomOption[];
  /** Staff logging a report word the first question for themselves; the choices stay the same. */
  describe?: { label: string; hint: string };
}) {
  const { t } = useTranslation("report", { i18n });
  const { control, register, formState } = form;
  return (
    <div className="flex flex-col gap-6">
      <Textarea
        label={describe?.label ?? t("describe.label")}
        hint={describe?.hint ?? t("describe.hint")}
        rows={4}
        error={fieldErrorText(t, "description", formState.errors.description)}
        {...register("description")}
      />
      <ChoiceField
        control={control}
        name="locations"
        kind="checkbox"
        legend={t("describe.where")}
        hint={t("form.chooseAll")}
        columns
        options={choices(t, "location", LOCATIONS)}
      />
      <ChoiceField
        control={control}
        name="observations"
        kind="checkbox"
        legend={t("describe.noticed")}
        hint={t("form.chooseAll")}
        columns
        options={choices(t, "observation", OBSERVATIONS)}
      />
      {rooms.length ? (
        <ChoiceField
          control={control}
          name="roomIds"
          kind="checkbox"
          legend={t("describe.rooms")}
          hint={t("form.chooseAll")}
          columns
          options={rooms.map((r) => ({ value: r.id, label: <span translate="no">{r.name}</span> }))}
        />
      ) : null}
    </div>
  );
}
