import { useId, type ReactNode, type Ref } from "react";
import { FieldError } from "@/components/ui/field";
import { cn } from "@/lib/cn";

export interface RadioChoice<V extends string> {
  value: V;
  label: string;
  hint?: string;
}

interface RadioGroupProps<V extends string> {
  legend: ReactNode;
  hint?: ReactNode;
  error?: string;
  options: readonly RadioChoice<V>[];
  value: V | "";
  onChange: (next: V) => void;
  inputRef?: Ref<HTMLInputElement>;
  disabled?: boolean;
  /** Columns from the small breakpoint up; `true` means 2. */
  columns?: 1 | 2 | 3 | boolean;
  className?: string;
}

const optionRow =
  "flex cursor-pointer items-start gap-3 rounded-md border border-line-strong bg-surface px-3 py-2 " +
  "hover:bg-dew-50 has-[:checked]:border-2 has-[:checked]:border-dew-700 has-[:checked]:bg-dew-50";

/** A fieldset of radio buttons whose legend names the group; hint and error are read with it. */
export function RadioGroup<V extends string>({
  legend,
  hint,
  error,
  options,
  value,
  onChange,
  inputRef,
  disabled,
  columns = 1,
  className,
}: RadioGroupProps<V>) {
  const cols = columns === true ? 2 : columns === false ? 1 : columns;
  const id = useId();
  const describedBy = [hint ? `${id}-hint` : null, error ? `${id}-error` : null].filter(Boolean).join(" ") || undefined;
  return (
    <fieldset aria-describedby={describedBy} disabled={disabled} className={cn("flex min-w-0 flex-col gap-2", className)}>
      <legend id={`${id}-legend`} className="mb-1 font-bold text-ink">
        {legend}
      </legend>
      {hint ? (
        <p id={`${id}-hint`} className="-mt-1 text-sm text-ink-soft">
          {hint}
        </p>
      ) : null}
      {error ? <FieldError id={`${id}-error`}>{error}</FieldError> : null}
      {/* The radios' own group carries the invalid state: a radio input does not support aria-invalid. */}
      <div
        role="radiogroup"
        aria-labelledby={`${id}-legend`}
        aria-invalid={error ? true : undefined}
        className={cn("grid grid-cols-1 gap-2", cols === 2 && "sm:grid-cols-2", cols === 3 && "sm:grid-cols-3")}
      >
        {options.map((option, i) => (
          <label key={option.value} className={optionRow}>
            <input
              ref={i === 0 ? inputRef : undefined}
              type="radio"
              name={id}
              value={option.value}
              checked={value === option.value}
              onChange={() => onChange(option.value)}
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
