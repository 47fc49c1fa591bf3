import { Alert } from "@/components/ui/alert";
import type { TenancyImportResult } from "@/lib/contracts";

const OUTCOME_LABELS = { created: "Added", updated: "Updated", unchanged: "No change", rejected: "Not imported" } as const;

/** The counts, a link to the full report, and the rows worth a look (rejected, changed or with a note). */
export function ImportResult({ result }: { result: TenancyImportResult }) {
  const worthALook = result.notable;
  return (
    <div className="space-y-3">
      <Alert tone={result.rejected ? "warning" : "success"} title="Import finished">
        {result.rows} rows read: {result.created} added, {result.updated} updated, {result.unchanged} unchanged, {result.rejected}{" "}
        not imported.{" "}
        {result.invitations
          ? `${result.invitations.total} invitations are queued and go out in batches.`
          : "No new invitations were needed."}{" "}
        <a href={`/api/tenancy-imports/${result.id}/report.csv`} download>
          Download the report for every row (CSV)
        </a>
      </Alert>
      {worthALook.length ? (
        <div className="overflow-x-auto">
          <table className="w-full text-left text-sm">
            <caption className="sr-only">Rows added, updated, not imported or with a note</caption>
            <thead>
              <tr className="border-b border-line">
                <th scope="col" className="py-2 pr-3">
                  Row
                </th>
                <th scope="col" className="py-2 pr-3">
                  Tenancy reference
                </th>
                <th scope="col" className="py-2 pr-3">
                  Outcome
                </th>
                <th scope="col" className="py-2">
                  Details
                </th>
              </tr>
            </thead>
            <tbody>
              {worthALook.map((r) => (
                <tr key={r.row} className="border-b border-line align-top">
                  <td className="py-2 pr-3">{r.row}</td>
                  <td className="py-2 pr-3">{r.reference}</td>
                  <td className="py-2 pr-3">{OUTCOME_LABELS[r.outcome]}</td>
                  <td className="py-2">
                    {[r.changes.length ? `Changed: ${r.changes.join(", ")}.` : "", ...r.reasons].join(" ")}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
          {result.notableTotal > worthALook.length ? (
            <p className="mt-2 text-sm text-ink-muted">
              The first {worthALook.length} of {result.notableTotal} rows worth a look are shown: the report (CSV) has every row.
            </p>
          ) : null}
        </div>
      ) : null}
    </div>
  );
}
