import type { TFunction } from "i18next";
import { useState } from "react";
import { useTranslation } from "react-i18next";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { ConfirmDialog } from "@/components/ui/dialog";
import { TextLink } from "@/components/ui/text-link";
import { formatDateTimeIn } from "@/lib/dates";
import { i18n } from "@/lib/i18n/i18n";
import { useReportQueue, type SentResult } from "../hooks/use-report-queue";
import type { QueuedReport } from "../lib/report-queue";

/** What is kept on the phone for a report, in words: "your answers, 2 photos and 1 reading". */
export function keptParts(t: TFunction, r: QueuedReport): string {
  const parts = [r.caseId === undefined ? t("report:queue.answers") : null];
  if (!r.photosDone && r.photos.length) parts.push(t("report:queue.photos", { count: r.photos.length }));
  if (!r.readingsDone && r.readings.length) parts.push(t("report:queue.readings", { count: r.readings.length }));
  if (r.loggerFile) parts.push(t("report:queue.loggerFile"));
  const list = parts.filter((p): p is string => p !== null);
  return list.length ? joinAnd(t, list) : t("report:queue.yourReport");
}

/** "a, b and c" in the reader's language. */
function joinAnd(t: TFunction, items: string[]): string {
  if (items.length === 1) return items[0]!;
  return t("report:queue.and", { list: items.slice(0, -1).join(", "), last: items.at(-1) });
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
  const { t, i18n: active } = useTranslation("report", { i18n });
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
            title={t(r.refusal ? "queue.refusedTitle" : "queue.waitingTitle")}
            live={r.refusal ? "alert" : "status"}
          >
            {r.refusal ? (
              <>
                <p>
                  {r.refusal.step === "photos"
                    ? `${t("queue.refusedPhotos")} `
                    : r.refusal.step === "readings"
                      ? `${t("queue.refusedReadings")} `
                      : null}
                  {r.refusal.message}
                </p>
                {r.refusal.fields?.length ? (
                  <ul className="mt-1 list-disc pl-5">
                    {r.refusal.fields.map((f) => (
                      <li key={f.field}>{f.message}</li>
                    ))}
                  </ul>
                ) : null}
                <p className="mt-1">{t("queue.refusedBody")}</p>
              </>
            ) : (
              <p>{t(r.caseId === undefined ? "queue.waitingBody" : "queue.partlySent")}</p>
            )}
            <p className="mt-1">
              {t("queue.kept", { what: keptParts(t, r) })}{" "}
              {t("queue.keptSince", { when: formatDateTimeIn(active.language, r.queuedAt) })}
            </p>
            <p className="mt-1 italic" translate="no">
              “{r.report.description.slice(0, 80)}
              {r.report.description.length > 80 ? "…" : ""}”
            </p>
            <div className="mt-3 flex flex-wrap gap-3">
              <Button variant="secondary" size="sm" busy={sending} onClick={() => void queue.retry(r.id)}>
                {t("queue.sendNow")}
              </Button>
              {r.refusal ? (
                <Button variant="secondary" size="sm" onClick={() => setRemoving(r.id)}>
                  {t("queue.remove")}
                </Button>
              ) : null}
            </div>
            <p role="status" className="mt-2 text-sm font-semibold">
              {queue.stillWaiting(r.id) && !sending ? t("queue.stillNoSignal") : null}
            </p>
          </Alert>
        );
      })}
      {showSent
        ? queue.sent.map((s) => (
            <Alert key={s.report.id} tone="success" title={t("queue.sentTitle")}>
              <p>
                {t("queue.sentBody")}{" "}
                <TextLink to={s.created ? `/cases/${s.created.id}` : "/cases"}>{t("queue.sentLink")}</TextLink>
              </p>
            </Alert>
          ))
        : null}
      <ConfirmDialog
        open={removing !== null}
        title={t("queue.removeTitle")}
        confirmLabel={t("queue.removeConfirm")}
        cancelLabel={t("queue.keep")}
        tone="danger"
        onConfirm={() => {
          if (removing) void queue.remove(removing);
          setRemoving(null);
        }}
        onCancel={() => setRemoving(null)}
      >
        {t("queue.removeBody")}
      </ConfirmDialog>
    </div>
  );
}
