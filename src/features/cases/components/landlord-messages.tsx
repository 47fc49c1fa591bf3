import { useState } from "react";
import { Button } from "@/components/ui/button";
import { EmptyState } from "@/components/ui/empty-state";
import { formatDateIn } from "@/lib/dates";
import { isRole } from "@/lib/roles";
import { useCaseText } from "../tenant-words";
import type { CaseEvent } from "../api/types";

/**
 * Messages staff sent the tenant about this case, and the written summary, newest first. With
 * `showFirst`, only that many show until the tenant asks for the earlier ones.
 */
export function LandlordMessages({ events, showFirst }: { events: readonly CaseEvent[]; showFirst?: number }) {
  const [all, setAll] = useState(false);
  const { t, i18n } = useCaseText();
  const messages = events
    .filter((e) => (e.type === "message-to-tenant" || e.type === "summary-sent") && typeof e.after?.body === "string")
    .sort((a, b) => Date.parse(b.at) - Date.parse(a.at) || b.id - a.id);
  if (messages.length === 0) {
    return <EmptyState title={t("landlordMessages.none")}>{t("landlordMessages.noneBody")}</EmptyState>;
  }
  const shown = all || showFirst === undefined ? messages : messages.slice(0, showFirst);
  const earlier = messages.length - shown.length;
  return (
    <div className="flex flex-col gap-3">
      <ul className="flex flex-col gap-3">
        {shown.map((m) => (
          <li key={m.id} className="rounded-md border border-line bg-paper p-3">
            <p className="text-sm text-ink-soft">
              {m.actor ? (
                <>
                  <span translate="no">{m.actor.name}</span>
                  {isRole(m.actor.role) ? `, ${t(`landlordMessages.role.${m.actor.role}`)}` : ""}
                  {" · "}
                </>
              ) : null}
              <time dateTime={m.at}>{t("landlordMessages.at", { when: formatDateIn(i18n.language, m.at, "dateTime") })}</time>
            </p>
            {m.type === "summary-sent" ? <p className="mt-1 font-semibold">{t("landlordMessages.summary")}</p> : null}
            <p className="mt-1 whitespace-pre-line" translate="no">
              {String(m.after!.body)}
            </p>
          </li>
        ))}
      </ul>
      {earlier > 0 ? (
        <div>
          <Button variant="secondary" size="sm" onClick={() => setAll(true)}>
            {t("landlordMessages.showEarlier", { count: earlier })}
          </Button>
        </div>
      ) : null}
    </div>
  );
}
