import { useState } from "react";
import { Alert } from "@/components/ui/alert";
import { Button, buttonClasses } from "@/components/ui/button";
import { Panel } from "@/components/ui/card";
import { ConfirmDialog } from "@/components/ui/dialog";
import { Input, Textarea } from "@/components/ui/field";
import { errorMessage } from "@/lib/api-client";
import { formatDateTimeZoned, todayInLondon } from "@/lib/dates";
import { boardReportUrl, useBoardReportSettings, useSaveBoardReportRecipients, useSendBoardReport } from "../api/board-report";

/** The month before this one (London), YYYY-MM: the latest whole month. */
function lastMonth(): string {
  const [y, m] = todayInLondon().split("-").map(Number) as [number, number];
  return new Date(Date.UTC(y, m - 2, 1)).toISOString().slice(0, 7);
}

const monthWords = (month: string) =>
  new Intl.DateTimeFormat("en-GB", { month: "long", year: "numeric", timeZone: "UTC" }).format(new Date(`${month}-01T00:00:00Z`));

/**
 * The monthly board report: a PDF of a month's figures for any staff member; for admins, the list of
 * addresses it is e-mailed to at the start of each month, and sending a month's report now.
 */
export function BoardReportPanel({ isAdmin }: { isAdmin: boolean }) {
  const [month, setMonth] = useState(lastMonth);
  // A month that has begun (this one included): the server refuses a later one.
  const valid = /^\d{4}-(0[1-9]|1[0-2])$/.test(month) && month <= todayInLondon().slice(0, 7);
  return (
    <Panel title="Board report" id="board-report">
      <p className="mb-3 text-ink-soft">
        A PDF of a month&rsquo;s figures for the board: deadlines met and missed, time to act, the Category 1 hazards open and
        where cases cluster, with page numbers, the landlord&rsquo;s name and the month.
      </p>
      <div className="flex flex-wrap items-end gap-3">
        <Input
          label="Month"
          type="month"
          value={month}
          max={todayInLondon().slice(0, 7)}
          onChange={(e) => setMonth(e.target.value)}
          error={valid ? undefined : "Choose a month that has begun."}
          className="w-48"
        />
        {valid ? (
          <a className={buttonClasses("primary")} href={boardReportUrl(month)} download>
            Download {monthWords(month)} (PDF)
          </a>
        ) : null}
      </div>
      {isAdmin ? <Recipients month={valid ? month : null} /> : null}
    </Panel>
  );
}

function Recipients({ month }: { month: string | null }) {
  const settings = useBoardReportSettings(true);
  const save = useSaveBoardReportRecipients();
  const send = useSendBoardReport();
  const [draft, setDraft] = useState<string | null>(null);
  const [confirming, setConfirming] = useState(false);
  if (settings.isPending) return <p className="mt-4 text-ink-soft">Loading who gets the report…</p>;
  if (settings.isError)
    return (
      <Alert tone="danger" title="We couldn't load who gets the report">
        {errorMessage(settings.error)}
      </Alert>
    );
  const text = draft ?? settings.data.recipients.join("\n");
  const list = text
    .split(/[\n,;]/)
    .map((s) => s.trim())
    .filter(Boolean);
  return (
    <div className="mt-5 border-t border-line pt-4">
      <form
        onSubmit={(e) => {
          e.preventDefault();
          save.mutate(list, { onSuccess: () => setDraft(null) });
        }}
        className="flex flex-col gap-3"
      >
        <Textarea
          label="E-mail it each month to"
          hint="One address a line. On the first day of each month the last month's report goes to these addresses, once."
          rows={4}
          value={text}
          onChange={(e) => setDraft(e.target.value)}
          error={save.isError ? errorMessage(save.error) : undefined}
        />
        <div className="flex flex-wrap items-center gap-3">
          <Button type="submit" variant="secondary" disabled={save.isPending || draft === null}>
            {save.isPending ? "Saving…" : "Save the list"}
          </Button>
          {month && settings.data.recipients.length > 0 ? (
            <Button type="button" variant="secondary" onClick={() => setConfirming(true)} disabled={draft !== null}>
              E-mail {monthWords(month)} now
            </Button>
          ) : null}
        </div>
      </form>
      <p className="mt-2 text-sm text-ink-soft" aria-live="polite">
        {send.isSuccess
          ? `${monthWords(send.data.month)}: ${send.data.emails} e-mail${send.data.emails === 1 ? "" : "s"} queued.`
          : settings.data.lastSent
            ? `Last e-mailed: ${monthWords(settings.data.lastSent.month)}, on ${formatDateTimeZoned(settings.data.lastSent.sentAt)}.`
            : "Not e-mailed yet."}
      </p>
      <ConfirmDialog
        open={confirming}
        title={`E-mail the ${month ? monthWords(month) : ""} board report now?`}
        confirmLabel="E-mail it"
        busy={send.isPending}
        error={send.isError ? errorMessage(send.error) : undefined}
        onCancel={() => setConfirming(false)}
        onConfirm={() => {
          if (month) send.mutate(month, { onSuccess: () => setConfirming(false) });
        }}
      >
        It goes to the {settings.data.recipients.length} address{settings.data.recipients.length === 1 ? "" : "es"} on the list,
        with the PDF attached.
      </ConfirmDialog>
    </div>
  );
}
