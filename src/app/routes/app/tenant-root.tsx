import { Outlet } from "react-router-dom";
import { useTranslation } from "react-i18next";
import { ErrorWordsContext } from "@/components/errors/error-words";
import { AppLayout, type NavItem } from "@/components/layouts/app-layout";
import { LanguageSwitch } from "@/features/language/components/language-switch";
import { useShellWords } from "@/features/language/hooks/use-shell-words";
import type { WaitingWords } from "@/features/report/lib/waiting-words";
import { languageFor } from "@/lib/i18n/choice";
import { i18n, showLanguage } from "@/lib/i18n/i18n";
import type { Lng } from "@/lib/i18n/languages";

/**
 * Shows the tenant's language before their first page renders (the app route's loader awaits it), so
 * nobody sees English flash before Welsh. Lives here, not in the router: staff never load i18next.
 */
export async function prepareTenantLanguage(user: { role: string; language: string | null }): Promise<void> {
  await showLanguage(languageFor(user));
}

/**
 * The "waiting to send" note's words in `lng`, for the page shown when the session could not be checked
 * (router.tsx's WaitingNote; the note itself is in the main bundle and holds no translation code).
 */
export async function waitingWords(lng: Lng): Promise<WaitingWords> {
  await showLanguage(lng);
  const t = i18n.getFixedT(lng, "case");
  return { title: t("waiting.title"), body: t("waiting.body") };
}

/** The signed-in shell as a tenant sees it: in their language, with the language switch in the header. */
export default function TenantRoot({
  userName,
  onSignOut,
  signingOut,
}: {
  userName: string;
  onSignOut: () => void;
  signingOut: boolean;
}) {
  const { t } = useTranslation("common");
  const words = useShellWords();
  const nav: NavItem[] = [
    { to: "/home", label: t("nav.myHome") },
    { to: "/cases", label: t("nav.myReports") },
    { to: "/calculator", label: t("nav.calculator") },
  ];
  return (
    <ErrorWordsContext.Provider value={words.errors}>
      <AppLayout
        variant="tenant"
        userName={userName}
        roleLabel={t("shell.tenant")}
        homePath="/home"
        nav={nav}
        onSignOut={onSignOut}
        signingOut={signingOut}
        words={words.shell}
        headerExtra={<LanguageSwitch signedIn />}
      >
        <Outlet />
      </AppLayout>
    </ErrorWordsContext.Provider>
  );
}
