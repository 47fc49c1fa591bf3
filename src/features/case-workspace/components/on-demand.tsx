import { useEffect, useRef, useState, type ReactNode } from "react";
import { Button } from "@/components/ui/button";

interface OnDemandProps {
  /** The button that opens the form ("Record an inspection"). */
  openLabel: string;
  /** A line under the button saying what the form is for. */
  description?: ReactNode;
  children: ReactNode;
}

/**
 * A form that stays out of the way until it is asked for: a button opens it, Cancel closes it and
 * puts focus back on the button. While open, focus moves to the form's first field.
 */
export function OnDemand({ openLabel, description, children }: OnDemandProps) {
  const [open, setOpen] = useState(false);
  const opener = useRef<HTMLButtonElement>(null);
  const body = useRef<HTMLDivElement>(null);
  const wasOpen = useRef(false);

  useEffect(() => {
    if (open) body.current?.querySelector<HTMLElement>("input, select, textarea, button")?.focus();
    else if (wasOpen.current) opener.current?.focus();
    wasOpen.current = open;
  }, [open]);

  if (!open) {
    return (
      <div className="flex flex-wrap items-center gap-x-3 gap-y-1">
        <Button ref={opener} variant="secondary" onClick={() => setOpen(true)}>
          {openLabel}
        </Button>
        {description ? <p className="text-sm text-ink-soft">{description}</p> : null}
      </div>
    );
  }
  return (
    <div ref={body} className="flex flex-col gap-3 rounded-md border-2 border-dew-600 p-3 sm:p-4">
      {children}
      <div className="border-t border-line pt-3">
        <Button variant="ghost" onClick={() => setOpen(false)}>
          Cancel<span className="sr-only"> and close: {openLabel.toLowerCase()}</span>
        </Button>
      </div>
    </div>
  );
}
