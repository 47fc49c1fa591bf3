// The tenant's case page in the tenant's language: the `case` namespace (src/locales/<lng>/case.json).
// Staff screens keep the English in labels.ts; the officers' queue imports that file, never this one,
// so its first load carries no i18next (bench:queue).
import { useMemo } from "react";
import { useTranslation } from "react-i18next";
import { formatDateIn } from "@/lib/dates";
import { i18n } from "@/lib/i18n/i18n";
import { isRole } from "@/lib/roles";
import { humanise, statusLabels, type TenantStageFacts } from "./labels";
import type { PhotoGalleryWords } from "./components/photo-gallery";
import type { By, TimelineWords } from "./components/timeline-words";

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

/** The timeline's words in the tenant's language (the timeline is shared with staff: see timeline-words.ts). */
export function useTimelineWords(): TimelineWords {
  const { t, i18n: active } = useCaseText();
  const lng = active.language;
  return useMemo(() => {
    const m = (key: string, values?: Record<string, unknown>) => t(`timeline.${key}`, values);
    const by = (b: By) => ({ by: b.kind, who: b.kind === "who" ? b.who : "" });
    const room = (name?: string) => ({ hasRoom: name ? "yes" : "no", room: name ?? "" });
    const label = (status: string) =>
      Object.hasOwn(statusLabels, status) ? t(`status.${status}.label`) : t("status.unknown.label");
    return {
      nothingYet: m("nothingYet"),
      at: (iso) => t("landlordMessages.at", { when: formatDateIn(lng, iso, "dateTime") }),
      byWhom: (name, role) => m("byWhom", { name, role: isRole(role) ? t(`landlordMessages.role.${role}`) : role }),
      statusLabel: label,
      statusMeaning: (status) => (Object.hasOwn(statusLabels, status) ? t(`status.${status}.meaning`) : undefined),
      created: (b) => m("created", by(b)),
      emailSent: m("emailSent"),
      emailSentAgain: m("emailSentAgain"),
      photosAdded: (count, b) => m("photosAdded", { count, ...by(b) }),
      readingsAdded: (count, name) => m("readingsAdded", { count, ...room(name) }),
      readingsSkipped: (count) => m("readingsSkipped", { count }),
      readingsImported: (count, name) => m("readingsImported", { count, ...room(name) }),
      readingsAlreadyThere: (count) => m("readingsAlreadyThere", { count }),
      rowsUnreadable: (count) => m("rowsUnreadable", { count }),
      gotWorse: (b) => m("gotWorse", by(b)),
      statusChangedTo: (status) => m("statusChangedTo", { status }),
      statusChanged: m("statusChanged"),
      statusWas: (status) => m("statusWas", { status }),
      textSent: (ending) => m("textSent", { hasEnding: ending ? "yes" : "no", ending: ending ?? "" }),
      textNotSent: m("textNotSent"),
      messageToYou: (who) => m("messageToYou", { hasWho: who ? "yes" : "no", who: who ?? "" }),
      messageFromTenant: (b, photos) => m("messageFromTenant", { ...by(b), photos }),
      summarySent: m("summarySent"),
      inspectionRecorded: m("inspectionRecorded"),
      hazardAssessed: m("hazardAssessed"),
      hhsrsAssessed: m("hhsrsAssessed"),
      assigned: m("assigned"),
      fixWorked: m("fixWorked"),
      fixNotYet: m("fixNotYet"),
      complaintRaised: (b, onBehalf) => m("complaintRaised", { ...by(b), onBehalf: onBehalf ? "yes" : "no" }),
      complaintAcknowledged: (stage) => m("complaintAcknowledged", { stage }),
      complaintExtended: (stage, days) => m("complaintExtended", { stage, days }),
      complaintFinal: m("complaintFinal"),
      complaintResponded: (stage) => m("complaintResponded", { stage }),
      complaintEscalated: (b) => m("complaintEscalated", by(b)),
      complaintClosed: m("complaintClosed"),
      remedyRecorded: m("remedyRecorded"),
      other: (type, who) => m("other", { what: humanise(type), hasWho: who ? "yes" : "no", who: who ?? "" }),
    };
  }, [t, lng]);
}
