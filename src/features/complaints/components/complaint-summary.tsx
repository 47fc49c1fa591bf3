import type { ComplaintResponse } from "@/lib/contracts";
import { formatPounds } from "../lib/labels";
import { englishComplaintWords, type ComplaintWords } from "../lib/words";
import { ComplaintClocks } from "./complaint-clocks";

/** One complaint: where it stands, the tenant's words, the clocks, the responses and the remedy. */
export function ComplaintSummary({
  complaint: c,
  staff,
  words = englishComplaintWords,
}: {
  complaint: ComplaintResponse;
  staff: boolean;
  /** The tenant's page passes them in the tenant's language (staff pages load no i18next). */
  words?: ComplaintWords;
}) {
  const r = c.remedy;
  return (
    <div className="flex flex-col gap-2">
      <p className="font-semibold">{words.status(c.status)}</p>
      <p className="text-sm text-ink-soft">
        {words.madeOn(words.day(c.raisedAt))}
        {c.onBehalf ? words.onBehalf : ""}
      </p>
      <blockquote translate="no" className="border-l-4 border-line-strong pl-3 whitespace-pre-wrap">
        {c.description}
      </blockquote>
      {c.escalationReason ? (
        <p className="text-sm">
          <span className="font-semibold">{words.escalated}</span>
          <span translate="no">{c.escalationReason}</span>
        </p>
      ) : null}
      <ComplaintClocks complaint={c} staff={staff} words={words} />
      {c.stages.map((s) =>
        s.response ? (
          <div key={s.stage} className="text-sm">
            <p className="font-semibold">{s.stage === 2 ? words.finalResponse : words.stage1Response}</p>
            <p translate="no" className="whitespace-pre-wrap">
              {s.response}
            </p>
          </div>
        ) : null,
      )}
      {r.apology || r.putRight || r.compensationOfferedPence !== null ? (
        <dl className="grid grid-cols-[auto_1fr] gap-x-3 text-sm">
          {r.apology ? (
            <>
              <dt className="text-ink-soft">{words.apology}</dt>
              <dd>{r.apologyText ? <span translate="no">{r.apologyText}</span> : words.yes}</dd>
            </>
          ) : null}
          {r.putRight ? (
            <>
              <dt className="text-ink-soft">{words.puttingRight}</dt>
              <dd translate="no">{r.putRight}</dd>
            </>
          ) : null}
          {r.compensationOfferedPence !== null ? (
            <>
              <dt className="text-ink-soft">{words.compensation}</dt>
              <dd>
                {words.offered(formatPounds(r.compensationOfferedPence))}
                {r.compensationAcceptedOn ? words.accepted(words.day(`${r.compensationAcceptedOn}T12:00:00Z`)) : ""}
                {r.compensationPaidPence !== null ? words.paid(formatPounds(r.compensationPaidPence)) : ""}
              </dd>
            </>
          ) : null}
        </dl>
      ) : null}
      {staff && c.staffNote ? <p className="text-sm text-ink-soft">Staff note: {c.staffNote}</p> : null}
    </div>
  );
}
