import type { ComponentType } from "react";
import { EmptyState } from "@/components/ui/empty-state";
import { TextLink } from "@/components/ui/text-link";
import { formatDate } from "@/lib/dates";
import { useRelatedCases } from "../api/get-related";
import { hazardClassLabel } from "../lib/labels";
import { QueryState } from "./query-state";

interface RelatedCasesProps {
  caseId: number;
  /** The status badge, supplied by the page. */
  Status: ComponentType<{ status: string }>;
}

/** Other cases at the same home, newest first, each a link to its own workspace. */
export function RelatedCases({ caseId, Status }: RelatedCasesProps) {
  const related = useRelatedCases(caseId);
  return (
    <QueryState
      query={related}
      loading="Looking for other cases at this home…"
      failed="We couldn't load other cases at this home"
    >
      {(cases) =>
        cases.length === 0 ? (
          <EmptyState title="No other cases at this home" />
        ) : (
          <ul className="flex flex-col divide-y divide-line">
            {cases.map((r) => (
              <li key={r.id} className="flex flex-col gap-1 py-2">
                <div className="flex flex-wrap items-center justify-between gap-2">
                  <TextLink to={`/cases/${r.id}`}>{r.reference ?? `Case ${r.id}`}</TextLink>
                  <Status status={r.status} />
                </div>
                <p className="text-sm text-ink-soft">
                  Reported {formatDate(r.awareAt)} · {hazardClassLabel(r.hazardClass)}
                </p>
                {r.description ? <p className="line-clamp-2 text-sm">{r.description}</p> : null}
              </li>
            ))}
          </ul>
        )
      }
    </QueryState>
  );
}
