import { useId, type ReactNode, type Ref } from "react";
import { FieldError } from "@/components/ui/field";
import { cn } from "@/lib/cn";
import type { Choice } from "../lib/labels";

interface RadioGroupProps<V extends string> {
  legend: ReactNode;
  hint?: ReactNode;
  error?: string;
  options: readonly Choice<V>[];
  value: V | "";
  onChange: (next: V) => void;
  /** Given to the first option, so a failed check can move focus to the group. */
  inputRef?: Ref<HTMLInputElement>;
  disabled?: boolean;
  columns?: boolean;
  className?: string;
}

const optionRow =
  "flex cursor-pointer items-start gap-3 rounded-md border border-line-strong bg-surface px-3 py-2 " +
  "hover:bg-dew-50 has-[:checked]:border-2 has-[:checked]:border-dew-700 has-[:checked]:bg-dew-50";

/** A fieldset of radio buttons whose legend names the group; hint and error are read with it. */
export function RadioGroup<V extends string>({ legend, hint, error, options, value, onChange, inputRef, disabled, columns, className }: RadioGroupProps<V>) {
  const id = useId();
  const describedBy = [hint ? `${id}-hint` : null, error ? `${id}-error` : null].filter(Boolean).join(" ") || undefined;
  return (
    <fieldset aria-describedby={describedBy} disabled={disabled} className={cn("flex min-w-0 flex-col gap-2", className)}>
      <legend className="mb-1 font-bold text-ink">{legend}</legend>
      {hint ? (
        <p id={`${id}-hint`} className="-mt-1 text-sm text-ink-soft">
          {hint}
        </p>
      ) : null}
      {error ? <FieldError id={`${id}-error`}>{error}</FieldError> : null}
      <div className={cn("grid grid-cols-1 gap-2", columns && "sm:grid-cols-2")}>
        {options.map((option, i) => (
          <label key={option.value} className={optionRow}>
            <input
              ref={i === 0 ? inputRef : undefined}
              type="radio"
              name={id}
              value={option.value}
              checked={value === option.value}
              onChange={() => onChange(option.value)}
              aria-invalid={error ? true : undefined}
              className="mt-0.5 size-5 shrink-0 accent-dew-700"
            />
            <span className="flex flex-col">
              <span>{option.label}</span>
              {option.hint ? <span className="text-sm text-ink-soft">{option.hint}</span> : null}
            </span>
          </label>
        ))}
      </div>
    </fieldset>
  );
}
