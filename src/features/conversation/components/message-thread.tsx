import type { ReactNode } from "react";
import { EmptyState } from "@/components/ui/empty-state";
import { cn } from "@/lib/cn";
import type { ConversationMessage } from "@/lib/contracts";
import { formatDateTime } from "@/lib/dates";
import { isRole, roleLabels } from "@/lib/roles";
import { englishConversationWords, type ConversationWords } from "../lib/words";

export type Viewer = "tenant" | "staff";

interface MessageThreadProps {
  messages: readonly ConversationMessage[];
  viewer: Viewer;
  /** Messages from the other side with a higher id were not read when the conversation was opened. */
  readUpToAtOpen: number;
  /** What the tenant reads (see ../lib/words.ts). */
  words?: ConversationWords;
}

const roleWords = (role: string) => (isRole(role) ? roleLabels[role] : role);

/** Who wrote a message, in the words of the person reading. */
function authorOf(m: ConversationMessage, viewer: Viewer, words: ConversationWords): ReactNode {
  if (viewer === "tenant") {
    if (m.mine) return words.you;
    if (!m.author) return words.yourLandlord;
    if (m.author.role === "tenant") return <span translate="no">{m.author.name}</span>;
    // The name is data; the role is words (the pseudo-locale marks the whole line as translated).
    return words.staffAuthor(m.author.name, m.author.role);
  }
  if (m.mine) return "You";
  if (!m.author) return "Dewline";
  if (m.author.role === "tenant") return `${m.author.name} (tenant)`;
  return `${m.author.name}, ${roleWords(m.author.role)}`;
}

/** Is this message from the other side (what counts as unread)? */
const fromOtherSide = (m: ConversationMessage, viewer: Viewer) =>
  viewer === "staff" ? m.kind === "from-tenant" : m.kind === "to-tenant" || m.kind === "summary";

/** The conversation, oldest first: each side's messages on its own side, internal notes marked as staff only. */
export function MessageThread({ messages, viewer, readUpToAtOpen, words = englishConversationWords }: MessageThreadProps) {
  const tenant = viewer === "tenant";
  if (messages.length === 0) {
    return (
      <EmptyState title={tenant ? words.emptyTitle : "No messages yet"}>
        {tenant
          ? words.emptyBody
          : "Nothing has been written on this case yet. A message to the tenant is e-mailed to them; an internal note stays with staff."}
      </EmptyState>
    );
  }
  return (
    <ol aria-label={tenant ? words.listLabel : "Messages, oldest first"} className="flex flex-col gap-3">
      {messages.map((m) => {
        const isNew = fromOtherSide(m, viewer) && m.id > readUpToAtOpen;
        const headingId = `message-${m.id}-from`;
        return (
          <li key={m.id} className={cn("flex", m.mine || (viewer === "staff" && m.kind !== "from-tenant") ? "justify-end" : "")}>
            <article
              aria-labelledby={headingId}
              className={cn(
                "w-full max-w-2xl min-w-0 rounded-lg border p-3 sm:w-[88%]",
                m.kind === "internal-note"
                  ? "border-dashed border-ember-400 bg-ember-50"
                  : m.mine
                    ? "border-dew-200 bg-dew-50"
                    : "border-line bg-surface",
                isNew && "border-l-4 border-l-dew-600",
              )}
            >
              <header className="flex flex-wrap items-baseline gap-x-2 gap-y-1 text-sm">
                <h3 id={headingId} className="font-semibold text-ink">
                  {authorOf(m, viewer, words)}
                  {m.kind === "summary" ? (
                    <span className="font-normal">{tenant ? words.summarySuffix : ": the written summary"}</span>
                  ) : null}
                </h3>
                <time dateTime={m.at} className="text-ink-soft">
                  {tenant ? words.at(m.at) : formatDateTime(m.at)}
                </time>
                {isNew ? (
                  <span className="rounded-pill bg-dew-700 px-2 text-xs font-bold text-white">
                    {tenant ? words.newTag : "New"}
                  </span>
                ) : null}
                {m.kind === "internal-note" ? (
                  <span className="rounded-pill border border-ember-400 px-2 text-xs font-bold text-ember-800">
                    Internal note, staff only
                  </span>
                ) : null}
              </header>
              <p className="mt-1 break-words whitespace-pre-line text-ink" translate="no">
                {m.body}
              </p>
              {m.photos.length ? <MessagePhotos photos={m.photos} words={words} /> : null}
              {viewer === "staff" ? <ReadReceipt message={m} /> : null}
            </article>
          </li>
        );
      })}
    </ol>
  );
}

function MessagePhotos({ photos, words }: { photos: ConversationMessage["photos"]; words: ConversationWords }) {
  return (
    <ul aria-label={words.photosLabel} className="mt-2 flex flex-wrap gap-2">
      {photos.map((p, i) => (
        <li key={p.id}>
          <a href={p.url} target="_blank" rel="noreferrer" className="block rounded-sm focus-visible:outline-3">
            <img
              src={p.thumbnailUrl}
              alt={words.photoAlt(i + 1, photos.length)}
              className="size-24 rounded-sm border border-line bg-paper object-cover"
              loading="lazy"
            />
          </a>
        </li>
      ))}
    </ul>
  );
}

/** Staff only: who of the other side has read a message, and when they first did. */
function ReadReceipt({ message }: { message: ConversationMessage }) {
  if (message.kind === "internal-note") return null;
  const toTenant = message.kind !== "from-tenant";
  const text = message.readBy.length
    ? toTenant
      ? `Read by the tenant ${formatDateTime(message.readBy[0]!.readAt)}`
      : `Read by ${message.readBy.map((r) => `${r.name} ${formatDateTime(r.readAt)}`).join("; ")}`
    : toTenant
      ? "Not read by the tenant yet"
      : "Not read by staff yet";
  return (
    <p className={cn("mt-2 text-sm", message.readBy.length ? "text-moss-700" : "text-ink-soft")}>
      <span aria-hidden="true">{message.readBy.length ? "✓ " : ""}</span>
      {text}
    </p>
  );
}
