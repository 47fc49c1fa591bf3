import type { ReactNode } from "react";
import { PageHeader } from "@/components/ui/page-header";
import { TextLink } from "@/components/ui/text-link";
import { Spinner } from "@/components/ui/spinner";
import { useDeadlines } from "../api/get-deadlines";
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
}

/** Reference, address and the facts an officer checks first: status, assignee, hazard class, next deadline. */
export function CaseHeader({ c, status }: CaseHeaderProps) {
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
      <dl className="mb-5 grid grid-cols-1 gap-3 rounded-lg border border-line bg-surface p-4 shadow-card sm:grid-cols-2 lg:grid-cols-4">
        <Fact term="Status">{status}</Fact>
        <Fact term="Assigned to">
          <AssigneeName id={c.assigneeId ?? null} />
        </Fact>
        <Fact term="Hazard class">{hazardClassLabel(c.hazardClass)}</Fact>
        <Fact term="Next deadline">
          <NextDeadlineText caseId={c.id} />
        </Fact>
      </dl>
    </>
  );
}

function Fact({ term, children }: { term: string; children: ReactNode }) {
  return (
    <div className="flex flex-col gap-1">
      <dt className="text-sm font-semibold text-ink-soft">{term}</dt>
      <dd className="font-semibold">{children}</dd>
    </div>
  );
}

export function staffName(staff: readonly StaffMember[] | undefined, id: number): string {
  return staff?.find((s) => s.id === id)?.name ?? `Staff member ${id}`;
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
