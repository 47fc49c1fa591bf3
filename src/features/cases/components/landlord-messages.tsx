import { EmptyState } from "@/components/ui/empty-state";
import { formatDateTime } from "@/lib/dates";
import { isRole, roleLabels } from "@/lib/roles";
import type { CaseEvent } from "../api/types";

/** Messages staff sent the tenant about this case, and the written summary, newest first. */
export function LandlordMessages({ events }: { events: readonly CaseEvent[] }) {
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
  return (
    <ul className="flex flex-col gap-3">
      {messages.map((m) => (
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
  );
}
