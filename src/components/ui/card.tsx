import type { HTMLAttributes, ReactNode } from "react";
import { cn } from "@/lib/cn";

interface PanelProps extends Omit<HTMLAttributes<HTMLElement>, "title"> {
  title?: ReactNode;
  /** Heading level of the title, so the outline of the page stays right. */
  headingLevel?: 2 | 3;
  actions?: ReactNode;
  as?: "section" | "div" | "aside";
  children?: ReactNode;
}

/** A white card with an optional heading; a section (labelled by its heading) by default. */
export function Panel({ title, headingLevel = 2, actions, as: Tag = "section", className, children, id, ...props }: PanelProps) {
  const headingId = title && id ? `${id}-heading` : undefined;
  const Heading = headingLevel === 2 ? "h2" : "h3";
  return (
    <Tag
      id={id}
      aria-labelledby={headingId}
      className={cn("rounded-lg border border-line bg-surface p-4 shadow-card sm:p-5", className)}
      {...props}
    >
      {title || actions ? (
        <div className="mb-3 flex flex-wrap items-start justify-between gap-2">
          {title ? (
            <Heading id={headingId} className={cn("font-bold text-ink", headingLevel === 2 ? "text-xl" : "text-lg")}>
              {title}
            </Heading>
          ) : null}
          {actions ? <div className="flex flex-wrap gap-2">{actions}</div> : null}
        </div>
      ) : null}
      {children}
    </Tag>
  );
}
