import { useMemo } from "react";
import { useTranslation } from "react-i18next";
import type { ErrorWords } from "@/components/errors/error-words";
import type { ShellWords } from "@/components/layouts/app-layout";

/** The shared shell's and error pages' words in the current language (they take text as props). */
export function useShellWords(): { shell: ShellWords; errors: ErrorWords; publicHomeLink: string } {
  const { t, i18n } = useTranslation("common");
  return useMemo(
    () => ({
      shell: {
        skipLink: t("shell.skipLink"),
        homeLink: t("shell.homeLink"),
        navLabel: t("shell.navLabel"),
        signOut: t("shell.signOut"),
        footer: t("shell.footer"),
      },
      publicHomeLink: t("shell.publicHomeLink"),
      errors: {
        notFoundTitle: t("errors.notFoundTitle"),
        notFoundText: t("errors.notFoundText"),
        startPage: t("errors.startPage"),
        notAllowedTitle: t("errors.notAllowedTitle"),
        notAllowedText: t("errors.notAllowedText"),
        notAllowedAsk: t("errors.notAllowedAsk"),
        notAllowedOtherKind: t("errors.notAllowedOtherKind"),
        goTo: (place: string) => t("errors.goTo", { place }),
        errorTitle: t("errors.errorTitle"),
        errorText: t("errors.errorText"),
        staleText: t("errors.staleText"),
        reload: t("errors.reload"),
        titleSuffix: " · Dewline",
      },
    }),
    // i18n.language: the words change when the language does.
    // eslint-disable-next-line react-hooks/exhaustive-deps
    [t, i18n.language],
  );
}
