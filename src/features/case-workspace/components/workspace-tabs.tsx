import { useRef, useState, type KeyboardEvent, type ReactNode } from "react";
import { cn } from "@/lib/cn";

export interface WorkspaceTab<Id extends string = string> {
  id: Id;
  label: string;
  /** A short count or mark beside the label ("2"), read with it. */
  badge?: string;
  content: ReactNode;
}

interface WorkspaceTabsProps<Id extends string> {
  /** The tab list's accessible name. */
  label: string;
  tabs: readonly WorkspaceTab<Id>[];
  active: Id;
  onChange: (id: Id) => void;
  className?: string;
}

/**
 * Tabs as the ARIA tabs pattern has them: one tab stop for the list (the chosen tab), arrow keys,
 * Home and End to move along it, and each panel labelled by its tab. A panel is drawn the first time
 * it is chosen and kept (hidden) after, so a half-written form survives a look at another tab.
 */
export function WorkspaceTabs<Id extends string>({ label, tabs, active, onChange, className }: WorkspaceTabsProps<Id>) {
  const refs = useRef(new Map<string, HTMLButtonElement>());
  const [visited, setVisited] = useState<ReadonlySet<string>>(() => new Set([active]));
  if (!visited.has(active)) setVisited(new Set([...visited, active]));

  const choose = (id: Id, focus = false) => {
    onChange(id);
    if (focus) refs.current.get(id)?.focus();
  };

  const onKeyDown = (event: KeyboardEvent<HTMLButtonElement>, index: number) => {
    const last = tabs.length - 1;
    const next =
      event.key === "ArrowRight"
        ? (index + 1) % tabs.length
        : event.key === "ArrowLeft"
          ? (index - 1 + tabs.length) % tabs.length
          : event.key === "Home"
            ? 0
            : event.key === "End"
              ? last
              : null;
    if (next === null) return;
    event.preventDefault();
    choose(tabs[next]!.id, true);
  };

  return (
    <div className={cn("flex flex-col gap-5", className)}>
      <div
        role="tablist"
        aria-label={label}
        className="-mx-1 flex gap-1 overflow-x-auto border-b border-line-strong px-1 [scrollbar-width:thin]"
      >
        {tabs.map((tab, index) => {
          const selected = tab.id === active;
          return (
            <button
              key={tab.id}
              ref={(el) => {
                if (el) refs.current.set(tab.id, el);
                else refs.current.delete(tab.id);
              }}
              type="button"
              role="tab"
              id={`tab-${tab.id}`}
              aria-selected={selected}
              aria-controls={visited.has(tab.id) ? `panel-${tab.id}` : undefined}
              tabIndex={selected ? 0 : -1}
              onClick={() => choose(tab.id)}
              onKeyDown={(e) => onKeyDown(e, index)}
              className={cn(
                "-mb-px inline-flex min-h-10 shrink-0 items-center gap-1.5 rounded-t-md border border-transparent px-3 font-semibold whitespace-nowrap",
                "focus-visible:outline-2 focus-visible:-outline-offset-2 focus-visible:outline-dew-700",
                selected
                  ? "border-line-strong border-b-surface bg-surface text-ink"
                  : "text-dew-700 underline-offset-4 hover:bg-dew-50 hover:underline",
              )}
            >
              {tab.label}
              {tab.badge ? (
                <span className="rounded-pill bg-dew-100 px-2 text-xs font-bold text-dew-800">{tab.badge}</span>
              ) : null}
            </button>
          );
        })}
      </div>
      {tabs.map((tab) =>
        visited.has(tab.id) ? (
          <div
            key={tab.id}
            role="tabpanel"
            id={`panel-${tab.id}`}
            aria-labelledby={`tab-${tab.id}`}
            hidden={tab.id !== active}
            className="flex flex-col gap-5"
          >
            {tab.content}
          </div>
        ) : null,
      )}
    </div>
  );
}
