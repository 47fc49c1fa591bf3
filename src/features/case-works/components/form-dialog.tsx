import { useEffect, useId, useRef, type ReactNode } from "react";
import { cn } from "@/lib/cn";

interface FormDialogProps {
  open: boolean;
  onClose: () => void;
  title: ReactNode;
  /** Escape does nothing while something is being sent. */
  busy?: boolean;
  children: ReactNode;
}

/**
 * A form on the native modal <dialog>: the browser keeps focus inside and hides the page behind
 * from assistive technology; Escape closes it, and focus goes back to the button that opened it.
 */
export function FormDialog({ open, onClose, title, busy, children }: FormDialogProps) {
  const ref = useRef<HTMLDialogElement>(null);
  const opener = useRef<HTMLElement | null>(null);
  const titleId = useId();

  useEffect(() => {
    const dialog = ref.current;
    if (!dialog) return;
    if (open && !dialog.open) {
      opener.current = document.activeElement instanceof HTMLElement ? document.activeElement : null;
      if (typeof dialog.showModal === "function") dialog.showModal();
      else dialog.setAttribute("open", "");
      dialog.querySelector<HTMLElement>("input, select, textarea, button")?.focus();
    } else if (!open && dialog.open) {
      if (typeof dialog.close === "function") dialog.close();
      else dialog.removeAttribute("open");
      opener.current?.focus();
      opener.current = null;
    }
  }, [open]);

  return (
    <dialog
      ref={ref}
      aria-labelledby={titleId}
      onCancel={(event) => {
        event.preventDefault();
        if (!busy) onClose();
      }}
      onKeyDown={(event) => {
        if (event.key === "Escape") {
          event.preventDefault();
          if (!busy) onClose();
        }
      }}
      className={cn(
        "m-auto max-h-[calc(100dvh-2rem)] w-[min(40rem,calc(100vw-2rem))] overflow-auto rounded-lg border border-line bg-surface p-0 text-ink shadow-dialog",
        !open && "hidden",
      )}
    >
      {open ? (
        <div className="flex flex-col gap-4 p-5">
          <h2 id={titleId} className="text-xl font-bold">
            {title}
          </h2>
          {children}
        </div>
      ) : null}
    </dialog>
  );
}
