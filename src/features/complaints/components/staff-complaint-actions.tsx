import { useState } from "react";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { CollapsibleSection } from "@/components/ui/collapsible-section";
import { Input } from "@/components/ui/field";
import { errorMessage } from "@/lib/api-client";
import type { ComplaintResponse } from "@/lib/contracts";
import { useAcknowledgeComplaint } from "../api/acknowledge-complaint";
import { useCloseComplaint } from "../api/close-complaint";
import { useEscalateComplaint } from "../api/escalate-complaint";
import { useExtendComplaint } from "../api/extend-complaint";
import { useRespondComplaint } from "../api/respond-complaint";
import { RemedyForm } from "./remedy-form";
import { TextActionForm } from "./text-action-form";

/** The next moves of an open complaint, for officers: each names the version shown (a stale one is refused). */
export function StaffComplaintActions({ complaint }: { complaint: ComplaintResponse }) {
  const { caseId, id, version, status } = complaint;
  const acknowledge = useAcknowledgeComplaint(caseId, id);
  const respond = useRespondComplaint(caseId, id);
  const close = useCloseComplaint(caseId, id);
  const escalate = useEscalateComplaint(caseId, id);
  const stage = status.startsWith("stage-2") ? 2 : 1;
  const extended = complaint.stages[stage - 1]!.extensionWorkingDays !== null;

  return (
    <div className="flex flex-col gap-3">
      {status === "stage-1-received" || status === "stage-2-received" ? (
        <div className="flex flex-col gap-2">
          <div>
            <Button busy={acknowledge.isPending} onClick={() => acknowledge.mutate({ version, note: null })}>
              Acknowledge stage {stage} and send the letter
            </Button>
          </div>
          {acknowledge.isError ? (
            <Alert tone="danger" live="alert">
              {errorMessage(acknowledge.error)}
            </Alert>
          ) : null}
        </div>
      ) : null}
      {status === "stage-1-acknowledged" || status === "stage-2-acknowledged" ? (
        <>
          <CollapsibleSection
            headingLevel={3}
            id={`complaint-${id}-respond`}
            title={stage === 2 ? "Send the final response" : "Send the stage 1 response"}
          >
            <TextActionForm
              label="Our response"
              hint={
                stage === 2
                  ? "Sent with the remedy and the escalation route from your complaint policy; the complaint then closes."
                  : "Sent with the remedy; the tenant may then take it to stage 2."
              }
              submitLabel="Send the response"
              busy={respond.isPending}
              error={respond.error}
              withNote
              onSubmit={(response, note, done) => respond.mutate({ version, response, note }, { onSuccess: done })}
            />
          </CollapsibleSection>
          {extended ? null : (
            <CollapsibleSection headingLevel={3} id={`complaint-${id}-extend`} title={`Extend stage ${stage} (once)`}>
              <ExtendForm complaint={complaint} />
            </CollapsibleSection>
          )}
        </>
      ) : null}
      {status === "stage-1-responded" ? (
        <>
          <CollapsibleSection headingLevel={3} id={`complaint-${id}-escalate`} title="Take it to stage 2 for the tenant">
            <TextActionForm
              label="Why the tenant is still unhappy, in their words"
              submitLabel="Escalate to stage 2"
              busy={escalate.isPending}
              error={escalate.error}
              onSubmit={(reason, _note, done) => escalate.mutate({ version, reason }, { onSuccess: done })}
            />
          </CollapsibleSection>
          <div>
            <Button variant="secondary" busy={close.isPending} onClick={() => close.mutate({ version, note: null })}>
              Close the complaint (not escalated)
            </Button>
            {close.isError ? (
              <Alert tone="danger" live="alert" className="mt-2">
                {errorMessage(close.error)}
              </Alert>
            ) : null}
          </div>
        </>
      ) : null}
      <CollapsibleSection headingLevel={3} id={`complaint-${id}-remedy`} title="Remedy">
        <RemedyForm key={version} complaint={complaint} />
      </CollapsibleSection>
    </div>
  );
}

function ExtendForm({ complaint }: { complaint: ComplaintResponse }) {
  const extend = useExtendComplaint(complaint.caseId, complaint.id);
  const [days, setDays] = useState("");
  const max = complaint.extensionMaxWorkingDays;
  const n = Number(days);
  const daysError =
    days !== "" && !(Number.isInteger(n) && n >= 1 && n <= max) ? `Between 1 and ${max} working days.` : undefined;
  return (
    <div className="flex flex-col gap-3">
      <Input
        label="Extra working days"
        hint={`At most ${max}, from your complaint policy.`}
        inputMode="numeric"
        value={days}
        onChange={(e) => setDays(e.target.value)}
        error={daysError}
      />
      <TextActionForm
        label="The reason (the tenant is sent it)"
        submitLabel="Extend and tell the tenant"
        busy={extend.isPending}
        error={extend.error}
        withNote
        onSubmit={(reason, note, done) => {
          if (daysError || days === "") return;
          extend.mutate({ version: complaint.version, workingDays: n, reason, note }, { onSuccess: done });
        }}
      />
    </div>
  );
}
