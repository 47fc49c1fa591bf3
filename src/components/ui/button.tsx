import type { ButtonHTMLAttributes, Ref } from "react";
import { cn } from "@/lib/cn";
import { Spinner } from "./spinner";

export type ButtonVariant = "primary" | "secondary" | "danger" | "ghost";
export type ButtonSize = "sm" | "md" | "lg";

const base =
  "inline-flex items-center justify-center gap-2 rounded-md font-semibold transition-colors select-none " +
  "disabled:cursor-not-allowed disabled:opacity-60 aria-disabled:cursor-not-allowed aria-disabled:opacity-60";

const variants: Record<ButtonVariant, string> = {
  primary: "bg-dew-700 text-white hover:bg-dew-800 active:bg-dew-900",
  secondary: "border border-line-strong bg-surface text-ink hover:bg-dew-50 active:bg-dew-100",
  danger: "bg-rust-700 text-white hover:bg-rust-600 active:bg-rust-700",
  ghost: "text-dew-700 underline-offset-2 hover:bg-dew-50 hover:underline",
};

const sizes: Record<ButtonSize, string> = {
  sm: "min-h-8 px-3 text-sm",
  md: "min-h-10 px-4 text-base",
  lg: "min-h-12 px-5 text-lg",
};

export function buttonClasses(variant: ButtonVariant = "primary", size: ButtonSize = "md", className?: string): string {
  return cn(base, variants[variant], sizes[size], className);
}

export interface ButtonProps extends ButtonHTMLAttributes<HTMLButtonElement> {
  variant?: ButtonVariant;
  size?: ButtonSize;
  /**
   * Shows a spinner and blocks a second press, keeping the label for screen readers. The button stays
   * focusable while busy (aria-disabled, not disabled): disabling the focused button would drop keyboard
   * focus to the page's start (WCAG 2.4.3).
   */
  busy?: boolean;
  ref?: Ref<HTMLButtonElement>;
}

export function Button({
  variant = "primary",
  size = "md",
  busy = false,
  className,
  children,
  disabled,
  type = "button",
  onClick,
  ...props
}: ButtonProps) {
  return (
    <button
      type={type}
      className={buttonClasses(variant, size, className)}
      disabled={disabled}
      aria-disabled={busy || undefined}
      aria-busy={busy || undefined}
      // A press while busy does nothing; an Enter in a field of the form presses the submit button too,
      // so this also stops a second submission.
      onClick={busy ? (event) => event.preventDefault() : onClick}
      {...props}
    >
      {busy ? <Spinner size="sm" label="" /> : null}
      {children}
    </button>
  );
}
