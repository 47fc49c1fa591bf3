import { LoadingState } from "@/components/ui/spinner";
import { Alert } from "@/components/ui/alert";
import { errorMessage } from "@/lib/api-client";
import { useComplaints } from "../api/get-complaints";
import { useEscalateComplaint } from "../api/escalate-complaint";
import type { ComplaintResponse } from "@/lib/contracts";
import { isOpen } from "../lib/labels";
import type { ComplaintWords } from "../lib/words";
import { useComplaintWords } from "../tenant-words";
import { ComplaintSummary } from "./complaint-summary";
import { RaiseComplaintForm } from "./raise-complaint-form";
import { TextActionForm } from "./text-action-form";

/**
 * The tenant's side of a formal complaint about their report: make one, see when to expect the
 * acknowledgement and the response (and why, when it was extended), and take it to stage 2.
 */
export function TenantComplaintSection({ caseId }: { caseId: number }) {
  const complaints = useComplaints(caseId);
  const words = useComplaintWords();
  if (complaints.isPending) return <LoadingState>{words.loading}</LoadingState>;
  if (complaints.isError)
    return (
      <Alert tone="danger">
        <span translate="no">{errorMessage(complaints.error)}</span>
      </Alert>
    );
  const list = complaints.data.complaints;
  const open = list.find((c) => isOpen(c.status));
  return (
    <div className="flex flex-col gap-4">
      {open ? (
        <>
          <ComplaintSummary complaint={open} staff={false} words={words} />
          {open.status === "stage-1-responded" ? <Escalate complaint={open} words={words} /> : null}
        </>
      ) : (
        <>
          <p>{words.intro}</p>
          <RaiseComplaintForm caseId={caseId} staff={false} words={words} />
        </>
      )}
      {list
        .filter((c) => c !== open)
        .map((c) => (
          <details key={c.id}>
            <summary className="cursor-pointer font-semibold">{words.earlier}</summary>
            <div className="mt-2">
              <ComplaintSummary complaint={c} staff={false} words={words} />
            </div>
          </details>
        ))}
    </div>
  );
}

function Escalate({ complaint, words }: { complaint: ComplaintResponse; words: ComplaintWords }) {
  const escalate = useEscalateComplaint(complaint.caseId, complaint.id);
  return (
    <TextActionForm
      label={words.escalateLabel}
      submitLabel={words.escalateSubmit}
      missingText={words.writeThis}
      busy={escalate.isPending}
      error={escalate.error}
      onSubmit={(reason, _note, done) => escalate.mutate({ version: complaint.version, reason }, { onSuccess: done })}
    />
  );
}
