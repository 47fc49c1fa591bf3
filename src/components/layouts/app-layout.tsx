import type { ReactNode } from "react";
import { Link, NavLink } from "react-router-dom";
import { Button } from "@/components/ui/button";
import { Wordmark } from "@/components/ui/logo";
import { cn } from "@/lib/cn";
import { FocusOnNavigate } from "./focus-on-navigate";
import { SkipLink } from "./skip-link";

export interface NavItem {
  to: string;
  label: string;
  /** Active only on this exact path, not on the pages under it (e.g. /admin but not /admin/policy). */
  end?: boolean;
}

/**
 * The shell's own words. Staff see the English defaults; the tenant's shell passes them translated
 * (this file must not load the language machinery: the officers' queue loads it first).
 */
export interface ShellWords {
  skipLink: string;
  homeLink: string;
  navLabel: string;
  signOut: string;
  footer: string;
}

export const ENGLISH_SHELL_WORDS: ShellWords = {
  skipLink: "Skip to main content",
  homeLink: "Dewline, go to your home screen",
  navLabel: "Main",
  signOut: "Sign out",
  footer: "Dewline helps tenants and landlords deal with damp and mould together.",
};

interface AppLayoutProps {
  /** "tenant": roomy, one column, mobile first. "staff": dense and wide for tables. */
  variant: "tenant" | "staff";
  userName: string;
  roleLabel: string;
  homePath: string;
  nav: NavItem[];
  onSignOut: () => void;
  signingOut?: boolean;
  words?: ShellWords;
  /** Beside the sign-out button: the tenant's language switch. */
  headerExtra?: ReactNode;
  children: ReactNode;
}

export function AppLayout({
  variant,
  userName,
  roleLabel,
  homePath,
  nav,
  onSignOut,
  signingOut,
  words = ENGLISH_SHELL_WORDS,
  headerExtra,
  children,
}: AppLayoutProps) {
  const staff = variant === "staff";
  const width = staff ? "max-w-wide" : "max-w-reading";
  return (
    <div className={cn("flex min-h-dvh flex-col", staff ? "text-sm" : "text-base")}>
      <SkipLink label={words.skipLink} />
      <FocusOnNavigate />
      <header className="on-dark bg-ink text-paper">
        <div className={cn("mx-auto flex w-full flex-wrap items-center gap-x-6 gap-y-2 px-4", width, staff ? "py-2" : "py-3")}>
          <Link to={homePath} className="rounded-md text-paper no-underline" aria-label={words.homeLink}>
            <Wordmark markClassName="text-dew-300 [--logo-glint:var(--color-ink)]" />
          </Link>
          <nav aria-label={words.navLabel} className="order-last w-full md:order-none md:w-auto">
            <ul className="flex flex-wrap gap-1">
              {nav.map((item) => (
                <li key={item.to}>
                  <NavLink
                    to={item.to}
                    end={item.end}
                    className={({ isActive }) =>
                      cn(
                        "inline-flex min-h-9 items-center rounded-md px-3 font-semibold text-mist no-underline hover:bg-dew-900 hover:text-paper",
                        isActive && "bg-dew-800 text-paper underline decoration-dew-300 decoration-2 underline-offset-4",
                      )
                    }
                  >
                    {item.label}
                  </NavLink>
                </li>
              ))}
            </ul>
          </nav>
          <div className="ml-auto flex flex-wrap items-center gap-3">
            {headerExtra}
            <p className="text-right leading-tight">
              <span className="block font-semibold" translate="no">
                {userName}
              </span>
              <span className="block text-xs text-mist">{roleLabel}</span>
            </p>
            <Button
              size="sm"
              variant="secondary"
              onClick={onSignOut}
              busy={signingOut}
              className="border-dew-300 bg-transparent text-paper hover:bg-dew-900 active:bg-dew-900"
            >
              {words.signOut}
            </Button>
          </div>
        </div>
      </header>
      <main
        id="main"
        tabIndex={-1}
        className={cn("mx-auto w-full flex-1 px-4 focus:outline-none", width, staff ? "py-5" : "py-6 sm:py-8")}
      >
        {children}
      </main>
      <footer className="border-t border-line">
        <p className={cn("mx-auto w-full px-4 py-4 text-xs text-ink-soft", width)}>{words.footer}</p>
      </footer>
    </div>
  );
}
