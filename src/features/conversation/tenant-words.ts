// The conversation's words in the tenant's language, for the tenant's case page only (the `case`
// namespace, "conversation"). Staff pages never import this file, so they never load i18next; the
// components take what this returns as their `words` prop (see lib/words.ts).
import { useMemo } from "react";
import { useTranslation } from "react-i18next";
import { formatDateIn } from "@/lib/dates";
import { i18n } from "@/lib/i18n/i18n";
import { isRole } from "@/lib/roles";
import type { ConversationWords, UnreadWords } from "./lib/words";

export function useConversationWords(): ConversationWords {
  const { t, i18n: active } = useTranslation("case", { i18n });
  const lng = active.language;
  return useMemo(() => {
    const c = (key: string, values?: Record<string, unknown>) => t(`conversation.${key}`, values);
    return {
      unreadNote: (count) => c("unreadNote", { count }),
      loading: c("loading"),
      loadFailed: c("loadFailed"),
      tryAgain: c("tryAgain"),
      listLabel: c("listLabel"),
      emptyTitle: c("emptyTitle"),
      emptyBody: c("emptyBody"),
      you: c("you"),
      yourLandlord: c("yourLandlord"),
      staffAuthor: (name, role) => c("staffAuthor", { name, role: isRole(role) ? t(`landlordMessages.role.${role}`) : role }),
      summarySuffix: c("summarySuffix"),
      newTag: c("newTag"),
      at: (iso) => t("landlordMessages.at", { when: formatDateIn(lng, iso, "dateTime") }),
      photosLabel: c("photosLabel"),
      photoAlt: (n, of) => c("photoAlt", { n, of }),
      label: c("label"),
      hint: c("hint"),
      photos: c("photos"),
      optional: c("optional"),
      photosHint: (max) => c("photosHint", { max }),
      refusedTitle: (count) => c("refusedTitle", { count }),
      problem: (p) =>
        p.kind === "too-big"
          ? c("problem.too-big", { size: p.size })
          : p.kind === "too-many"
            ? c("problem.too-many", { max: p.max })
            : c(`problem.${p.kind}`),
      chosenLabel: c("chosenLabel"),
      remove: c("remove"),
      notSent: c("notSent"),
      send: c("send"),
      sent: (count) => c("sent", { count }),
      writeTheMessage: c("writeTheMessage"),
      tooLong: c("tooLong"),
      ctrlEnter: c("ctrlEnter"),
    };
  }, [t, lng]);
}

/** The unread-messages box on My reports in the tenant's language (the box is shared with staff). */
export function useUnreadWords(): UnreadWords {
  const { t, i18n: active } = useTranslation("case", { i18n });
  const lng = active.language;
  return useMemo(
    () => ({
      heading: t("unread.heading"),
      total: (count) => t("unread.total", { count }),
      report: t("unread.report"),
      line: (count) => t("unread.line", { count }),
    }),
    // lng: the words change when the language does.
    // eslint-disable-next-line react-hooks/exhaustive-deps
    [t, lng],
  );
}
