import type { ComplaintResponse } from "@/lib/contracts";
import { formatLongDay } from "@/lib/dates";
import { COMPLAINT_STATUS_LABELS, formatPounds } from "../lib/labels";
import { ComplaintClocks } from "./complaint-clocks";

/** One complaint: where it stands, the tenant's words, the clocks, the responses and the remedy. */
export function ComplaintSummary({ complaint: c, staff }: { complaint: ComplaintResponse; staff: boolean }) {
  const r = c.remedy;
  return (
    <div className="flex flex-col gap-2">
      <p className="font-semibold">{COMPLAINT_STATUS_LABELS[c.status]}</p>
      <p className="text-sm text-ink-soft">
        Made on {formatLongDay(c.raisedAt)}
        {c.onBehalf ? " (written down by staff for the tenant)" : ""}
      </p>
      <blockquote className="border-l-4 border-line-strong pl-3 whitespace-pre-wrap">{c.description}</blockquote>
      {c.escalationReason ? (
        <p className="text-sm">
          <span className="font-semibold">Taken to stage 2: </span>
          {c.escalationReason}
        </p>
      ) : null}
      <ComplaintClocks complaint={c} staff={staff} />
      {c.stages.map((s) =>
        s.response ? (
          <div key={s.stage} className="text-sm">
            <p className="font-semibold">{s.stage === 2 ? "Final response" : "Stage 1 response"}</p>
            <p className="whitespace-pre-wrap">{s.response}</p>
          </div>
        ) : null,
      )}
      {r.apology || r.putRight || r.compensationOfferedPence !== null ? (
        <dl className="grid grid-cols-[auto_1fr] gap-x-3 text-sm">
          {r.apology ? (
            <>
              <dt className="text-ink-soft">Apology</dt>
              <dd>{r.apologyText ?? "Yes"}</dd>
            </>
          ) : null}
          {r.putRight ? (
            <>
              <dt className="text-ink-soft">Putting right</dt>
              <dd>{r.putRight}</dd>
            </>
          ) : null}
          {r.compensationOfferedPence !== null ? (
            <>
              <dt className="text-ink-soft">Compensation</dt>
              <dd>
                {formatPounds(r.compensationOfferedPence)} offered
                {r.compensationAcceptedOn ? `, accepted ${formatLongDay(`${r.compensationAcceptedOn}T12:00:00Z`)}` : ""}
                {r.compensationPaidPence !== null ? `, ${formatPounds(r.compensationPaidPence)} paid` : ""}
              </dd>
            </>
          ) : null}
        </dl>
      ) : null}
      {staff && c.staffNote ? <p className="text-sm text-ink-soft">Staff note: {c.staffNote}</p> : null}
    </div>
  );
}
