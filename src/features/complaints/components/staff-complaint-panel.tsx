import { Panel } from "@/components/ui/card";
import { LoadingState } from "@/components/ui/spinner";
import { Alert } from "@/components/ui/alert";
import { errorMessage } from "@/lib/api-client";
import { useComplaints } from "../api/get-complaints";
import { isOpen } from "../lib/labels";
import { ComplaintSummary } from "./complaint-summary";
import { RaiseComplaintForm } from "./raise-complaint-form";
import { StaffComplaintActions } from "./staff-complaint-actions";

/**
 * The case's formal complaint, beside the repair deadlines: the open one with its clocks and next
 * moves (officers and admins), earlier ones below; a new one can be written down for the tenant.
 */
export function StaffComplaintPanel({ caseId, canAct }: { caseId: number; canAct: boolean }) {
  const complaints = useComplaints(caseId);
  return (
    <Panel title="Complaint" id="case-complaint">
      {complaints.isPending ? (
        <LoadingState>Loading complaints…</LoadingState>
      ) : complaints.isError ? (
        <Alert tone="danger">{errorMessage(complaints.error)}</Alert>
      ) : (
        (() => {
          const list = complaints.data.complaints;
          const open = list.find((c) => isOpen(c.status));
          const earlier = list.filter((c) => c !== open);
          return (
            <div className="flex flex-col gap-4">
              {open ? (
                <>
                  <ComplaintSummary complaint={open} staff />
                  {canAct ? <StaffComplaintActions complaint={open} /> : null}
                </>
              ) : canAct ? (
                <>
                  <p className="text-ink-soft">No open complaint about this case.</p>
                  <RaiseComplaintForm caseId={caseId} staff />
                </>
              ) : (
                <p className="text-ink-soft">No open complaint about this case.</p>
              )}
              {earlier.length ? (
                <details>
                  <summary className="cursor-pointer font-semibold">Earlier complaints ({earlier.length})</summary>
                  <div className="mt-2 flex flex-col gap-4 divide-y divide-line">
                    {earlier.map((c) => (
                      <ComplaintSummary key={c.id} complaint={c} staff />
                    ))}
                  </div>
                </details>
              ) : null}
            </div>
          );
        })()
      )}
    </Panel>
  );
}
