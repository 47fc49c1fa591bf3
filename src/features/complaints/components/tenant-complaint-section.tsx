import { LoadingState } from "@/components/ui/spinner";
import { Alert } from "@/components/ui/alert";
import { errorMessage } from "@/lib/api-client";
import { useComplaints } from "../api/get-complaints";
import { useEscalateComplaint } from "../api/escalate-complaint";
import type { ComplaintResponse } from "@/lib/contracts";
import { isOpen } from "../lib/labels";
import { ComplaintSummary } from "./complaint-summary";
import { RaiseComplaintForm } from "./raise-complaint-form";
import { TextActionForm } from "./text-action-form";

/**
 * The tenant's side of a formal complaint about their report: make one, see when to expect the
 * acknowledgement and the response (and why, when it was extended), and take it to stage 2.
 */
export function TenantComplaintSection({ caseId }: { caseId: number }) {
  const complaints = useComplaints(caseId);
  if (complaints.isPending) return <LoadingState>Loading your complaint…</LoadingState>;
  if (complaints.isError) return <Alert tone="danger">{errorMessage(complaints.error)}</Alert>;
  const list = complaints.data.complaints;
  const open = list.find((c) => isOpen(c.status));
  return (
    <div className="flex flex-col gap-4">
      {open ? (
        <>
          <ComplaintSummary complaint={open} staff={false} />
          {open.status === "stage-1-responded" ? <Escalate complaint={open} /> : null}
        </>
      ) : (
        <>
          <p>
            If you are unhappy with how your report has been handled, you can make a formal complaint. You will get a letter to
            say it has been received and when to expect our response.
          </p>
          <RaiseComplaintForm caseId={caseId} staff={false} />
        </>
      )}
      {list
        .filter((c) => c !== open)
        .map((c) => (
          <details key={c.id}>
            <summary className="cursor-pointer font-semibold">Earlier complaint</summary>
            <div className="mt-2">
              <ComplaintSummary complaint={c} staff={false} />
            </div>
          </details>
        ))}
    </div>
  );
}

function Escalate({ complaint }: { complaint: ComplaintResponse }) {
  const escalate = useEscalateComplaint(complaint.caseId, complaint.id);
  return (
    <TextActionForm
      label="Still unhappy? Tell us why and we will look at it again (stage 2)"
      submitLabel="Take my complaint to stage 2"
      busy={escalate.isPending}
      error={escalate.error}
      onSubmit={(reason, _note, done) => escalate.mutate({ version: complaint.version, reason }, { onSuccess: done })}
    />
  );
}
