import { useId, useRef, useState, type FormEvent } from "react";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Panel } from "@/components/ui/card";
import { Textarea } from "@/components/ui/field";
import { ApiError, errorMessage } from "@/lib/api-client";
import { useVerification } from "../api/get-verification";
import { useCaseWorkOrders } from "../api/get-case-work-orders";
import { useRespondToBooking } from "../api/respond-to-booking";
import type { WorkOrder } from "../api/case-types";
import { slotForTenant, touchesServices, workTypeForTenant } from "../lib/words";
import { formatLongDay } from "@/lib/dates";

interface TenantRepairsProps {
  caseId: number;
  caseStatus: string;
  /** Where the tenant adds readings on the page. */
  readingsHref: string;
}

const sentence = (s: string) => s.charAt(0).toUpperCase() + s.slice(1);

/** The repairs for the tenant's report, in plain words: what, where, when, and their answer to the appointment. */
export function TenantRepairs({ caseId, caseStatus, readingsHref }: TenantRepairsProps) {
  const orders = useCaseWorkOrders(caseId);
  const monitoring = caseStatus === "monitoring";
  const verification = useVerification(caseId, { enabled: monitoring });
  if (orders.isPending) return null;
  if (orders.isError) {
    // No repairs (or none the tenant can see) is not a problem to report.
    if (orders.error instanceof ApiError && orders.error.status === 404) return null;
    return (
      <Panel title="Repairs" id="case-repairs">
        <Alert tone="warning" title="We couldn't load the repairs just now">
          {errorMessage(orders.error)}
        </Alert>
      </Panel>
    );
  }
  if (orders.data.length === 0) return null;
  const endsAt = verification.data?.monitoringEndsAt ?? null;

  return (
    <Panel title="Repairs" id="case-repairs">
      <div className="flex flex-col gap-4">
        {monitoring ? (
          <Alert
            tone="info"
            title={
              endsAt ? `We are checking the repair worked until ${formatLongDay(endsAt)}` : "We are checking the repair worked"
            }
            live="none"
          >
            <p>
              Please <a href={readingsHref}>add readings</a> (with “Add readings” above) while we check, and tell us if mould
              comes back (with “It's got worse”).
            </p>
          </Alert>
        ) : null}
        <ul className="flex flex-col gap-4">
          {orders.data.map((o) => (
            <RepairItem key={o.id} order={o} />
          ))}
        </ul>
      </div>
    </Panel>
  );
}

function RepairItem({ order: o }: { order: WorkOrder }) {
  const headingId = useId();
  const upcoming = o.slot !== null && (o.status === "scheduled" || o.status === "confirmed" || o.status === "change-requested");
  return (
    <li aria-labelledby={headingId} className="flex flex-col gap-2 rounded-md border border-line bg-paper p-3 sm:p-4">
      <h3 id={headingId} className="text-lg font-bold">
        {sentence(workTypeForTenant(o.type))}
      </h3>
      {o.rooms.length ? <p>Where: {o.rooms.map((r) => r.name).join(", ")}</p> : null}
      {o.status === "unscheduled" ? <p>We will offer you an appointment soon.</p> : null}
      {o.status === "cancelled" ? (
        <p>This repair is no longer planned. Your landlord will tell you if anything else is needed.</p>
      ) : null}
      {o.status === "done" && o.completion ? (
        <div>
          <p className="font-semibold">Done on {formatLongDay(o.completion.at)}</p>
          <p className="whitespace-pre-line">{o.completion.note}</p>
        </div>
      ) : null}
      {upcoming ? <Appointment order={o} /> : null}
      {upcoming ? <VisitNotes order={o} /> : null}
    </li>
  );
}

function Appointment({ order: o }: { order: WorkOrder }) {
  const respond = useRespondToBooking(o.caseId, o.id);
  const [asking, setAsking] = useState(false);
  const [reason, setReason] = useState("");
  const [error, setError] = useState<string | undefined>();
  const reasonRef = useRef<HTMLTextAreaElement>(null);
  const slot = slotForTenant(o.slot!);
  const who = o.assignee?.name ?? o.contractor?.name ?? null;
  const answer = o.booking?.response ?? null;

  const askAnother = (e: FormEvent) => {
    e.preventDefault();
    const trimmed = reason.trim();
    if (trimmed.length < 3) {
      setError("Tell us which days or times suit you better.");
      return reasonRef.current?.focus();
    }
    respond.mutate({ response: "another-slot", reason: trimmed }, { onSuccess: () => setAsking(false) });
  };

  const askForm = (
    <form onSubmit={askAnother} noValidate className="flex flex-col gap-3">
      <Textarea
        ref={reasonRef}
        label="Which days and times suit you better?"
        hint="For example: any weekday afternoon, or not on Mondays."
        rows={2}
        maxLength={2000}
        value={reason}
        error={error}
        onChange={(e) => {
          setReason(e.target.value);
          setError(undefined);
          respond.reset();
        }}
      />
      <div className="flex flex-wrap gap-2">
        <Button type="submit" busy={respond.isPending}>
          Send
        </Button>
        <Button variant="ghost" onClick={() => setAsking(false)} disabled={respond.isPending}>
          Back
        </Button>
      </div>
    </form>
  );

  const failure = respond.isError ? (
    <Alert tone="danger" title="Your answer was not sent">
      {errorMessage(respond.error)}
    </Alert>
  ) : null;

  if (answer === "change-requested") {
    return (
      <Alert tone="info" title="You asked for another time" live="none">
        {o.booking?.reason ? <p>You said: “{o.booking.reason}”</p> : null}
        <p>Your landlord has been told and will offer you a new appointment.</p>
      </Alert>
    );
  }

  if (answer === "confirmed") {
    return (
      <div className="flex flex-col gap-2">
        <Alert tone="success" title="You confirmed this appointment" live="none">
          <p>
            {sentence(slot)}
            {who ? `. ${who} will come.` : "."}
          </p>
          <p>Your landlord has been told.</p>
        </Alert>
        {asking ? (
          askForm
        ) : (
          <div>
            <Button variant="secondary" size="sm" onClick={() => setAsking(true)}>
              This time no longer suits me
            </Button>
          </div>
        )}
        {failure}
      </div>
    );
  }

  return (
    <div className="flex flex-col gap-3">
      <p className="font-semibold">We would like to come on {slot}.</p>
      {who ? <p>{who} will come.</p> : null}
      {asking ? (
        askForm
      ) : (
        <div className="flex flex-wrap gap-2">
          <Button busy={respond.isPending} onClick={() => respond.mutate({ response: "confirm" })}>
            Confirm this appointment
          </Button>
          <Button variant="secondary" onClick={() => setAsking(true)} disabled={respond.isPending}>
            Ask for another time
          </Button>
        </div>
      )}
      {failure}
    </div>
  );
}

/** The usual notes for a visit: short, practical, and never blaming. */
function VisitNotes({ order: o }: { order: WorkOrder }) {
  return (
    <div className="text-sm">
      <p className="font-semibold">For the visit</p>
      <ul className="mt-1 list-disc space-y-1 pl-5">
        <li>Whoever comes will show you their ID. You can ask to see it before you let them in.</li>
        <li>Please keep children and pets away from the work area while the work is going on.</li>
        {touchesServices(o.type) ? (
          <li>The electricity or heating may be switched off for a short time while they work.</li>
        ) : null}
        {o.type === "mould-wash" ? <li>The room may need a window open for a while after the treatment.</li> : null}
      </ul>
    </div>
  );
}
