import type { QueryClient } from "@tanstack/react-query";
import { useTranslation } from "react-i18next";
import { Link, Outlet, useLocation } from "react-router-dom";
import { ErrorWordsContext } from "@/components/errors/error-words";
import { PublicLayout } from "@/components/layouts/public-layout";
import { meQueryOptions, useMe } from "@/features/auth/api/get-me";
import { roleHome } from "@/features/auth/roles";
import { LanguageSwitch } from "@/features/language/components/language-switch";
import { useShellWords } from "@/features/language/hooks/use-shell-words";
import { languageFor } from "@/lib/i18n/choice";
import { showLanguage } from "@/lib/i18n/i18n";

/**
 * Pages anyone may open wait for their language's text before they render (no English before Welsh):
 * a visitor's from `?lang=`, this device or the browser; a tenant's from their account; staff's English.
 */
export const clientLoader = (queryClient: QueryClient) => async () => {
  const user = await queryClient.ensureQueryData(meQueryOptions()).catch(() => null);
  await showLanguage(languageFor(user));
  return null;
};

export default function PublicRoot() {
  const { data: user } = useMe();
  const { pathname } = useLocation();
  const { t } = useTranslation("common");
  const words = useShellWords();
  const wide = pathname.startsWith("/calculator");
  const staff = user && user.role !== "tenant";
  let action = null;
  if (user) {
    const home = roleHome(user.role);
    // Staff screens are in English, so is the way back to them.
    const label = staff ? home.label : t("nav.myHome");
    action = <Link to={home.path}>{staff ? `Back to ${label}` : t("shell.backTo", { place: label })}</Link>;
  } else if (!pathname.startsWith("/sign-in")) {
    action = <Link to="/sign-in">{t("shell.signIn")}</Link>;
  }
  return (
    <ErrorWordsContext.Provider value={words.errors}>
      <PublicLayout
        headerAction={action}
        wide={wide}
        words={{ ...words.shell, homeLink: words.publicHomeLink }}
        headerExtra={staff ? null : <LanguageSwitch signedIn={Boolean(user)} />}
      >
        <Outlet />
      </PublicLayout>
    </ErrorWordsContext.Provider>
  );
}
