import type { ReactNode } from "react";
import { cn } from "@/lib/cn";

export type AlertTone = "info" | "success" | "warning" | "danger";

const tones: Record<AlertTone, string> = {
  info: "border-dew-600 bg-dew-50 text-ink",
  success: "border-moss-600 bg-moss-50 text-ink",
  warning: "border-ember-400 bg-ember-50 text-ink",
  danger: "border-rust-600 bg-rust-50 text-ink",
};

const titleTones: Record<AlertTone, string> = {
  info: "text-dew-800",
  success: "text-moss-700",
  warning: "text-ember-800",
  danger: "text-rust-700",
};

interface AlertProps {
  tone?: AlertTone;
  title?: ReactNode;
  children?: ReactNode;
  className?: string;
  /**
   * "alert" interrupts (errors after an action), "status" is polite (success, progress),
   * "none" is a plain note that is there from the start.
   */
  live?: "alert" | "status" | "none";
}

export function Alert({ tone = "info", title, children, className, live }: AlertProps) {
  const mode = live ?? (tone === "danger" ? "alert" : "status");
  const role = mode === "none" ? undefined : mode;
  return (
    <div role={role} className={cn("rounded-md border-l-4 px-4 py-3", tones[tone], className)}>
      {title ? <p className={cn("font-bold", titleTones[tone])}>{title}</p> : null}
      {children ? <div className={cn(title ? "mt-1" : undefined, "[&_a]:font-semibold [&_a]:underline")}>{children}</div> : null}
    </div>
  );
}
