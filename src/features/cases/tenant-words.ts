// The tenant's case page in the tenant's language: the `case` namespace (src/locales/<lng>/case.json).
// Staff screens keep the English in labels.ts; the officers' queue imports that file, never this one,
// so its first load carries no i18next (bench:queue).
import { useMemo } from "react";
import { useTranslation } from "react-i18next";
import { formatDateIn } from "@/lib/dates";
import { i18n } from "@/lib/i18n/i18n";
import { statusLabels, type TenantStageFacts } from "./labels";
import type { PhotoGalleryWords } from "./components/photo-gallery";

/** `t` and the language for the tenant's case page and the parts of it this feature draws. */
export const useCaseText = () => useTranslation("case", { i18n });

/** The tenant's stage in words (see tenantStage in labels.ts): the written summary told apart from "Inspected". */
export function useTenantStage(status: string, facts: TenantStageFacts = {}): { label: string; meaning?: string } {
  const { t } = useCaseText();
  const key =
    status === "investigated" && facts.summarySent ? "findings-sent" : Object.hasOwn(statusLabels, status) ? status : "unknown";
  return {
    label: t(`status.${key}.label`),
    meaning: key === "unknown" ? undefined : t(`status.${key}.meaning`),
  };
}

/** The photo gallery's words in the tenant's language (the gallery is shared with staff: see photo-gallery.tsx). */
export function usePhotoGalleryWords(): PhotoGalleryWords {
  const { t, i18n: active } = useCaseText();
  const lng = active.language;
  return useMemo(() => {
    const when = (iso: string) => formatDateIn(lng, iso, "dateTime");
    return {
      open: `${t("gallery.open")} `,
      of: (total) => ` ${t("gallery.of", { total })}`,
      added: (iso) => `, ${t("gallery.added", { when: when(iso) })}`,
      title: (n, total) => t("gallery.title", { n, total }),
      photo: t("gallery.photo"),
      alt: (n, total, iso) => t("gallery.alt", { n, total, when: when(iso) }),
      previous: t("gallery.previous"),
      next: t("gallery.next"),
      newTab: t("gallery.newTab"),
      close: t("gallery.close"),
    };
  }, [t, lng]);
}
