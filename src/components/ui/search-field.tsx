import { useEffect, useId, useRef, useState } from "react";
import { cn } from "@/lib/cn";
import { controlClasses } from "./field";

interface SearchFieldProps {
  label: string;
  /** The applied search (from the URL); the box follows it when it changes elsewhere (Back). */
  value: string;
  onSearch: (value: string) => void;
  placeholder?: string;
  hint?: string;
  /** Milliseconds of quiet typing before searching; Enter searches at once. */
  debounceMs?: number;
  className?: string;
}

export function SearchField({ label, value, onSearch, placeholder, hint, debounceMs = 350, className }: SearchFieldProps) {
  const id = useId();
  const [draft, setDraft] = useState(value);
  const timer = useRef<ReturnType<typeof setTimeout> | undefined>(undefined);
  const latest = useRef(onSearch);

  useEffect(() => {
    latest.current = onSearch;
  }, [onSearch]);
  // Follow the URL (Back, a cleared filter) without eating a trailing space while someone types:
  // adjusted during render when the applied search changes (react.dev, "You might not need an effect").
  const [applied, setApplied] = useState(value);
  if (applied !== value) {
    setApplied(value);
    setDraft((d) => (d.trim() === value ? d : value));
  }
  useEffect(() => () => clearTimeout(timer.current), []);

  const schedule = (next: string) => {
    setDraft(next);
    clearTimeout(timer.current);
    timer.current = setTimeout(() => {
      if (next.trim() !== value) latest.current(next);
    }, debounceMs);
  };

  return (
    <form
      role="search"
      className={cn("flex flex-col gap-1", className)}
      onSubmit={(e) => {
        e.preventDefault();
        clearTimeout(timer.current);
        latest.current(draft);
      }}
    >
      <label htmlFor={id} className="text-sm font-semibold">
        {label}
      </label>
      {hint ? (
        <p id={`${id}-hint`} className="text-xs text-ink-soft">
          {hint}
        </p>
      ) : null}
      <div className="flex gap-2">
        <input
          id={id}
          type="search"
          value={draft}
          placeholder={placeholder}
          aria-describedby={hint ? `${id}-hint` : undefined}
          onChange={(e) => schedule(e.target.value)}
          className={cn(controlClasses, "min-h-9 py-1.5 text-sm")}
        />
        <button
          type="submit"
          className="min-h-9 rounded-md border border-line-strong bg-surface px-3 text-sm font-semibold hover:bg-dew-50"
        >
          Search
        </button>
      </div>
    </form>
  );
}
