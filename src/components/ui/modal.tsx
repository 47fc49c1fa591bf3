import { useEffect, useId, useRef, type KeyboardEventHandler, type ReactNode, type RefObject } from "react";
import { cn } from "@/lib/cn";

interface ModalProps {
  open: boolean;
  onClose: () => void;
  title: ReactNode;
  /** Hides the title visually (it still names the dialog). */
  hideTitle?: boolean;
  /** Where focus starts; the first focusable element of the dialog otherwise. */
  initialFocusRef?: RefObject<HTMLElement | null>;
  /** Escape does nothing while something is being sent. */
  busy?: boolean;
  /** Keys the dialog handles besides Escape (arrow keys to page through, say). */
  onKeyDown?: KeyboardEventHandler<HTMLDialogElement>;
  className?: string;
  children: ReactNode;
}

/**
 * The native modal <dialog>: the browser keeps focus inside and hides the page behind from
 * assistive technology; Escape closes it, and focus goes back to what opened it.
 */
export function Modal({ open, onClose, title, hideTitle, initialFocusRef, busy, onKeyDown, className, children }: ModalProps) {
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
      (initialFocusRef?.current ?? dialog.querySelector<HTMLElement>("button, [href], input, select, textarea"))?.focus();
    } else if (!open && dialog.open) {
      if (typeof dialog.close === "function") dialog.close();
      else dialog.removeAttribute("open");
      opener.current?.focus();
      opener.current = null;
    }
  }, [open, initialFocusRef]);

  // Closed by unmounting while open: still give focus back.
  useEffect(
    () => () => {
      opener.current?.focus();
    },
    [],
  );

  return (
    <dialog
      ref={ref}
      aria-labelledby={titleId}
      onCancel={(event) => {
        event.preventDefault();
        if (!busy) onClose();
      }}
      onKeyDown={(event) => {
        onKeyDown?.(event);
        // Handled here as well as by `cancel`, so Escape works the same everywhere.
        if (event.key === "Escape") {
          event.preventDefault();
          if (!busy) onClose();
        }
      }}
      className={cn(
        "m-auto max-h-[calc(100dvh-2rem)] w-[min(40rem,calc(100vw-2rem))] overflow-auto rounded-lg border border-line bg-surface p-0 text-ink shadow-dialog",
        !open && "hidden",
        className,
      )}
    >
      {open ? (
        <div className="flex flex-col gap-4 p-5">
          <h2 id={titleId} className={cn("text-xl font-bold", hideTitle && "sr-only")}>
            {title}
          </h2>
          {children}
        </div>
      ) : null}
    </dialog>
  );
}
