import { deadlineStageLabels } from "@/lib/labels";
import type { ComponentType, ReactNode } from "react";
import { formatDateTime } from "@/lib/dates";
import { isRole, roleLabels } from "@/lib/roles";
import type { CaseEvent, CaseEventEmail, CaseRoom } from "../api/types";
import { humanise, statusLabelFor, type Audience } from "../labels";
import { englishTimelineWords, type By, type TimelineWords } from "./timeline-words";

export type { Audience } from "../labels";

interface CaseTimelineProps {
  events: readonly CaseEvent[];
  rooms: readonly CaseRoom[];
  /** Tenants read "you"; staff read names, and see who e-mails went to. */
  audience?: Audience;
  /** Staff views: names for user ids an event mentions (the assignee). */
  staffNames?: ReadonlyMap<number, string>;
  /** Staff views: shown beside an e-mail's delivery state (the page passes the outbox's "Send again" button). */
  EmailAction?: ComponentType<EmailActionProps>;
  /** The tenant's words (their language on the tenant's page); staff read the English in this file. */
  words?: TimelineWords;
}

export interface EmailActionProps {
  outboxId: number;
  status: CaseEventEmail["status"];
  to: string;
}

interface Entry {
  title: string;
  detail?: ReactNode;
}

const count = (n: number, one: string, many: string) => `${n.toLocaleString("en-GB")} ${n === 1 ? one : many}`;
const num = (v: unknown): number => (typeof v === "number" && Number.isFinite(v) ? v : 0);
const str = (v: unknown): string | undefined => (typeof v === "string" && v.trim() ? v : undefined);

function byWhom(event: CaseEvent): string {
  if (!event.actor) return "";
  const role = isRole(event.actor.role) ? roleLabels[event.actor.role] : humanise(event.actor.role);
  return `${event.actor.name} (${role})`;
}

/** How a text's sending stands, for staff. */
const TEXT_STATE_WORDS: Record<string, string> = {
  pending: "waiting to send",
  sending: "sending",
  sent: "sent",
  failed: "could not be sent",
};

/** Typed by a person (a note, a message, a letter): shown as written, never translated. */
const typed = (text: string | undefined) =>
  text ? (
    <p translate="no" className="whitespace-pre-line">
      {text}
    </p>
  ) : undefined;

/** The tenant's sentence (and sometimes a detail) for each event the server lets them see. */
function describeForTenant(event: CaseEvent, rooms: readonly CaseRoom[], w: TimelineWords): Entry {
  const after = event.after ?? {};
  const before = event.before ?? {};
  const roomName = (id: unknown) => rooms.find((r) => r.id === id)?.name;
  const actor = event.actor;
  const by: By =
    actor?.role === "tenant"
      ? { kind: "you" }
      : actor
        ? { kind: "who", who: w.byWhom(actor.name, actor.role) }
        : { kind: "none" };
  const who = by.kind === "who" ? by.who : undefined;

  switch (event.type) {
    case "case-created":
      return { title: w.created(by) };
    case "email-queued":
      return { title: w.emailSent };
    case "email-resent":
      // The tenant's timeline holds only e-mails to the tenant (the server leaves the others out).
      return { title: w.emailSentAgain };
    case "photos-added":
      return { title: w.photosAdded(Array.isArray(after.photoIds) ? after.photoIds.length : 0, by) };
    case "readings-added": {
      const duplicates = num(after.duplicates);
      return {
        title: w.readingsAdded(num(after.imported), roomName(after.roomId)),
        detail: duplicates ? w.readingsSkipped(duplicates) : undefined,
      };
    }
    case "readings-imported": {
      const duplicates = num(after.duplicates);
      const rejected = num(after.rejected);
      const notes = [duplicates ? w.readingsAlreadyThere(duplicates) : "", rejected ? w.rowsUnreadable(rejected) : ""].filter(
        Boolean,
      );
      return {
        title: w.readingsImported(num(after.imported), roomName(after.roomId)),
        detail: notes.length ? notes.join(" ") : undefined,
      };
    }
    case "tenant-got-worse": {
      const note = str(after.note);
      return {
        title: w.gotWorse(by),
        detail: note ? (
          <blockquote translate="no" className="border-l-4 border-line-strong pl-3 whitespace-pre-line">
            {note}
          </blockquote>
        ) : undefined,
      };
    }
    case "status-changed": {
      const to = str(after.status);
      const from = str(before.status);
      return {
        title: to ? w.statusChangedTo(w.statusLabel(to)) : w.statusChanged,
        detail:
          [from ? w.statusWas(w.statusLabel(from)) : "", to ? (w.statusMeaning(to) ?? "") : ""].filter(Boolean).join(" ") ||
          undefined,
      };
    }
    case "text-queued":
      return { title: w.textSent(str(after.numberEnding)), detail: typed(str(after.body)) };
    case "text-not-sent":
      return { title: w.textNotSent };
    case "message-to-tenant":
      return { title: w.messageToYou(who), detail: typed(str(after.body)) };
    case "message-from-tenant":
      return {
        title: w.messageFromTenant(by, Array.isArray(after.photoIds) ? after.photoIds.length : 0),
        detail: typed(str(after.body)),
      };
    case "summary-sent":
      return { title: w.summarySent, detail: typed(str(after.body)) };
    case "inspection-recorded":
      return { title: w.inspectionRecorded };
    case "hazard-classified":
      return { title: w.hazardAssessed };
    case "hhsrs-assessed":
      return { title: w.hhsrsAssessed };
    case "assignee-changed":
      return { title: w.assigned };
    case "fix-verified":
      return { title: after.effective === true ? w.fixWorked : w.fixNotYet, detail: typed(str(after.note)) };
    case "complaint-raised":
      return { title: w.complaintRaised(by, after.onBehalf === true), detail: typed(str(after.description)) };
    case "complaint-acknowledged":
    case "complaint-extended":
    case "complaint-responded": {
      const stage = num(after.stage);
      const letter = after.letter as { subject?: unknown; body?: unknown } | null | undefined;
      return {
        title:
          event.type === "complaint-acknowledged"
            ? w.complaintAcknowledged(stage)
            : event.type === "complaint-extended"
              ? w.complaintExtended(stage, num(after.workingDays))
              : after.final
                ? w.complaintFinal
                : w.complaintResponded(stage),
        detail:
          letter && typeof letter.body === "string" ? (
            <div translate="no">
              <p className="font-semibold">{String(letter.subject ?? "")}</p>
              <p className="whitespace-pre-line">{letter.body}</p>
            </div>
          ) : undefined,
      };
    }
    case "complaint-escalated":
      return { title: w.complaintEscalated(by), detail: typed(str(after.reason)) };
    case "complaint-closed":
      return { title: w.complaintClosed };
    case "complaint-remedy-changed":
      return { title: w.remedyRecorded };
    default:
      return { title: w.other(event.type, who) };
  }
}

/** One plain sentence (and sometimes a detail) for each kind of event; unknown kinds still show. */
export function describeEvent(
  event: CaseEvent,
  rooms: readonly CaseRoom[],
  audience: Audience = "tenant",
  staffNames?: ReadonlyMap<number, string>,
  words: TimelineWords = englishTimelineWords,
): Entry {
  if (audience === "tenant") return describeForTenant(event, rooms, words);
  // Staff: names, addresses and reasons, in English.
  const after = event.after ?? {};
  const before = event.before ?? {};
  const roomName = (id: unknown) => rooms.find((r) => r.id === id)?.name;
  const who = byWhom(event);
  const staff = who || "Staff";
  const inRoom = (id: unknown) => (roomName(id) ? ` for ${roomName(id)}` : "");

  switch (event.type) {
    case "case-created":
      return { title: who ? `${who} logged this report.` : "The report was received." };
    case "email-queued": {
      const to = str(after.to);
      // Staff see below whether it has actually left the outbox.
      if (event.email) return { title: "An e-mail about this report was queued." };
      return { title: to ? `An e-mail about this report was sent to ${to}.` : "An e-mail about this report was sent." };
    }
    case "email-resent": {
      const subject = str(after.subject);
      const to = str(after.to);
      return {
        title: `E-mail sent again${who ? ` by ${who}` : ""}${subject ? `: “${subject}”` : ""}${to ? `, to ${to}` : ""}.`,
      };
    }
    case "photos-added": {
      const ids = Array.isArray(after.photoIds) ? after.photoIds.length : 0;
      const what = ids ? count(ids, "photo was", "photos were") : "Photos were";
      return { title: `${what} added${who ? ` by ${who}` : ""}.` };
    }
    case "readings-added": {
      const duplicates = num(after.duplicates);
      return {
        title: `${count(num(after.imported), "reading was", "readings were")} added by hand${inRoom(after.roomId)}.`,
        detail: duplicates
          ? `${count(duplicates, "reading was", "readings were")} already there, so ${duplicates === 1 ? "it was" : "they were"} skipped.`
          : undefined,
      };
    }
    case "readings-imported": {
      const duplicates = num(after.duplicates);
      const rejected = num(after.rejected);
      const notes = [
        duplicates ? `${count(duplicates, "reading was", "readings were")} already there.` : "",
        rejected ? `${count(rejected, "row", "rows")} of the file couldn't be read.` : "",
      ].filter(Boolean);
      return {
        title: `${count(num(after.imported), "reading was", "readings were")} added from a logger file${inRoom(after.roomId)}.`,
        detail: notes.length ? notes.join(" ") : undefined,
      };
    }
    case "tenant-got-worse": {
      const note = str(after.note);
      return {
        title: `${who || "The tenant"} said it has got worse.`,
        detail: note ? (
          <blockquote className="border-l-4 border-line-strong pl-3 whitespace-pre-line">{note}</blockquote>
        ) : undefined,
      };
    }
    case "status-changed": {
      const to = str(after.status);
      const from = str(before.status);
      const reason = str(after.reason);
      const statusLabel = statusLabelFor("staff");
      return {
        title: to ? `The status changed to “${statusLabel(to)}”${who ? `, by ${who}` : ""}.` : "The status changed.",
        detail:
          [from ? `It was “${statusLabel(from)}”.` : "", reason ? `Reason: ${reason}` : ""].filter(Boolean).join(" ") ||
          undefined,
      };
    }
    case "text-queued": {
      const ending = str(after.numberEnding);
      const kind = str(after.kind);
      const status = event.text ? ` (${TEXT_STATE_WORDS[event.text.status] ?? event.text.status})` : "";
      return {
        title: `Text to the tenant${ending ? ` (number ending ${ending})` : ""}${kind ? `: ${kind.replace(/-/g, " ")}` : ""}${status}.`,
        detail: str(after.body) || undefined,
      };
    }
    case "text-not-sent":
      return { title: "No text: the tenant has texts off, so this went by e-mail only." };
    case "message-to-tenant": {
      const body = str(after.body);
      return {
        title: `${staff} sent the tenant a message.`,
        detail: body ? <p className="whitespace-pre-line">{body}</p> : undefined,
      };
    }
    case "message-from-tenant": {
      const body = str(after.body);
      const photos = Array.isArray(after.photoIds) ? after.photoIds.length : 0;
      return {
        title: `${who || "The tenant"} wrote to the landlord${photos ? `, with ${count(photos, "photo", "photos")}` : ""}.`,
        detail: body ? <p className="whitespace-pre-line">{body}</p> : undefined,
      };
    }
    case "summary-sent": {
      const body = str(after.body);
      return {
        title: `${staff} sent the tenant the written summary.`,
        detail: body ? <p className="whitespace-pre-line">{body}</p> : undefined,
      };
    }
    case "inspection-recorded":
      return { title: `${staff} recorded the inspection.` };
    case "hazard-classified": {
      const to = str(after.hazardClass);
      const reason = str(after.reason);
      return {
        title: `${staff} classified the hazard as ${to ? (hazardClassWords[to] ?? humanise(to)).toLowerCase() : "unknown"}.`,
        detail: reason ? `Reason: ${reason}` : undefined,
      };
    }
    case "hhsrs-assessed":
      return {
        title: `${staff} recorded an HHSRS assessment: band ${String(after.band ?? "?")}, Category ${String(after.category ?? "?")}.`,
      };
    case "assignee-changed": {
      const id = after.assigneeId;
      if (id === null) return { title: `${staff} left the case unassigned.` };
      const name = typeof id === "number" ? staffNames?.get(id) : undefined;
      return { title: name ? `${staff} assigned the case to ${name}.` : "The assignee changed." };
    }
    case "fix-verified": {
      const override = str(after.override);
      const recorded = who ? `${who} recorded that` : "Your landlord recorded that";
      return {
        title: after.effective === true ? `${recorded} the repair worked.` : `${recorded} the repair did not work yet.`,
        detail:
          [str(after.note) ?? "", override ? `Recorded without enough readings after the works. Reason: ${override}` : ""]
            .filter(Boolean)
            .join(" ") || undefined,
      };
    }
    case "internal-note": {
      const body = str(after.body);
      return {
        title: `${staff} added an internal note.`,
        detail: body ? <p className="whitespace-pre-line">{body}</p> : undefined,
      };
    }
    case "evidence-pack-made": {
      // Staff only: the tenant's timeline never carries it (the server leaves it out).
      const pages = typeof after.pages === "number" ? after.pages : undefined;
      return {
        title: `${staff} made the evidence pack${pages ? ` (${pages} pages)` : ""}.`,
        detail: str(after.sha256) ? <p className="break-all">Content SHA-256 {str(after.sha256)}</p> : undefined,
      };
    }
    case "complaint-raised":
      return {
        title: `${staff} recorded a formal complaint${after.onBehalf ? " for the tenant" : ""}.`,
        detail: str(after.description) ? <p className="whitespace-pre-line">{str(after.description)}</p> : undefined,
      };
    case "complaint-acknowledged":
    case "complaint-extended":
    case "complaint-responded": {
      const stage = num(after.stage);
      const letter = after.letter as { subject?: unknown; body?: unknown } | null | undefined;
      const what =
        event.type === "complaint-acknowledged"
          ? `acknowledged the complaint at stage ${stage}`
          : event.type === "complaint-extended"
            ? `extended stage ${stage} of the complaint by ${count(num(after.workingDays), "working day", "working days")}`
            : after.final
              ? "sent the final response to the complaint"
              : `sent the stage ${stage} response to the complaint`;
      const note = str(after.note);
      return {
        title: `${staff} ${what}.`,
        detail:
          letter && typeof letter.body === "string" ? (
            <>
              <p className="font-semibold">{String(letter.subject ?? "")}</p>
              <p className="whitespace-pre-line">{letter.body}</p>
              {note ? <p className="mt-1 text-ink-soft">Staff note: {note}</p> : null}
            </>
          ) : note ? (
            `Staff note: ${note}`
          ) : undefined,
      };
    }
    case "complaint-escalated":
      return {
        title: `${staff} took the complaint to stage 2.`,
        detail: str(after.reason),
      };
    case "complaint-closed":
      return { title: `${staff} closed the complaint.` };
    case "complaint-remedy-changed":
      return { title: `${staff} recorded the complaint's remedy.` };
    case "missed-deadline-explained":
      // Staff only: the tenant's timeline never carries it (the server leaves it out).
      return {
        title: `${staff} said why "${deadlineStageLabels[str(after.stage) ?? ""] ?? str(after.stage) ?? "a stage"}" was missed.`,
        detail: str(after.reason),
      };
    case "sensor-alert": {
      // Staff only: the tenant's timeline never carries it (the server leaves it out).
      const room = str(after.roomName) ?? "A room";
      const what =
        after.rule === "condensing-days"
          ? `condensation on ${num(after.condensingDays)} of the last 7 days`
          : after.rule === "hours-at-80"
            ? `${num(after.hoursAt80)} hours at 80 % surface humidity or more in 7 days`
            : `mould growth index ${num(after.mouldIndex)}`;
      return {
        title: `Sensor alert in ${room}: ${what}.`,
        detail: `Mould growth index ${num(after.mouldIndex)}, ${num(after.hoursAt80)} h at ≥ 80 %, ${num(after.hoursCondensing)} h condensing, surface ${
          after.basis === "measured"
            ? "measured"
            : after.basis === "estimated"
              ? "estimated from the outdoor temperature"
              : "not known (air humidity only)"
        }.`,
      };
    }
    default:
      return { title: `${humanise(event.type)}${who ? `, by ${who}` : ""}.` };
  }
}

/** What has happened to a case, newest first. */
export function CaseTimeline({
  events,
  rooms,
  audience = "tenant",
  staffNames,
  EmailAction,
  words = englishTimelineWords,
}: CaseTimelineProps) {
  if (events.length === 0) return <p className="text-ink-soft">{words.nothingYet}</p>;
  const newestFirst = [...events].sort((a, b) => Date.parse(b.at) - Date.parse(a.at) || b.id - a.id);
  return (
    <ol className="relative flex flex-col gap-4 border-l-2 border-dew-200 pl-5">
      {newestFirst.map((event) => {
        const entry = describeEvent(event, rooms, audience, staffNames, words);
        return (
          <li key={event.id} className="relative">
            <span
              aria-hidden="true"
              className="absolute top-1.5 -left-[1.6rem] size-3 rounded-pill border-2 border-dew-700 bg-surface"
            />
            <p className="text-sm text-ink-soft">
              <time dateTime={event.at}>{audience === "tenant" ? words.at(event.at) : formatDateTime(event.at)}</time>
            </p>
            <p className="font-semibold">{entry.title}</p>
            {entry.detail ? <div className="mt-1 text-ink">{entry.detail}</div> : null}
            {audience === "staff" && event.email ? (
              <EmailDelivery
                email={event.email}
                action={
                  // One "Send again" per e-mail: on the entry that first queued it, not on each resend.
                  EmailAction && event.type !== "email-resent" && typeof event.after?.outboxId === "number" ? (
                    <EmailAction outboxId={event.after.outboxId} status={event.email.status} to={event.email.to} />
                  ) : null
                }
              />
            ) : null}
          </li>
        );
      })}
    </ol>
  );
}

const hazardClassWords: Record<string, string> = {
  emergency: "An emergency hazard",
  significant: "A significant hazard",
  "not-significant": "Not a significant hazard",
};

/** What each e-mail is, in words (server/modules/mail/mail-templates.ts). */
const emailTemplateLabels: Record<string, string> = {
  caseAcknowledgement: "Acknowledgement of the report",
  caseAlert: "Alert to officers",
  caseMessage: "Message to the tenant",
  tenantMessage: "The tenant's message, to staff",
  writtenSummary: "Written summary",
  invitation: "Invitation",
  passwordReset: "Password reset",
};

/** Staff only: who an event's e-mail went to, which e-mail it was, and whether it left the outbox. */
function EmailDelivery({ email, action }: { email: CaseEventEmail; action: ReactNode }) {
  const what = emailTemplateLabels[email.template] ?? humanise(email.template);
  return (
    <div className="mt-1 flex flex-col gap-0.5 rounded-md border border-line bg-paper px-3 py-2 text-sm">
      <p>
        <span className="font-semibold">E-mail:</span> {what}, to <span className="break-all">{email.to}</span>
      </p>
      <p className="flex items-start gap-1.5">
        <DeliveryIcon status={email.status} />
        {email.status === "sent" ? (
          <span>
            Sent
            {email.sentAt ? (
              <>
                {" "}
                at <time dateTime={email.sentAt}>{formatDateTime(email.sentAt)}</time>
              </>
            ) : null}
          </span>
        ) : email.status === "failed" ? (
          <span className="font-semibold text-rust-700">Failed to send{email.error ? `: ${email.error}` : ""}</span>
        ) : email.status === "pending" ? (
          <span>
            Waiting to be sent
            {email.error ? (
              <span className="text-rust-700">: the last try failed ({email.error}); it will be tried again</span>
            ) : null}
          </span>
        ) : email.status === "sending" ? (
          <span>Being sent</span>
        ) : (
          <span>{humanise(email.status)}</span>
        )}
      </p>
      {action}
    </div>
  );
}

function DeliveryIcon({ status }: { status: string }) {
  return (
    <svg viewBox="0 0 16 16" className="mt-0.5 size-4 shrink-0" aria-hidden="true" focusable="false">
      {status === "sent" ? (
        <path d="M3 8.5l3 3 7-7" fill="none" stroke="currentColor" strokeWidth="2" strokeLinecap="round" strokeLinejoin="round" />
      ) : status === "failed" ? (
        <path d="M4 4l8 8M12 4l-8 8" fill="none" stroke="currentColor" strokeWidth="2" strokeLinecap="round" />
      ) : (
        <>
          <circle cx="8" cy="8" r="6" fill="none" stroke="currentColor" strokeWidth="1.6" />
          <path d="M8 4.5V8l2.5 1.5" fill="none" stroke="currentColor" strokeWidth="1.6" strokeLinecap="round" />
        </>
      )}
    </svg>
  );
}
