import type { ReactNode } from "react";
import { cn } from "@/lib/cn";

interface PageHeaderProps {
  title: ReactNode;
  description?: ReactNode;
  actions?: ReactNode;
  className?: string;
}

/**
 * The page's one h1. It can take focus (tabIndex -1) so that after a client-side navigation
 * focus lands on the new page's heading, as it would on a full page load.
 */
export function PageHeader({ title, description, actions, className }: PageHeaderProps) {
  return (
    <div className={cn("mb-5 flex flex-wrap items-end justify-between gap-3", className)}>
      <div className="flex flex-col gap-1">
        <h1 tabIndex={-1} className="text-2xl font-bold text-ink focus:outline-none sm:text-3xl">
          {title}
        </h1>
        {description ? <div className="max-w-reading text-ink-soft">{description}</div> : null}
      </div>
      {actions ? <div className="flex flex-wrap gap-2">{actions}</div> : null}
    </div>
  );
}
