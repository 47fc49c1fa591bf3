import type { ReactNode } from "react";
import { cn } from "@/lib/cn";

interface EmptyStateProps {
  title: ReactNode;
  children?: ReactNode;
  action?: ReactNode;
  icon?: ReactNode;
  className?: string;
}

export function EmptyState({ title, children, action, icon, className }: EmptyStateProps) {
  return (
    <div
      className={cn(
        "flex flex-col items-center gap-2 rounded-md border border-dashed border-line-strong bg-dew-50 px-4 py-8 text-center",
        className,
      )}
    >
      {icon ?? <EmptyDrop />}
      <p className="text-lg font-bold text-ink">{title}</p>
      {children ? <div className="max-w-reading text-ink-soft">{children}</div> : null}
      {action ? <div className="mt-2">{action}</div> : null}
    </div>
  );
}

function EmptyDrop() {
  return (
    <svg viewBox="0 0 32 32" className="size-8 text-dew-600" aria-hidden="true">
      <path
        d="M16 4c-4 6-8 10.5-8 15a8 8 0 0 0 16 0c0-4.5-4-9-8-15z"
        fill="none"
        stroke="currentColor"
        strokeWidth="2"
        strokeDasharray="3 3"
      />
    </svg>
  );
}
