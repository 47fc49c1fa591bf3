import { cn } from "@/lib/cn";

interface SpinnerProps {
  size?: "sm" | "md" | "lg";
  /** Read out by screen readers; pass "" when the surrounding text already says what is happening. */
  label?: string;
  className?: string;
}

const sizes = { sm: "size-4", md: "size-6", lg: "size-10" };

export function Spinner({ size = "md", label = "Loading", className }: SpinnerProps) {
  return (
    <svg
      viewBox="0 0 24 24"
      className={cn("animate-spin motion-reduce:animate-none", sizes[size], className)}
      role={label ? "img" : undefined}
      aria-label={label || undefined}
      aria-hidden={label ? undefined : true}
    >
      <circle cx="12" cy="12" r="9" fill="none" stroke="currentColor" strokeOpacity="0.25" strokeWidth="3" />
      <path d="M21 12a9 9 0 0 0-9-9" fill="none" stroke="currentColor" strokeWidth="3" strokeLinecap="round" />
    </svg>
  );
}

/** A whole-area loading state with a visible sentence. */
export function LoadingState({ children = "Loading…", className }: { children?: React.ReactNode; className?: string }) {
  return (
    <div role="status" className={cn("flex items-center gap-3 py-8 text-ink-soft", className)}>
      <Spinner label="" />
      <span>{children}</span>
    </div>
  );
}
