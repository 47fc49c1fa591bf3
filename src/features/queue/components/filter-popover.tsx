import { useEffect, useId, useRef, useState, type KeyboardEvent, type ReactNode } from "react";
import { cn } from "@/lib/cn";

interface FilterPopoverProps {
  /** The visible label above the button; also the start of the button's accessible name. */
  label: string;
  /** What is chosen now, in words ("Open cases", "2 chosen"). */
  summary: string;
  children: ReactNode;
  align?: "start" | "end";
  className?: string;
}

/**
 * A disclosure: a button that shows and hides a panel of checkboxes under it (a non-modal dialog
 * named by the label). Escape, on the button or in the panel, closes the panel and puts focus back
 * on the button; a click or focus outside it closes it too.
 */
export function FilterPopover({ label, summary, children, align = "start", className }: FilterPopoverProps) {
  const [open, setOpen] = useState(false);
  const labelId = useId();
  const summaryId = useId();
  const panelId = useId();
  const root = useRef<HTMLDivElement>(null);
  const button = useRef<HTMLButtonElement>(null);

  useEffect(() => {
    if (!open) return;
    const onPointerDown = (event: PointerEvent) => {
      if (root.current && !root.current.contains(event.target as Node)) setOpen(false);
    };
    document.addEventListener("pointerdown", onPointerDown);
    return () => document.removeEventListener("pointerdown", onPointerDown);
  }, [open]);

  const closeOnEscape = (event: KeyboardEvent) => {
    if (event.key === "Escape" && open) {
      event.stopPropagation();
      setOpen(false);
      button.current?.focus();
    }
  };

  return (
    <div
      ref={root}
      className={cn("relative flex flex-col gap-1", className)}
      onBlur={(event) => {
        const next = event.relatedTarget as Node | null;
        if (open && next && !event.currentTarget.contains(next)) setOpen(false);
      }}
    >
      <span id={labelId} className="text-sm font-semibold">
        {label}
      </span>
      <button
        ref={button}
        type="button"
        aria-expanded={open}
        aria-controls={panelId}
        aria-labelledby={`${labelId} ${summaryId}`}
        onClick={() => setOpen((o) => !o)}
        onKeyDown={closeOnEscape}
        className="inline-flex min-h-9 items-center justify-between gap-2 rounded-md border border-line-strong bg-surface px-3 py-1.5 text-left text-sm hover:bg-dew-50"
      >
        <span id={summaryId} className="max-w-48 truncate">
          {summary}
        </span>
        <svg viewBox="0 0 16 16" className={cn("size-4 shrink-0 transition-transform", open && "rotate-180")} aria-hidden="true">
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
      {/* A non-modal <dialog>: shown with `open`, never showModal(), so the page stays usable. */}
      <dialog
        id={panelId}
        open={open}
        aria-labelledby={labelId}
        hidden={!open}
        onKeyDown={closeOnEscape}
        className={cn(
          "absolute top-full z-20 m-0 mt-1 flex max-h-[70vh] min-w-60 flex-col gap-3 overflow-y-auto rounded-md border border-line-strong bg-surface p-3 text-sm text-ink shadow-card",
          align === "end" ? "right-0 left-auto" : "right-auto left-0",
        )}
      >
        {open ? children : null}
      </dialog>
    </div>
  );
}

export interface CheckboxOption<T extends string> {
  value: T;
  label: string;
}

interface CheckboxListProps<T extends string> {
  legend: string;
  hideLegend?: boolean;
  options: readonly CheckboxOption<T>[];
  selected: readonly T[];
  onChange: (next: T[]) => void;
  columns?: 1 | 2;
}

/** A group of checkboxes with a legend; the choice comes back in the options' order. */
export function CheckboxList<T extends string>({
  legend,
  hideLegend,
  options,
  selected,
  onChange,
  columns = 1,
}: CheckboxListProps<T>) {
  const chosen = new Set(selected);
  return (
    <fieldset className="flex flex-col gap-1">
      <legend className={cn("mb-1 font-semibold", hideLegend && "sr-only")}>{legend}</legend>
      <div className={cn("grid gap-x-4 gap-y-1", columns === 2 ? "grid-cols-2" : "grid-cols-1")}>
        {options.map((option) => (
          <label key={option.value} className="flex min-h-8 cursor-pointer items-center gap-2">
            <input
              type="checkbox"
              className="size-4 accent-dew-700"
              checked={chosen.has(option.value)}
              onChange={(event) => {
                const next = new Set(chosen);
                if (event.target.checked) next.add(option.value);
                else next.delete(option.value);
                onChange(options.filter((o) => next.has(o.value)).map((o) => o.value));
              }}
            />
            <span>{option.label}</span>
          </label>
        ))}
      </div>
    </fieldset>
  );
}

/** Small buttons inside a popover for a ready-made choice ("Open cases", "All"). */
export function PresetButton({ pressed, onClick, children }: { pressed: boolean; onClick: () => void; children: ReactNode }) {
  return (
    <button
      type="button"
      aria-pressed={pressed}
      onClick={onClick}
      className={cn(
        "min-h-8 rounded-md border px-3 text-sm font-semibold",
        pressed ? "border-dew-700 bg-dew-700 text-white" : "border-line-strong bg-surface text-ink hover:bg-dew-50",
      )}
    >
      {children}
    </button>
  );
}
