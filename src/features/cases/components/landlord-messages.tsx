import { useState } from "react";
import { Button } from "@/components/ui/button";
import { EmptyState } from "@/components/ui/empty-state";
import { formatDateTime } from "@/lib/dates";
import { isRole, roleLabels } from "@/lib/roles";
import type { CaseEvent } from "../api/types";

/**
 * Messages staff sent the tenant about this case, and the written summary, newest first. With
 * `showFirst`, only that many show until the tenant asks for the earlier ones.
 */
export function LandlordMessages({ events, showFirst }: { events: readonly CaseEvent[]; showFirst?: number }) {
  const [all, setAll] = useState(false);
  const messages = events
    .filter((e) => (e.type === "message-to-tenant" || e.type === "summary-sent") && typeof e.after?.body === "string")
    .sort((a, b) => Date.parse(b.at) - Date.parse(a.at) || b.id - a.id);
  if (messages.length === 0) {
    return (
      <EmptyState title="No messages yet">
        When your landlord writes to you about this report, their messages will appear here.
      </EmptyState>
    );
  }
  const shown = all || showFirst === undefined ? messages : messages.slice(0, showFirst);
  const earlier = messages.length - shown.length;
  return (
    <div className="flex flex-col gap-3">
      <ul className="flex flex-col gap-3">
        {shown.map((m) => (
          <li key={m.id} className="rounded-md border border-line bg-paper p-3">
            <p className="text-sm text-ink-soft">
              {m.actor ? `${m.actor.name}${isRole(m.actor.role) ? `, ${roleLabels[m.actor.role]}` : ""} · ` : ""}
              <time dateTime={m.at}>{formatDateTime(m.at)}</time>
            </p>
            {m.type === "summary-sent" ? <p className="mt-1 font-semibold">Written summary of the investigation</p> : null}
            <p className="mt-1 whitespace-pre-line">{String(m.after!.body)}</p>
          </li>
        ))}
      </ul>
      {earlier > 0 ? (
        <div>
          <Button variant="secondary" size="sm" onClick={() => setAll(true)}>
            Show {earlier === 1 ? "the earlier message" : `${earlier} earlier messages`}
          </Button>
        </div>
      ) : null}
    </div>
  );
}
