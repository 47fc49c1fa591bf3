import { useState, type ReactNode } from "react";
import { cn } from "@/lib/cn";

interface CollapsibleSectionProps {
  /** The section's id (a link to #id opens it); its heading and body ids are made from it. */
  id: string;
  title: string;
  /** One line under the heading while it is closed, saying what is inside ("48 readings"). */
  summary?: ReactNode;
  /** Open when the page loads; the person opens and closes it after. */
  defaultOpen?: boolean;
  headingLevel?: 2 | 3;
  children: ReactNode;
  className?: string;
}

/**
 * A section of a long page behind its heading: the heading is a button (aria-expanded) that shows or
 * hides the body. The body is drawn the first time it is opened and kept after, so what it holds
 * (a chart, a half-typed note) survives closing it.
 */
export function CollapsibleSection({
  id,
  title,
  summary,
  defaultOpen = false,
  headingLevel = 2,
  children,
  className,
}: CollapsibleSectionProps) {
  const [open, setOpen] = useState(defaultOpen);
  const [drawn, setDrawn] = useState(defaultOpen);
  // A link to the section (#id) while the page is open asks for it open again.
  const [askedOpen, setAskedOpen] = useState(defaultOpen);
  if (defaultOpen !== askedOpen) {
    setAskedOpen(defaultOpen);
    if (defaultOpen) setOpen(true);
  }
  if (open && !drawn) setDrawn(true);
  const Heading = headingLevel === 2 ? "h2" : "h3";
  return (
    <section
      id={id}
      aria-labelledby={`${id}-heading`}
      className={cn("rounded-lg border border-line bg-surface shadow-card", className)}
    >
      <Heading id={`${id}-heading`} className={cn("font-bold text-ink", headingLevel === 2 ? "text-xl" : "text-lg")}>
        <button
          type="button"
          aria-expanded={open}
          aria-controls={drawn ? `${id}-body` : undefined}
          onClick={() => setOpen((o) => !o)}
          className="flex w-full items-center justify-between gap-3 rounded-lg px-4 py-3 text-left hover:bg-dew-50 focus-visible:outline-2 focus-visible:-outline-offset-2 focus-visible:outline-dew-700 sm:px-5"
        >
          <span>{title}</span>
          <svg
            viewBox="0 0 16 16"
            className={cn("size-5 shrink-0 transition-transform", open && "rotate-180")}
            aria-hidden="true"
          >
            <path
              d="M4 6l4 4 4-4"
              fill="none"
              stroke="currentColor"
              strokeWidth="1.8"
              strokeLinecap="round"
              strokeLinejoin="round"
            />
          </svg>
        </button>
      </Heading>
      {!open && summary ? <p className="-mt-1 px-4 pb-3 text-sm text-ink-soft sm:px-5">{summary}</p> : null}
      {drawn ? (
        <div id={`${id}-body`} hidden={!open} className="px-4 pb-4 sm:px-5 sm:pb-5">
          {children}
        </div>
      ) : null}
    </section>
  );
}
