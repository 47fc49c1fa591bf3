import { useState } from "react";
import { Button } from "@/components/ui/button";
import { Panel } from "@/components/ui/card";
import { Textarea } from "@/components/ui/field";
import { errorMessage } from "@/lib/api-client";
import { useExplainMissedDeadline } from "../api/explain-missed-deadline";
import { useDeadlines } from "../api/get-deadlines";
import type { CaseDeadline } from "../api/types";
import { stageLabel, stateLabel } from "../lib/labels";
import { formatWeekdayDateTimeZoned } from "@/lib/dates";
import { QueryState } from "./query-state";

const AFTER_INSPECTION = new Set(["summary", "safety-work", "supplementary-work"]);

function dueText(d: CaseDeadline): string {
  if (d.dueAt) return formatWeekdayDateTimeZoned(d.dueAt);
  if (d.state === "not-applicable") return "Does not apply";
  if (AFTER_INSPECTION.has(d.stage)) return "Starts when the inspection is recorded";
  return "No fixed date";
}

/**
 * Every statutory stage: when it is due and was done (UK time), and its state in words and an icon.
 * `policySource` says whose timeframes they are (the page reads the policy from the policy feature).
 */
export function DeadlinesPanel({
  caseId,
  policySource,
  canExplain = false,
}: {
  caseId: number;
  policySource?: "default" | "landlord" | undefined;
  /** Officers and admins may say why a missed stage was missed. */
  canExplain?: boolean;
}) {
  const deadlines = useDeadlines(caseId);
  return (
    <Panel title="Deadlines" id="case-deadlines">
      <QueryState query={deadlines} loading="Loading the deadlines…" failed="We couldn't load the deadlines">
        {(list) =>
          list.length === 0 ? (
            <p className="text-ink-soft">No deadlines for this case.</p>
          ) : (
            <ul className="flex flex-col divide-y divide-line">
              {list.map((d) => (
                <li key={d.stage} className="flex flex-col gap-1 py-2">
                  <div className="flex flex-wrap items-center justify-between gap-2">
                    <span className="font-semibold">{stageLabel(d.stage)}</span>
                    <StateTag state={d.state} />
                  </div>
                  <dl className="grid grid-cols-[auto_1fr] gap-x-2 text-sm">
                    <dt className="text-ink-soft">Due</dt>
                    <dd>{d.dueAt ? <time dateTime={d.dueAt}>{dueText(d)}</time> : dueText(d)}</dd>
                    <dt className="text-ink-soft">Done</dt>
                    <dd>{d.doneAt ? <time dateTime={d.doneAt}>{formatWeekdayDateTimeZoned(d.doneAt)}</time> : "Not yet"}</dd>
                    {d.state === "missed" ? (
                      <>
                        <dt className="text-ink-soft">Why missed</dt>
                        <dd>
                          {d.missedReason
                            ? `${d.missedReason.reason} (${d.missedReason.by ?? "staff"}, ${formatWeekdayDateTimeZoned(d.missedReason.at)})`
                            : "Not recorded"}
                        </dd>
                      </>
                    ) : null}
                  </dl>
                  {d.state === "missed" && canExplain ? <ExplainMissed caseId={caseId} stage={d.stage} /> : null}
                </li>
              ))}
            </ul>
          )
        }
      </QueryState>
      <p className="mt-3 text-xs text-ink-soft">
        Times are UK time (Europe/London).{" "}
        {policySource
          ? policySource === "landlord"
            ? "Timeframes: your organisation's own policy."
            : "Timeframes: the England social-housing default."
          : null}
      </p>
    </Panel>
  );
}

const tagTone: Record<string, string> = {
  pending: "border-dew-700 bg-dew-50 text-dew-800",
  met: "border-moss-600 bg-moss-50 text-moss-700",
  missed: "border-rust-600 bg-rust-50 text-rust-700",
  "not-applicable": "border-line-strong bg-paper text-ink-soft",
};

/** The state in words with its own shape of icon, so colour is never the only signal. */
export function StateTag({ state }: { state: string }) {
  return (
    <span
      className={`inline-flex items-center gap-1 rounded-pill border px-2 py-0.5 text-sm font-semibold ${tagTone[state] ?? tagTone["not-applicable"]}`}
    >
      <StateIcon state={state} />
      {stateLabel(state)}
    </span>
  );
}

function StateIcon({ state }: { state: string }) {
  const common = {
    fill: "none",
    stroke: "currentColor",
    strokeWidth: 2,
    strokeLinecap: "round" as const,
    strokeLinejoin: "round" as const,
  };
  return (
    <svg viewBox="0 0 16 16" className="size-4 shrink-0" aria-hidden="true" focusable="false">
      {state === "met" ? (
        <path d="M3 8.5l3 3 7-7" {...common} />
      ) : state === "missed" ? (
        <>
          <path d="M8 2.5L14.5 13.5H1.5z" {...common} strokeWidth={1.6} />
          <path d="M8 6.5v3M8 11.6v.1" {...common} strokeWidth={1.6} />
        </>
      ) : state === "pending" ? (
        <>
          <circle cx="8" cy="8" r="6" {...common} strokeWidth={1.6} />
          <path d="M8 4.5V8l2.5 1.5" {...common} strokeWidth={1.6} />
        </>
      ) : (
        <path d="M4 8h8" {...common} />
      )}
    </svg>
  );
}

/** A small form under a missed stage: why it was missed, in a few words (the board report lists it). */
function ExplainMissed({ caseId, stage }: { caseId: number; stage: string }) {
  const [open, setOpen] = useState(false);
  const [reason, setReason] = useState("");
  const explain = useExplainMissedDeadline(caseId);
  if (!open)
    return (
      <Button type="button" variant="secondary" size="sm" className="self-start" onClick={() => setOpen(true)}>
        Say why it was missed
      </Button>
    );
  return (
    <form
      className="flex flex-col gap-2"
      onSubmit={(e) => {
        e.preventDefault();
        explain.mutate(
          { stage, reason },
          {
            onSuccess: () => {
              setOpen(false);
              setReason("");
            },
          },
        );
      }}
    >
      <Textarea
        label={`Why was "${stageLabel(stage)}" missed?`}
        hint="Staff only. It is listed in the monthly board report."
        rows={2}
        value={reason}
        onChange={(e) => setReason(e.target.value)}
        error={explain.isError ? errorMessage(explain.error) : undefined}
      />
      <div className="flex gap-2">
        <Button type="submit" size="sm" disabled={explain.isPending || reason.trim().length < 3}>
          {explain.isPending ? "Saving…" : "Save the reason"}
        </Button>
        <Button type="button" size="sm" variant="secondary" onClick={() => setOpen(false)}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
