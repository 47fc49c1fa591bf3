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
    if (await signedInAs(queryClient, ["maintenance"])) prefetchHomesTable(queryClient, request.url);
    return null;
  };

export default function WorksPage() {
  return (
    <>
      <title>Works · Dewline</title>
      <PageHeader title="Works" description="Repairs to plan, carry out and check." />
      <div className="flex flex-col gap-5">
        <Panel title="Works orders" id="works-orders">
          <EmptyState title="Works orders will appear here">
            Once a housing officer asks for work on a home, the order will be listed here to schedule, and then to check it fixed
            the problem.
          </EmptyState>
        </Panel>
        <Panel title="Homes" id="homes">
          <HomesTable />
        </Panel>
      </div>
    </>
  );
}
