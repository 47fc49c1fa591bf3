import type { QueryClient } from "@tanstack/react-query";
import { Link, type LoaderFunctionArgs } from "react-router-dom";
import { buttonClasses } from "@/components/ui/button";
import { Panel } from "@/components/ui/card";
import { PageHeader } from "@/components/ui/page-header";
import { signedInAs } from "@/features/auth/api/require-role";
import { StatusBadge } from "@/features/cases/components/case-status";
import { statusLabelFor } from "@/features/cases/labels";
import { estatesQueryOptions, useEstates } from "@/features/properties/api/get-estates";
import { prefetchCaseQueue } from "@/features/queue/api/prefetch-queue";
import { CaseQueueTable } from "@/features/queue/components/case-queue-table";

export const clientLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    if (await signedInAs(queryClient, ["officer", "admin"])) {
      prefetchCaseQueue(queryClient, request.url);
      void queryClient.prefetchQuery(estatesQueryOptions());
    }
    return null;
  };

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
