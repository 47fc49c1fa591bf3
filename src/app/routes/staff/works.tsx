import type { QueryClient } from "@tanstack/react-query";
import type { LoaderFunctionArgs } from "react-router-dom";
import { Panel } from "@/components/ui/card";
import { PageHeader } from "@/components/ui/page-header";
import { signedInAs } from "@/features/auth/api/require-role";
import { prefetchWorks } from "@/features/work-orders/api/prefetch-works";
import { ContractorsPanel } from "@/features/work-orders/components/contractors-panel";
import { WeekBoard } from "@/features/work-orders/components/week-board";
import { WorkOrdersTable } from "@/features/work-orders/components/work-orders-table";

export const clientLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    if (await signedInAs(queryClient, ["maintenance", "admin"])) prefetchWorks(queryClient, request.url);
    return null;
  };

export default function WorksPage() {
  return (
    <>
      <title>Works · Dewline</title>
      <PageHeader
        title="Works"
        description="Book repairs into your team's week, follow the tenants' answers, and keep the orders moving. The week and the table's view are in the link."
      />
      <div className="flex flex-col gap-5">
        <Panel title="Week board" id="week-board">
          <WeekBoard />
        </Panel>
        <Panel title="Orders to schedule and booked" id="work-orders">
          <WorkOrdersTable />
        </Panel>
        <Panel title="Contractors" id="contractors">
          <ContractorsPanel />
        </Panel>
      </div>
    </>
  );
}
