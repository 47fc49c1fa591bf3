import { useId, useRef, useState, type FormEvent } from "react";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { ConfirmDialog } from "@/components/ui/dialog";
import { EmptyState } from "@/components/ui/empty-state";
import { Select, Textarea } from "@/components/ui/field";
import { LoadingState } from "@/components/ui/spinner";
import { errorMessage } from "@/lib/api-client";
import { useVerification } from "../api/get-verification";
import { useRecordVerification } from "../api/record-verification";
import {
  WORK_ORDER_TYPES,
  type RoomComparison,
  type Verification,
  type VerificationInput,
  type WorkOrderType,
} from "../api/case-types";
import { WORK_TYPE_WORDS, workTypeLabel } from "../lib/words";
import { VERDICT_WORDS, comparisonRows, verdictOf } from "../lib/verification-view";
import { formatDateTimeZoned, formatLongDay } from "@/lib/dates";
import { VerificationChart } from "./verification-chart";

interface VerificationSectionProps {
  caseId: number;
  /** The case's status: the outcome can be recorded while it is monitoring. */
  caseStatus: string;
  /** Maintenance leads and administrators record the outcome. */
  canDecide: boolean;
}

/** Did the fix work? The readings before and after the works, room by room, and the decision. */
export function VerificationSection({ caseId, caseStatus, canDecide }: VerificationSectionProps) {
  const verification = useVerification(caseId);
  if (verification.isPending)
    return <LoadingState className="py-4">Comparing the readings before and after the works…</LoadingState>;
  if (verification.isError)
    return (
      <Alert tone="warning" title="We couldn't compare the readings just now">
        {errorMessage(verification.error)}
      </Alert>
    );
  const v = verification.data;
  if (v.state === "no-works" || !v.worksDoneAt)
    return (
      <EmptyState title="No works done yet">
        Once the last work order is done, the readings before and after the works are compared here.
      </EmptyState>
    );
  return (
    <div className="flex flex-col gap-5">
      <MonitoringLine v={v} />
      {v.outcome ? <OutcomeView outcome={v.outcome} /> : null}
      {v.rooms.length === 0 ? (
        <p className="text-ink-soft">
          No readings with a room on record yet. Ask the tenant to add readings, or put a logger in.
        </p>
      ) : (
        v.rooms.map((r) => <RoomComparisonView key={r.roomId} room={r} />)
      )}
      <p className="text-sm text-ink-soft">
        How to read this: surface humidity is worked out from each reading by the same engine as the rest of the case; mould can
        grow on a surface at 80 % or more (ISO 13788). The mould index is the VTT model&apos;s, started again from 0 after the
        works. “Improved” means the mean surface humidity is lower after the works and the hours at or above 80 % per day are not
        higher, with at least a day of readings after (our rule). It is evidence for the person who decides, not the decision.
      </p>
      {canDecide && caseStatus === "monitoring" && !v.outcome ? (
        <OutcomeForm caseId={caseId} enoughReadings={v.enoughReadings} />
      ) : null}
    </div>
  );
}

function MonitoringLine({ v }: { v: Verification }) {
  return (
    <dl className="grid grid-cols-1 gap-x-4 gap-y-1 sm:grid-cols-[auto_1fr]">
      <dt className="font-semibold">Works done</dt>
      <dd>{formatDateTimeZoned(v.worksDoneAt)}</dd>
      {v.monitoringEndsAt ? (
        <>
          <dt className="font-semibold">Monitoring</dt>
          <dd>
            {v.state === "monitoring" ? "Monitoring until" : "Monitoring ended on"} {formatLongDay(v.monitoringEndsAt)} (
            {v.monitoringDays} {v.monitoringDays === 1 ? "day" : "days"})
          </dd>
        </>
      ) : null}
    </dl>
  );
}

function OutcomeView({ outcome }: { outcome: NonNullable<Verification["outcome"]> }) {
  return (
    <Alert
      tone={outcome.effective ? "success" : "warning"}
      title={outcome.effective ? "Recorded: the fix was effective" : "Recorded: the fix was not effective"}
      live="none"
    >
      <p className="whitespace-pre-line">{outcome.note}</p>
      {outcome.override ? (
        <p className="mt-1">
          <strong>Recorded without enough readings after the works.</strong> Reason: {outcome.override}
        </p>
      ) : null}
      <p className="mt-1 text-sm text-ink-soft">
        By {outcome.by}, {formatDateTimeZoned(outcome.at)}
      </p>
    </Alert>
  );
}

const VERDICT_TONE = { improved: "text-moss-700", "not-improved": "text-rust-700", "too-few": "text-ink-soft" } as const;

function RoomComparisonView({ room }: { room: RoomComparison }) {
  const headingId = useId();
  const verdict = verdictOf(room.comparison);
  return (
    <section aria-labelledby={headingId} className="flex flex-col gap-3 rounded-md border border-line bg-paper p-3 sm:p-4">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h4 id={headingId} className="text-lg font-bold">
          {room.roomName}
        </h4>
        <p className={`font-bold ${VERDICT_TONE[verdict]}`}>{VERDICT_WORDS[verdict]}</p>
      </div>
      <div className="overflow-x-auto">
        <table className="w-full min-w-[28rem] text-left text-sm">
          <caption className="sr-only">
            {room.roomName}: readings before and after the works. {VERDICT_WORDS[verdict]}.
          </caption>
          <thead>
            <tr className="border-b border-line">
              <th scope="col" className="py-1 pr-3 font-semibold">
                Measure
              </th>
              <th scope="col" className="py-1 pr-3 font-semibold">
                Before the works
              </th>
              <th scope="col" className="py-1 font-semibold">
                After the works
              </th>
            </tr>
          </thead>
          <tbody>
            {comparisonRows(room.comparison).map(([label, before, after]) => (
              <tr key={label} className="border-b border-line last:border-0">
                <th scope="row" className="py-1 pr-3 font-normal">
                  {label}
                </th>
                <td className="py-1 pr-3 tabular-nums">{before}</td>
                <td className="py-1 tabular-nums">{after}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <VerificationChart roomName={room.roomName} comparison={room.comparison} />
    </section>
  );
}

type Choice = "effective" | "not-effective" | null;

function OutcomeForm({ caseId, enoughReadings }: { caseId: number; enoughReadings: boolean }) {
  const headingId = useId();
  const record = useRecordVerification(caseId);
  const [choice, setChoice] = useState<Choice>(null);
  const [note, setNote] = useState("");
  const [type, setType] = useState<WorkOrderType | "">("");
  const [description, setDescription] = useState("");
  const [override, setOverride] = useState("");
  const [errors, setErrors] = useState<{ note?: string; type?: string; description?: string; override?: string }>({});
  const overrideRef = useRef<HTMLTextAreaElement>(null);
  // "Fix effective" needs the readings after the works, or a reason for going without them (kept on the timeline).
  const needsOverride = choice === "effective" && !enoughReadings;
  const [confirming, setConfirming] = useState<VerificationInput | null>(null);
  const noteRef = useRef<HTMLTextAreaElement>(null);
  const typeRef = useRef<HTMLSelectElement>(null);
  const descriptionRef = useRef<HTMLTextAreaElement>(null);

  const pick = (next: Choice) => {
    setChoice(next);
    setErrors({});
    record.reset();
  };

  const submit = (e: FormEvent) => {
    e.preventDefault();
    const found: typeof errors = {};
    if (note.trim().length < 3) found.note = "Say what the readings and the visit showed.";
    if (needsOverride && override.trim().length < 10)
      found.override = "Say why the fix can be judged without the readings (at least 10 characters).";
    if (choice === "not-effective") {
      if (!type) found.type = "Choose the work to try next.";
      if (description.trim().length < 5) found.description = "Describe the next work in a few words (at least 5 characters).";
    }
    setErrors(found);
    if (found.note) return noteRef.current?.focus();
    if (found.override) return overrideRef.current?.focus();
    if (found.type) return typeRef.current?.focus();
    if (found.description) return descriptionRef.current?.focus();
    setConfirming(
      choice === "effective"
        ? { effective: true, note: note.trim(), ...(needsOverride ? { override: { reason: override.trim() } } : {}) }
        : { effective: false, note: note.trim(), workOrder: { type: type as WorkOrderType, description: description.trim() } },
    );
  };

  const send = () => {
    if (!confirming) return;
    record.mutate(confirming, { onSuccess: () => setConfirming(null), onError: () => setConfirming(null) });
  };

  return (
    <section aria-labelledby={headingId} className="flex flex-col gap-3 border-t border-line pt-4">
      <h4 id={headingId} className="text-lg font-bold">
        Record the outcome
      </h4>
      <div className="flex flex-wrap gap-2">
        <Button
          variant={choice === "effective" ? "primary" : "secondary"}
          aria-pressed={choice === "effective"}
          onClick={() => pick("effective")}
        >
          Fix effective
        </Button>
        <Button
          variant={choice === "not-effective" ? "primary" : "secondary"}
          aria-pressed={choice === "not-effective"}
          onClick={() => pick("not-effective")}
        >
          Not effective
        </Button>
      </div>
      {choice ? (
        <form onSubmit={submit} noValidate className="flex flex-col gap-3">
          <Textarea
            ref={noteRef}
            label="What the readings and the visit showed"
            rows={3}
            maxLength={4000}
            value={note}
            error={errors.note}
            onChange={(e) => {
              setNote(e.target.value);
              setErrors((x) => ({ ...x, note: undefined }));
            }}
          />
          {needsOverride ? (
            <>
              <Alert tone="warning" live="none" title="Not enough readings after the works yet">
                <p>
                  No affected room has a day of readings since the works, so the readings cannot show the fix worked. Wait for
                  them, or record the decision anyway with your reason: it is kept on the case&apos;s timeline for staff.
                </p>
              </Alert>
              <Textarea
                ref={overrideRef}
                label="Why decide without the readings"
                rows={2}
                maxLength={2000}
                value={override}
                error={errors.override}
                onChange={(e) => {
                  setOverride(e.target.value);
                  setErrors((x) => ({ ...x, override: undefined }));
                }}
              />
            </>
          ) : null}
          {choice === "not-effective" ? (
            <>
              <Select
                ref={typeRef}
                label="Next work to try"
                value={type}
                error={errors.type}
                onChange={(e) => {
                  setType(e.target.value as WorkOrderType | "");
                  setErrors((x) => ({ ...x, type: undefined }));
                }}
                controlClassName="sm:max-w-md"
              >
                <option value="">Choose the type of work</option>
                {WORK_ORDER_TYPES.map((t) => (
                  <option key={t} value={t}>
                    {WORK_TYPE_WORDS[t].label}
                  </option>
                ))}
              </Select>
              <Textarea
                ref={descriptionRef}
                label="Description of the next work"
                rows={2}
                maxLength={4000}
                value={description}
                error={errors.description}
                onChange={(e) => {
                  setDescription(e.target.value);
                  setErrors((x) => ({ ...x, description: undefined }));
                }}
              />
            </>
          ) : null}
          {record.isError ? (
            <Alert tone="danger" title="The outcome was not recorded">
              {errorMessage(record.error)}
            </Alert>
          ) : null}
          <div>
            <Button type="submit">{choice === "effective" ? "Record: fix effective…" : "Record: not effective…"}</Button>
          </div>
        </form>
      ) : null}
      <ConfirmDialog
        open={confirming !== null}
        title={confirming?.effective ? "Close the case as fixed?" : "Record that the fix did not work?"}
        confirmLabel={confirming?.effective ? "Yes, the fix worked" : "Yes, order the next work"}
        cancelLabel="Go back"
        busy={record.isPending}
        onConfirm={send}
        onCancel={() => setConfirming(null)}
      >
        {confirming?.effective ? (
          <p>The case is closed and the tenant gets an e-mail saying so. It can be reopened later if the problem comes back.</p>
        ) : (
          <p>
            The case goes back to investigated with a new work order
            {confirming && !confirming.effective ? `: ${workTypeLabel(confirming.workOrder.type)}` : ""}.
          </p>
        )}
      </ConfirmDialog>
    </section>
  );
}
