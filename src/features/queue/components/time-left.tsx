import { cn } from "@/lib/cn";
import type { TimeLeft } from "@/lib/deadline-words";

/**
 * Time to the next deadline. Overdue reads "Overdue by 2 days" with a warning icon and bold
 * text, and less than a day to go has a clock icon, so neither depends on colour alone.
 */
export function TimeLeftText({ left }: { left: TimeLeft }) {
  if (left.overdue) {
    return (
      <span className="inline-flex items-center gap-1 font-bold whitespace-nowrap text-rust-700">
        <svg viewBox="0 0 16 16" className="size-4 shrink-0" aria-hidden="true">
          <path d="M8 1.5 15 14H1z" fill="currentColor" />
          <path d="M8 6v4M8 11.8v.1" stroke="#fff" strokeWidth="1.6" strokeLinecap="round" />
        </svg>
        {left.text}
      </span>
    );
  }
  return (
    <span
      className={cn(
        "inline-flex items-center gap-1 whitespace-nowrap",
        left.soon ? "font-semibold text-ember-800" : "text-ink-soft",
      )}
    >
      {left.soon ? (
        <svg viewBox="0 0 16 16" className="size-4 shrink-0" aria-hidden="true">
          <circle cx="8" cy="8" r="6.3" fill="none" stroke="currentColor" strokeWidth="1.6" />
          <path d="M8 4.5V8l2.4 1.6" fill="none" stroke="currentColor" strokeWidth="1.6" strokeLinecap="round" />
        </svg>
      ) : null}
      {left.text}
    </span>
  );
}
