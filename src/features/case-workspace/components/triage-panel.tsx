import { Panel } from "@/components/ui/card";
import { formatWeekdayDateTimeZoned } from "@/lib/dates";
import { useTriage } from "../api/get-triage";
import { triageFactorLabel } from "../lib/labels";
import { QueryState } from "./query-state";

/** The triage priority and the parts it is made of, each with its points and the reason for them. */
export function TriagePanel({ caseId }: { caseId: number }) {
  const triage = useTriage(caseId);
  return (
    <Panel title="Triage priority" id="case-triage">
      <p className="mb-3 text-ink-soft">
        This score only puts work in order. It does not decide whether a report is investigated: every report is, and the
        deadlines run whatever the score.
      </p>
      <QueryState query={triage} loading="Working out the priority…" failed="We couldn't load the triage priority">
        {(t) => (
          <div className="flex flex-col gap-3">
            <p className="text-lg">
              <span className="text-3xl font-bold tabular-nums">{t.score}</span> <span className="font-semibold">out of 100</span>
            </p>
            <div aria-hidden="true" className="h-2 w-full overflow-hidden rounded-pill bg-dew-100">
              <div className="h-full bg-dew-700" style={{ width: `${Math.max(0, Math.min(100, t.score))}%` }} />
            </div>
            <table className="w-full border-collapse text-left text-sm">
              <caption className="sr-only">How the triage priority is made up</caption>
              <thead>
                <tr className="border-b border-line-strong">
                  <th scope="col" className="py-1 pr-2">
                    Part
                  </th>
                  <th scope="col" className="py-1 pr-2 text-right whitespace-nowrap">
                    Points
                  </th>
                </tr>
              </thead>
              <tbody>
                {t.parts.map((part) => (
                  <tr key={part.factor} className="border-b border-line align-top">
                    <th scope="row" className="py-2 pr-2 font-normal">
                      <span className="block font-semibold">{triageFactorLabel(part.factor)}</span>
                      <span className="block text-ink-soft">{part.explanation}</span>
                    </th>
                    <td className="py-2 pr-2 text-right whitespace-nowrap tabular-nums">
                      {part.points} of {part.max}
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
            <p className="text-xs text-ink-soft">
              Worked out <time dateTime={t.computedAt}>{formatWeekdayDateTimeZoned(t.computedAt)}</time>.
            </p>
          </div>
        )}
      </QueryState>
    </Panel>
  );
}
