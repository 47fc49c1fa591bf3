import { useMemo, useRef, useState, type FormEvent } from "react";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { ConfirmDialog } from "@/components/ui/dialog";
import { Textarea } from "@/components/ui/field";
import { LoadingState } from "@/components/ui/spinner";
import { errorMessage } from "@/lib/api-client";
import { useAssessments } from "../api/get-assessments";
import { useDeadlines } from "../api/get-deadlines";
import { useInspections } from "../api/get-inspections";
import { useSendSummary } from "../api/send-summary";
import type { SentSummary, WorkspaceCase } from "../api/types";
import { formatWeekdayDateTimeZoned } from "@/lib/dates";
import { buildSummaryTemplate, hasPlaceholder } from "../lib/summary-template";
import { caseAddress } from "./case-header";

interface SummarySectionProps {
  c: WorkspaceCase;
  sender: { name: string; role?: string };
  /** Officers and administrators send it; others read why they can't. */
  canSend: boolean;
}

/** The written summary to the tenant: a draft from the case, edited by the officer, confirmed, then sent. */
export function SummarySection({ c, sender, canSend }: SummarySectionProps) {
  const inspections = useInspections(c.id);
  const assessments = useAssessments(c.id);
  const deadlines = useDeadlines(c.id);
  const send = useSendSummary(c.id);
  const [body, setBody] = useState<string | null>(null);
  const [error, setError] = useState<string | undefined>();
  const [confirming, setConfirming] = useState(false);
  const [resetting, setResetting] = useState(false);
  const [sent, setSent] = useState<SentSummary | null>(null);
  const textRef = useRef<HTMLTextAreaElement>(null);

  const template = useMemo(
    () =>
      buildSummaryTemplate({
        reference: c.reference,
        address: caseAddress(c),
        inspections: inspections.data ?? [],
        assessments: assessments.data ?? [],
        deadlines: deadlines.data ?? [],
        sender,
      }),
    [c, inspections.data, assessments.data, deadlines.data, sender],
  );

  const firstSentAt = deadlines.data?.find((d) => d.stage === "summary")?.doneAt ?? null;

  if (inspections.isPending || assessments.isPending || deadlines.isPending)
    return <LoadingState className="py-4">Preparing the written summary…</LoadingState>;
  if (inspections.isError) {
    return (
      <Alert tone="warning" title="We couldn't check for an inspection">
        {errorMessage(inspections.error)}
      </Alert>
    );
  }

  const noInspection = inspections.data.length === 0;
  const text = body ?? template;
  const disabled = noInspection || !canSend;

  const submit = (e: FormEvent) => {
    e.preventDefault();
    setSent(null);
    const trimmed = text.trim();
    let problem: string | undefined;
    if (trimmed.length < 20) problem = "Write the summary for the tenant: what you found, what will be done and by when.";
    else if (hasPlaceholder(trimmed)) problem = "Fill in or remove every part marked “[Fill in: …]” before sending.";
    setError(problem);
    if (problem) return textRef.current?.focus();
    setConfirming(true);
  };

  const confirm = () =>
    send.mutate(text.trim(), {
      onSuccess: (result) => {
        setSent(result);
        setConfirming(false);
      },
      onError: () => setConfirming(false),
    });

  return (
    <div className="flex flex-col gap-4">
      {noInspection ? (
        <Alert tone="info" title="Record the inspection first" live="none">
          The written summary tells the tenant what the inspection found, so it can be sent once an inspection is recorded.
        </Alert>
      ) : !canSend ? (
        <p className="text-ink-soft">Only housing officers and administrators can send the written summary.</p>
      ) : null}
      {firstSentAt ? (
        <p>
          A written summary was first sent <time dateTime={firstSentAt}>{formatWeekdayDateTimeZoned(firstSentAt)}</time>. Another
          one can be sent as a correction; both stay in the timeline.
        </p>
      ) : null}
      {assessments.isError || deadlines.isError ? (
        <Alert tone="warning" title="Part of the draft is missing">
          We couldn't load the {assessments.isError ? "assessments" : "deadlines"}, so the draft leaves them out. Add them by
          hand.
        </Alert>
      ) : null}
      <form onSubmit={submit} noValidate className="flex flex-col gap-3">
        <Textarea
          ref={textRef}
          label="Summary for the tenant"
          hint="A draft from the case: edit it before sending. The tenant sees it on their case page and gets it by e-mail."
          rows={18}
          maxLength={10000}
          value={text}
          disabled={disabled}
          error={error}
          onChange={(e) => {
            setBody(e.target.value);
            setSent(null);
            send.reset();
            if (error) setError(undefined);
          }}
        />
        {send.isError ? (
          <Alert tone="danger" title="The summary was not sent">
            {errorMessage(send.error)}
          </Alert>
        ) : null}
        {sent ? (
          <Alert tone="success" title={`Sent at ${formatWeekdayDateTimeZoned(sent.sentAt)}`}>
            The tenant can read it on their case page, and an e-mail is on its way to them.
          </Alert>
        ) : null}
        <div className="flex flex-wrap gap-2">
          <Button type="submit" disabled={disabled} busy={send.isPending}>
            Send the written summary
          </Button>
          {body !== null && !disabled ? (
            <Button variant="secondary" onClick={() => setResetting(true)}>
              Start again from the draft
            </Button>
          ) : null}
        </div>
      </form>
      <ConfirmDialog
        open={confirming}
        title="Send the written summary to the tenant?"
        confirmLabel="Send it"
        busy={send.isPending}
        onConfirm={confirm}
        onCancel={() => setConfirming(false)}
      >
        <p>It is shown on their case page and e-mailed to them. It can't be taken back: a correction is sent as a new summary.</p>
      </ConfirmDialog>
      <ConfirmDialog
        open={resetting}
        title="Throw away your changes?"
        confirmLabel="Start again"
        cancelLabel="Keep my changes"
        tone="danger"
        onConfirm={() => {
          setBody(null);
          setResetting(false);
          setError(undefined);
        }}
        onCancel={() => setResetting(false)}
      >
        <p>The text goes back to the draft made from the case.</p>
      </ConfirmDialog>
    </div>
  );
}
