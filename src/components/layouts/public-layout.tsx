import type { ReactNode } from "react";
import { Link } from "react-router-dom";
import { Wordmark } from "@/components/ui/logo";
import { cn } from "@/lib/cn";
import { ENGLISH_SHELL_WORDS, type ShellWords } from "./app-layout";
import { FocusOnNavigate } from "./focus-on-navigate";
import { SkipLink } from "./skip-link";

interface PublicLayoutProps {
  /** A link at the top right: "Sign in" for visitors, back to their home screen for others. */
  headerAction?: ReactNode;
  wide?: boolean;
  /** The shell's words (translated by the public pages' root); English by default. */
  words?: Pick<ShellWords, "skipLink" | "footer"> & { homeLink: string };
  /** The language switch, beside the header's link. */
  headerExtra?: ReactNode;
  children: ReactNode;
}

/** Sign-in, invitations, password reset, the calculator and "not found": no sign-in needed. */
export function PublicLayout({
  headerAction,
  wide = false,
  words = { ...ENGLISH_SHELL_WORDS, homeLink: "Dewline, go to the start page" },
  headerExtra,
  children,
}: PublicLayoutProps) {
  const width = wide ? "max-w-page" : "max-w-reading";
  return (
    <div className="flex min-h-dvh flex-col">
      <SkipLink label={words.skipLink} />
      <FocusOnNavigate />
      <header className="on-dark bg-ink text-paper">
        <div className={cn("mx-auto flex w-full items-center justify-between gap-4 px-4 py-3", width)}>
          <Link to="/" className="rounded-md text-paper no-underline" aria-label={words.homeLink}>
            <Wordmark markClassName="text-dew-300 [--logo-glint:var(--color-ink)]" />
          </Link>
          <div className="flex flex-wrap items-center justify-end gap-4">
            {headerExtra}
            {headerAction ? (
              <div className="[&_a]:font-semibold [&_a]:text-mist [&_a]:underline [&_a:hover]:text-paper">{headerAction}</div>
            ) : null}
          </div>
        </div>
      </header>
      <main id="main" tabIndex={-1} className={cn("mx-auto w-full flex-1 px-4 py-8 focus:outline-none", width)}>
        {children}
      </main>
      <footer className="border-t border-line">
        <p className={cn("mx-auto w-full px-4 py-4 text-xs text-ink-soft", width)}>{words.footer}</p>
      </footer>
    </div>
  );
}
