import type { ReactNode } from "react";
import { Link } from "react-router-dom";
import { Wordmark } from "@/components/ui/logo";
import { cn } from "@/lib/cn";
import { FocusOnNavigate } from "./focus-on-navigate";
import { SkipLink } from "./skip-link";

interface PublicLayoutProps {
  /** A link at the top right: "Sign in" for visitors, back to their home screen for others. */
  headerAction?: ReactNode;
  wide?: boolean;
  children: ReactNode;
}

/** Sign-in, invitations, password reset, the calculator and "not found": no sign-in needed. */
export function PublicLayout({ headerAction, wide = false, children }: PublicLayoutProps) {
  const width = wide ? "max-w-page" : "max-w-reading";
  return (
    <div className="flex min-h-dvh flex-col">
      <SkipLink />
      <FocusOnNavigate />
      <header className="on-dark bg-ink text-paper">
        <div className={cn("mx-auto flex w-full items-center justify-between gap-4 px-4 py-3", width)}>
          <Link to="/" className="rounded-md text-paper no-underline" aria-label="Dewline, go to the start page">
            <Wordmark markClassName="text-dew-300 [--logo-glint:var(--color-ink)]" />
          </Link>
          {headerAction ? (
            <div className="[&_a]:font-semibold [&_a]:text-mist [&_a]:underline [&_a:hover]:text-paper">{headerAction}</div>
          ) : null}
        </div>
      </header>
      <main id="main" tabIndex={-1} className={cn("mx-auto w-full flex-1 px-4 py-8 focus:outline-none", width)}>
        {children}
      </main>
      <footer className="border-t border-line">
        <p className={cn("mx-auto w-full px-4 py-4 text-xs text-ink-soft", width)}>
          Dewline helps tenants and landlords deal with damp and mould together.
        </p>
      </footer>
    </div>
  );
}
