import { useEffect, useState } from "react";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { ConfirmDialog } from "@/components/ui/dialog";
import { TextLink } from "@/components/ui/text-link";
import { formatDateTime } from "@/lib/dates";
import { useReportQueue, type SentResult } from "../hooks/use-report-queue";
import { getQueueState, loadQueue, subscribeQueue, type QueuedReport } from "../lib/report-queue";

// Every word these notes show, in one place (for the translations to come).
const words = {
  waitingTitle: "Your report is waiting to send",
  waitingBody:
    "There is no signal at the moment, so your report is kept on this phone. It will send by itself when you are back online. You do not need to fill it in again.",
  partlySent: "Your report has reached your landlord. The rest is kept on this phone and will send by itself.",
  kept: (what: string) => `Kept on this phone: ${what}.`,
  keptSince: (when: string) => `Saved at ${when}.`,
  sendNow: "Try to send it now",
  stillNoSignal: "Still no signal. We will keep trying when you are back online.",
  refusedTitle: "Your report could not be sent",
  refusedBody: "It is still kept on this phone. You can try again, or remove it and start a new report.",
  remove: "Remove it from this phone",
  removeTitle: "Remove this report from your phone?",
  removeBody: "The answers, photos and readings kept on this phone for it will be deleted. This cannot be undone.",
  removeConfirm: "Remove it",
  keep: "Keep it",
  sentTitle: "Your report has been sent",
  sentBody: "Your landlord has it now.",
  sentLink: "See your report",
  deviceNote:
    "A report is kept on this phone, waiting to send. It will send by itself when you are back online and Dewline opens again.",
} as const;

const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;

/** What is kept on the phone for a report, in words: "your answers, 2 photos and 1 reading". */
export function keptParts(r: QueuedReport): string {
  const parts = [r.caseId === undefined ? "your answers" : null];
  if (!r.photosDone && r.photos.length) parts.push(plural(r.photos.length, "photo", "photos"));
  if (!r.readingsDone && r.readings.length) parts.push(plural(r.readings.length, "reading", "readings"));
  if (r.loggerFile) parts.push("your logger file");
  const list = parts.filter((p): p is string => p !== null);
  return list.length > 1 ? `${list.slice(0, -1).join(", ")} and ${list.at(-1)}` : (list[0] ?? "your report");
}

interface WaitingReportsProps {
  userId: number;
  /** Called when a kept report has gone (the report page opens the case). */
  onSent?: (result: SentResult) => void;
  /** Say so when a kept report has been sent (pages that stay put after it). */
  showSent?: boolean;
}

/** The tenant's reports kept on this phone, each with its state and a way to send it now. */
export function WaitingReports({ userId, onSent, showSent = true }: WaitingReportsProps) {
  const queue = useReportQueue(userId, onSent);
  const [removing, setRemoving] = useState<string | null>(null);

  return (
    <div className="flex flex-col gap-3">
      {queue.items.map((r) => {
        const sending = queue.isSending(r.id);
        return (
          <Alert
            key={r.id}
            tone={r.refusal ? "danger" : "warning"}
            title={r.refusal ? words.refusedTitle : words.waitingTitle}
            live={r.refusal ? "alert" : "status"}
          >
            {r.refusal ? (
              <>
                <p>{r.refusal.message}</p>
                {r.refusal.fields?.length ? (
                  <ul className="mt-1 list-disc pl-5">
                    {r.refusal.fields.map((f) => (
                      <li key={f.field}>{f.message}</li>
                    ))}
                  </ul>
                ) : null}
                <p className="mt-1">{words.refusedBody}</p>
              </>
            ) : (
              <p>{r.caseId === undefined ? words.waitingBody : words.partlySent}</p>
            )}
            <p className="mt-1">
              {words.kept(keptParts(r))} {words.keptSince(formatDateTime(r.queuedAt))}
            </p>
            <p className="mt-1 italic">
              “{r.report.description.slice(0, 80)}
              {r.report.description.length > 80 ? "…" : ""}”
            </p>
            <div className="mt-3 flex flex-wrap gap-3">
              <Button variant="secondary" size="sm" busy={sending} onClick={() => void queue.retry(r.id)}>
                {words.sendNow}
              </Button>
              {r.refusal ? (
                <Button variant="secondary" size="sm" onClick={() => setRemoving(r.id)}>
                  {words.remove}
                </Button>
              ) : null}
            </div>
            <p role="status" className="mt-2 text-sm font-semibold">
              {queue.stillWaiting(r.id) && !sending ? words.stillNoSignal : null}
            </p>
          </Alert>
        );
      })}
      {showSent
        ? queue.sent.map((s) => (
            <Alert key={s.report.id} tone="success" title={words.sentTitle}>
              <p>
                {words.sentBody} <TextLink to={s.created ? `/cases/${s.created.id}` : "/cases"}>{words.sentLink}</TextLink>
              </p>
            </Alert>
          ))
        : null}
      <ConfirmDialog
        open={removing !== null}
        title={words.removeTitle}
        confirmLabel={words.removeConfirm}
        cancelLabel={words.keep}
        tone="danger"
        onConfirm={() => {
          if (removing) void queue.remove(removing);
          setRemoving(null);
        }}
        onCancel={() => setRemoving(null)}
      >
        {words.removeBody}
      </ConfirmDialog>
    </div>
  );
}

/**
 * For a page that could not reach the server (opened with no signal): says a report is kept here,
 * without showing it (whose it is is not known yet), and opens the page again once back online.
 */
export function WaitingOnThisDevice() {
  const [count, setCount] = useState(() => getQueueState().items.length);
  useEffect(() => {
    const refresh = () => setCount(getQueueState().items.length);
    const unsubscribe = subscribeQueue(refresh);
    void loadQueue().then(refresh);
    const reload = () => window.location.reload();
    window.addEventListener("online", reload);
    return () => {
      unsubscribe();
      window.removeEventListener("online", reload);
    };
  }, []);
  if (!count) return null;
  return (
    <Alert tone="warning" title={words.waitingTitle} live="none" className="mx-auto w-full max-w-reading">
      <p>{words.deviceNote}</p>
    </Alert>
  );
}
