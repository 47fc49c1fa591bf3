import { useId, type ReactNode, type Ref } from "react";
import { cn } from "@/lib/cn";
import { FieldError } from "@/components/ui/field";
import type { Choice } from "../labels";

interface GroupShellProps {
  legend: ReactNode;
  hint?: ReactNode;
  error?: string;
  /** Legends of the main question on a step read larger. */
  large?: boolean;
  className?: string;
  children: ReactNode;
}

/** A fieldset whose legend names the group and whose hint and error are read with it. */
function GroupShell({ legend, hint, error, large, className, children }: GroupShellProps) {
  const id = useId();
  const hintId = `${id}-hint`;
  const errorId = `${id}-error`;
  const describedBy = [hint ? hintId : null, error ? errorId : null].filter(Boolean).join(" ") || undefined;
  return (
    <fieldset
      aria-describedby={describedBy}
      aria-invalid={error ? true : undefined}
      className={cn(
        "flex min-w-0 flex-col gap-2",
        // A group with a problem sits on a faint rust wash with a dashed rim (Dewline's own error look).
        error && "rounded-lg border border-dashed border-rust-600 bg-rust-50/60 p-3",
        className,
      )}
    >
      <legend className={cn("mb-1 font-bold text-ink", large ? "text-lg" : "text-base")}>{legend}</legend>
      {hint ? (
        <p id={hintId} className="-mt-1 text-sm text-ink-soft">
          {hint}
        </p>
      ) : null}
      {error ? <FieldError id={errorId}>{error}</FieldError> : null}
      {children}
    </fieldset>
  );
}

const optionRow =
  "flex min-h-12 cursor-pointer items-start gap-3 rounded-md border border-line-strong bg-surface px-3 py-2.5 " +
  "hover:bg-dew-50 has-[:checked]:border-2 has-[:checked]:border-dew-700 has-[:checked]:bg-dew-50";
const controlClass = "mt-0.5 size-5 shrink-0 accent-dew-700";

function OptionText({ label, hint }: { label: ReactNode; hint?: ReactNode }) {
  return (
    <span className="flex flex-col">
      <span>{label}</span>
      {hint ? <span className="text-sm text-ink-soft">{hint}</span> : null}
    </span>
  );
}

interface CheckboxGroupProps<V extends string | number> {
  legend: ReactNode;
  hint?: ReactNode;
  error?: string;
  large?: boolean;
  options: readonly { value: V; label: ReactNode; hint?: ReactNode }[];
  value: readonly V[] | undefined;
  onChange: (next: V[]) => void;
  onBlur?: () => void;
  /** Given to the first box, so a failed check can move focus to the group. */
  inputRef?: Ref<HTMLInputElement>;
  /** Extra rows after the options (for answers that exclude the others). */
  after?: ReactNode;
  columns?: boolean;
  className?: string;
}

export function CheckboxGroup<V extends string | number>({
  legend,
  hint,
  error,
  large,
  options,
  value,
  onChange,
  onBlur,
  inputRef,
  after,
  columns,
  className,
}: CheckboxGroupProps<V>) {
  const name = useId();
  const chosen = value ?? [];
  return (
    <GroupShell legend={legend} hint={hint} error={error} large={large} className={className}>
      <div className={cn("grid grid-cols-1 gap-2", columns && "sm:grid-cols-2")}>
        {options.map((option, i) => (
          <label key={String(option.value)} className={optionRow}>
            <input
              ref={i === 0 ? inputRef : undefined}
              type="checkbox"
              name={name}
              value={String(option.value)}
              checked={chosen.includes(option.value)}
              onChange={(e) => onChange(e.target.checked ? [...chosen, option.value] : chosen.filter((v) => v !== option.value))}
              onBlur={onBlur}
              className={controlClass}
            />
            <OptionText label={option.label} hint={option.hint} />
          </label>
        ))}
      </div>
      {after}
    </GroupShell>
  );
}

/** One more box in a checkbox group that stands for an answer instead of a value ("None of these"). */
export function ExclusiveCheckbox({
  label,
  checked,
  onChange,
}: {
  label: ReactNode;
  checked: boolean;
  onChange: (checked: boolean) => void;
}) {
  return (
    <label className={optionRow}>
      <input type="checkbox" checked={checked} onChange={(e) => onChange(e.target.checked)} className={controlClass} />
      <OptionText label={label} />
    </label>
  );
}

interface RadioGroupProps<V extends string> {
  legend: ReactNode;
  hint?: ReactNode;
  error?: string;
  large?: boolean;
  options: readonly Choice<V>[];
  value: V | undefined;
  onChange: (next: V | undefined) => void;
  onBlur?: () => void;
  inputRef?: Ref<HTMLInputElement>;
  /** Every question we ask can be left unanswered: this offers a way back to "no answer". */
  clearLabel?: ReactNode;
  className?: string;
}

export function RadioGroup<V extends string>({
  legend,
  hint,
  error,
  large,
  options,
  value,
  onChange,
  onBlur,
  inputRef,
  clearLabel,
  className,
}: RadioGroupProps<V>) {
  const name = useId();
  return (
    <GroupShell legend={legend} hint={hint} error={error} large={large} className={className}>
      <div className="grid grid-cols-1 gap-2">
        {options.map((option, i) => (
          <label key={option.value} className={optionRow}>
            <input
              ref={i === 0 ? inputRef : undefined}
              type="radio"
              name={name}
              value={option.value}
              checked={value === option.value}
              onChange={() => onChange(option.value)}
              onBlur={onBlur}
              className={controlClass}
            />
            <OptionText label={option.label} hint={option.hint} />
          </label>
        ))}
      </div>
      {clearLabel && value !== undefined ? (
        <div>
          <button
            type="button"
            onClick={() => onChange(undefined)}
            className="min-h-9 rounded-md px-2 text-sm font-semibold text-dew-700 underline underline-offset-2 hover:bg-dew-50"
          >
            {clearLabel}
          </button>
        </div>
      ) : null}
    </GroupShell>
  );
}
