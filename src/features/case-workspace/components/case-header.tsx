import type { ReactNode } from "react";
import { PageHeader } from "@/components/ui/page-header";
import { TextLink } from "@/components/ui/text-link";
import { Spinner } from "@/components/ui/spinner";
import { cn } from "@/lib/cn";
import { useDeadlines } from "../api/get-deadlines";
import { useTriage } from "../api/get-triage";
import { useStaff } from "@/lib/staff";
import type { StaffMember, WorkspaceCase } from "../api/types";
import { nextDeadline } from "../lib/deadline-view";
import { hazardClassLabel, stageLabel } from "../lib/labels";
import { formatWeekdayDateTimeZoned } from "@/lib/dates";

export const caseAddress = (c: Pick<WorkspaceCase, "property">): string =>
  [c.property.addressLine1, c.property.addressLine2, c.property.town, c.property.postcode].filter(Boolean).join(", ");

export const workspaceTitle = (c: Pick<WorkspaceCase, "id" | "reference">) => c.reference ?? `Case ${c.id}`;

interface CaseHeaderProps {
  c: WorkspaceCase;
  /** The status in words (the cases feature's badge, supplied by the page). */
  status: ReactNode;
  /** The worst surface state the readings show, in words (worked out by the page from the evaluation). */
  risk?: ReactNode;
}

/**
 * The case at a glance, above every tab: reference, home, and the facts an officer checks first
 * (status, priority, next deadline, assignee, risk, hazard class).
 */
export function CaseHeader({ c, status, risk }: CaseHeaderProps) {
  const address = caseAddress(c);
  return (
    <>
      <PageHeader
        title={workspaceTitle(c)}
        description={
          <span>
            <TextLink to={`/homes/${c.property.id}`}>{address || `Home ${c.property.id}`}</TextLink>
            {c.property.estate ? <span className="text-ink-soft"> · {c.property.estate}</span> : null}
          </span>
        }
        className="mb-3"
      />
      <section aria-label="Case summary" className="mb-4 rounded-lg border border-line bg-surface p-3 shadow-card sm:p-4">
        <dl className="grid grid-cols-2 gap-x-4 gap-y-3 md:grid-cols-3 xl:grid-cols-6">
          <Fact term="Status">{status}</Fact>
          <Fact term="Priority">
            <PriorityText caseId={c.id} />
          </Fact>
          <Fact term="Next deadline" className="col-span-2 md:col-span-1">
            <NextDeadlineText caseId={c.id} />
          </Fact>
          <Fact term="Assigned to">
            <AssigneeName id={c.assigneeId ?? null} />
          </Fact>
          <Fact term="Risk">{risk ?? <span className="font-normal text-ink-soft">Not known yet</span>}</Fact>
          <Fact term="Hazard class">{hazardClassLabel(c.hazardClass)}</Fact>
        </dl>
      </section>
    </>
  );
}

function Fact({ term, children, className }: { term: string; children: ReactNode; className?: string }) {
  return (
    <div className={cn("flex min-w-0 flex-col gap-0.5", className)}>
      <dt className="text-sm font-semibold text-ink-soft">{term}</dt>
      <dd className="font-semibold">{children}</dd>
    </div>
  );
}

export function staffName(staff: readonly StaffMember[] | undefined, id: number): string {
  return staff?.find((s) => s.id === id)?.name ?? `Staff member ${id}`;
}

function PriorityText({ caseId }: { caseId: number }) {
  const triage = useTriage(caseId);
  if (triage.isPending) return <Spinner size="sm" label="Loading the priority" />;
  if (triage.isError) return <span className="font-normal text-ink-soft">Couldn't work it out</span>;
  return (
    <span className="tabular-nums">
      {triage.data.score}
      <span className="font-normal text-ink-soft"> out of 100</span>
    </span>
  );
}

function AssigneeName({ id }: { id: number | null }) {
  const staff = useStaff();
  if (id === null) return <>Nobody yet</>;
  if (staff.isPending) return <Spinner size="sm" label="Loading the assignee" />;
  return <>{staffName(staff.data, id)}</>;
}

function NextDeadlineText({ caseId }: { caseId: number }) {
  const deadlines = useDeadlines(caseId);
  if (deadlines.isPending) return <Spinner size="sm" label="Loading the deadlines" />;
  if (deadlines.isError) return <span className="font-normal text-ink-soft">Couldn't load the deadlines</span>;
  const next = nextDeadline(deadlines.data);
  if (!next) return <>None running</>;
  return (
    <span className="flex flex-col">
      <span>
        {stageLabel(next.deadline.stage)}
        {next.overdue ? <span className="text-rust-700">: overdue</span> : null}
      </span>
      <span className="font-normal">
        {next.overdue ? "was due " : "due "}
        <time dateTime={next.deadline.dueAt!}>{formatWeekdayDateTimeZoned(next.deadline.dueAt)}</time>
      </span>
    </span>
  );
}
