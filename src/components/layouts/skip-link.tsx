export function SkipLink({ target = "main", label = "Skip to main content" }: { target?: string; label?: string }) {
  return (
    <a
      href={`#${target}`}
      className="sr-only z-50 rounded-md bg-surface px-4 py-2 font-semibold text-dew-800 shadow-dialog focus:not-sr-only focus:fixed focus:top-2 focus:left-2"
    >
      {label}
    </a>
  );
}
