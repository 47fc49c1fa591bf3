import { cn } from "@/lib/cn";

/**
 * Dewline's mark: a single droplet resting on a horizontal line (the "dew line"), drawn for us.
 * The droplet sits slightly above the line, as condensation gathers on a cold surface.
 */
export function LogoMark({ className }: { className?: string }) {
  return (
    <svg viewBox="0 0 32 32" className={cn("size-8", className)} aria-hidden="true" focusable="false">
      <path d="M16 3.5C12.4 9 9.5 12.6 9.5 16.6a6.5 6.5 0 0 0 13 0C22.5 12.6 19.6 9 16 3.5z" fill="currentColor" />
      <path
        d="M13.2 16.8a3 3 0 0 0 2.4 3"
        fill="none"
        stroke="var(--logo-glint, #ffffff)"
        strokeWidth="1.6"
        strokeLinecap="round"
      />
      <rect x="3" y="26" width="26" height="2.5" rx="1.25" fill="currentColor" />
    </svg>
  );
}

export function Wordmark({ className, markClassName }: { className?: string; markClassName?: string }) {
  return (
    <span className={cn("inline-flex items-center gap-2 text-xl font-bold tracking-tight", className)}>
      <LogoMark className={markClassName} />
      {/* A name, the same in every language. */}
      <span translate="no">Dewline</span>
    </span>
  );
}
