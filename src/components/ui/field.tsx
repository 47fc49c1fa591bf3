import {
  useId,
  type InputHTMLAttributes,
  type ReactNode,
  type Ref,
  type SelectHTMLAttributes,
  type TextareaHTMLAttributes,
} from "react";
import { cn } from "@/lib/cn";

/** Classes shared by every text-like control, so inputs, selects and text areas line up. */
export const controlClasses =
  "block w-full rounded-md border border-line-strong bg-surface px-3 text-base text-ink placeholder:text-ink-soft " +
  // Dewline's error treatment: a dashed rust edge and a faint rust wash inside the control, with the
  // message as a tag above it (FieldError): never colour alone, the tag has words and an icon.
  "aria-invalid:border-dashed aria-invalid:border-rust-700 aria-invalid:bg-rust-50 disabled:bg-paper disabled:text-ink-soft";

interface FieldShellProps {
  id: string;
  label: ReactNode;
  hint?: ReactNode;
  error?: string;
  /** Hides the label visually (it is still the control's accessible name). */
  hideLabel?: boolean;
  /** Says the field may be left empty; a string is that word in the page's language (English "optional" by default). */
  optional?: boolean | string;
  className?: string;
  children: ReactNode;
}

export const hintId = (id: string) => `${id}-hint`;
export const errorId = (id: string) => `${id}-error`;

/** The ids a control should name in aria-describedby: its hint and its error, when shown. */
export function describedBy(id: string, hint?: ReactNode, error?: string): string | undefined {
  const ids = [hint ? hintId(id) : null, error ? errorId(id) : null].filter(Boolean);
  return ids.length ? ids.join(" ") : undefined;
}

export function FieldShell({ id, label, hint, error, hideLabel, optional, className, children }: FieldShellProps) {
  return (
    <div className={cn("flex flex-col gap-1", className)}>
      <label htmlFor={id} className={cn("font-semibold text-ink", hideLabel && "sr-only")}>
        {label}
        {optional ? <span className="font-normal text-ink-soft"> ({optional === true ? "optional" : optional})</span> : null}
      </label>
      {hint ? (
        <p id={hintId(id)} className="text-sm text-ink-soft">
          {hint}
        </p>
      ) : null}
      {error ? <FieldError id={errorId(id)}>{error}</FieldError> : null}
      {children}
    </div>
  );
}

interface CommonFieldProps {
  label: ReactNode;
  hint?: ReactNode;
  error?: string;
  hideLabel?: boolean;
  /** Says the field may be left empty; a string is that word in the page's language (English "optional" by default). */
  optional?: boolean | string;
  /** Classes for the wrapper (label, hint, error and control). */
  className?: string;
  controlClassName?: string;
}

export interface InputProps extends CommonFieldProps, Omit<InputHTMLAttributes<HTMLInputElement>, "className"> {
  ref?: Ref<HTMLInputElement>;
}

export function Input({ label, hint, error, hideLabel, optional, className, controlClassName, id, ref, ...props }: InputProps) {
  const autoId = useId();
  const inputId = id ?? autoId;
  return (
    <FieldShell
      id={inputId}
      label={label}
      hint={hint}
      error={error}
      hideLabel={hideLabel}
      optional={optional}
      className={className}
    >
      <input
        ref={ref}
        id={inputId}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(inputId, hint, error)}
        className={cn(controlClasses, "min-h-10 py-2", controlClassName)}
        {...props}
      />
    </FieldShell>
  );
}

export interface SelectProps extends CommonFieldProps, Omit<SelectHTMLAttributes<HTMLSelectElement>, "className"> {
  ref?: Ref<HTMLSelectElement>;
}

export function Select({
  label,
  hint,
  error,
  hideLabel,
  optional,
  className,
  controlClassName,
  id,
  ref,
  children,
  ...props
}: SelectProps) {
  const autoId = useId();
  const selectId = id ?? autoId;
  return (
    <FieldShell
      id={selectId}
      label={label}
      hint={hint}
      error={error}
      hideLabel={hideLabel}
      optional={optional}
      className={className}
    >
      <select
        ref={ref}
        id={selectId}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(selectId, hint, error)}
        className={cn(controlClasses, "min-h-10 py-2 pr-8", controlClassName)}
        {...props}
      >
        {children}
      </select>
    </FieldShell>
  );
}

export interface TextareaProps extends CommonFieldProps, Omit<TextareaHTMLAttributes<HTMLTextAreaElement>, "className"> {
  ref?: Ref<HTMLTextAreaElement>;
}

export function Textarea({
  label,
  hint,
  error,
  hideLabel,
  optional,
  className,
  controlClassName,
  id,
  ref,
  rows = 3,
  ...props
}: TextareaProps) {
  const autoId = useId();
  const textareaId = id ?? autoId;
  return (
    <FieldShell
      id={textareaId}
      label={label}
      hint={hint}
      error={error}
      hideLabel={hideLabel}
      optional={optional}
      className={className}
    >
      <textarea
        ref={ref}
        id={textareaId}
        rows={rows}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(textareaId, hint, error)}
        className={cn(controlClasses, "py-2", controlClassName)}
        {...props}
      />
    </FieldShell>
  );
}

/**
 * A field's error message as a tag: a rounded rust-tinted label with a droplet-and-mark icon, so it
 * does not rely on colour alone (rust-700 on rust-50 6.0:1). It is an alert, so a screen reader says it
 * as it appears (WCAG 4.1.3), and the control names it in aria-describedby (3.3.1).
 */
export function FieldError({ id, children }: { id: string; children: ReactNode }) {
  return (
    <p
      id={id}
      role="alert"
      className="flex items-start gap-1.5 self-start rounded-md bg-rust-50 px-2.5 py-1 text-sm font-semibold text-rust-700 ring-1 ring-rust-600/40"
    >
      <svg viewBox="0 0 16 16" className="mt-0.5 size-4 shrink-0" aria-hidden="true" focusable="false">
        <path d="M8 1.2C5.4 5 3.4 7.4 3.4 10a4.6 4.6 0 0 0 9.2 0C12.6 7.4 10.6 5 8 1.2z" fill="currentColor" />
        <path d="M8 6.2v3.6M8 11.9v.1" stroke="#fff" strokeWidth="1.7" strokeLinecap="round" />
      </svg>
      <span>{children}</span>
    </p>
  );
}
