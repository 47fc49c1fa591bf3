import type { QueryClient } from "@tanstack/react-query";
import type { LoaderFunctionArgs } from "react-router-dom";
import { Panel } from "@/components/ui/card";
import { EmptyState } from "@/components/ui/empty-state";
import { PageHeader } from "@/components/ui/page-header";
import { signedInAs } from "@/features/auth/api/require-role";
import { prefetchHomesTable } from "@/features/properties/api/prefetch-homes";
import { HomesTable } from "@/features/properties/components/homes-table";

export const clientLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    if (await signedInAs(queryClient, ["officer"])) prefetchHomesTable(queryClient, request.url);
    return null;
  };

export default function CaseQueuePage() {
  return (
    <>
      <title>Case queue · Dewline</title>
      <PageHeader title="Case queue" description="Reports from tenants, waiting for you to look at them." />
      <div className="flex flex-col gap-5">
        <Panel title="Cases" id="cases">
          <EmptyState title="Cases will appear here">
            When tenants report damp, condensation or mould, their reports will be listed here for you to review and act on.
          </EmptyState>
        </Panel>
        <Panel title="Homes" id="homes">
          <HomesTable />
        </Panel>
      </div>
    </>
  );
}
