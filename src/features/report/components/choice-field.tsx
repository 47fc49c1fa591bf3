// One report question answered by choosing: a group of checkboxes or of radio buttons bound to a
// form field, with the field's error beside it.
import type { ReactNode } from "react";
import { Controller, type Control } from "react-hook-form";
import { useTranslation } from "react-i18next";
import { i18n } from "@/lib/i18n/i18n";
import type { CaseReport } from "@/lib/schemas/case-report";
import type { Choice } from "../labels";
import type { ReportFormValues } from "../lib/draft";
import { fieldErrorText } from "../lib/field-errors";
import type { FieldName } from "../lib/steps";
import { CheckboxGroup, RadioGroup } from "./choice-fields";

type Option = { value: string | number; label: ReactNode; hint?: string };

interface ChoiceFieldProps {
  control: Control<ReportFormValues, unknown, CaseReport>;
  name: FieldName;
  /** Checkboxes: any number of answers; radio buttons: one, which can be cleared. */
  kind: "checkbox" | "radio";
  legend: ReactNode;
  hint?: ReactNode;
  options: readonly Option[];
  columns?: boolean;
  /** Radio buttons: the button that clears the answer. */
  clearLabel?: ReactNode;
  /** For an answer kept partly outside the field (the household question): what is ticked and what a change does. */
  value?: readonly (string | number)[];
  onChange?: (next: never[]) => void;
  after?: ReactNode;
}

export function ChoiceField({
  control,
  name,
  kind,
  legend,
  hint,
  options,
  columns,
  clearLabel,
  value,
  onChange,
  after,
}: ChoiceFieldProps) {
  const { t } = useTranslation("report", { i18n });
  return (
    <Controller
      control={control}
      name={name}
      render={({ field, fieldState }) =>
        kind === "checkbox" ? (
          <CheckboxGroup<string | number>
            legend={legend}
            hint={hint}
            columns={columns}
            options={options}
            value={(value ?? field.value) as (string | number)[] | undefined}
            onChange={(onChange as ((next: (string | number)[]) => void) | undefined) ?? field.onChange}
            onBlur={onChange ? undefined : field.onBlur}
            inputRef={field.ref}
            error={fieldErrorText(t, name, fieldState.error)}
            after={after}
          />
        ) : (
          <RadioGroup<string>
            legend={legend}
            hint={hint}
            options={options as readonly Choice<string>[]}
            value={field.value as string | undefined}
            onChange={field.onChange}
            inputRef={field.ref}
            error={fieldErrorText(t, name, fieldState.error)}
            clearLabel={clearLabel}
          />
        )
      }
    />
  );
}
