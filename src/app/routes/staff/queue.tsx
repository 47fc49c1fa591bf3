import { Link } from "react-router-dom";
import { buttonClasses } from "@/components/ui/button";
import { Panel } from "@/components/ui/card";
import { PageHeader } from "@/components/ui/page-header";
import { StatusBadge } from "@/features/cases/components/case-status";
import { statusLabelFor } from "@/features/cases/labels";
import { useEstates } from "@/features/properties/api/get-estates";
import { CaseQueueTable } from "@/features/queue/components/case-queue-table";

// Its cases and estates are asked for by the route's loader in src/app/router.tsx, as the navigation starts.

const renderStatus = (status: string) => <StatusBadge status={status} audience="staff" className="py-0 whitespace-nowrap" />;

export default function CaseQueuePage() {
  const estates = useEstates();
  return (
    <>
      <title>Case queue · Dewline</title>
      <PageHeader
        title="Case queue"
        description="Reports of damp and mould, most urgent first. Filters, sort and columns are kept in the link."
        className="mb-3"
        actions={
          <Link to="/log-report" className={buttonClasses("primary")}>
            Log a report
          </Link>
        }
      />
      <Panel as="div">
        <CaseQueueTable statusLabel={statusLabelFor("staff")} renderStatus={renderStatus} estates={estates.data} />
      </Panel>
    </>
  );
}
