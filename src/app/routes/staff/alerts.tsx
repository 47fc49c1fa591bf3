import type { QueryClient } from "@tanstack/react-query";
import type { LoaderFunctionArgs } from "react-router-dom";
import { Panel } from "@/components/ui/card";
import { PageHeader } from "@/components/ui/page-header";
import { signedInAs } from "@/features/auth/api/require-role";
import { alertListState, alertsQueryOptions } from "@/features/alerts/api/get-alerts";
import { AlertsTable } from "@/features/alerts/components/alerts-table";

export const clientLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    if (await signedInAs(queryClient, ["officer", "admin"]))
      void queryClient.prefetchQuery(alertsQueryOptions(alertListState(new URL(request.url).searchParams)));
    return null;
  };

export default function AlertsPage() {
  return (
    <>
      <title>Alerts · Dewline</title>
      <PageHeader
        title="Alerts"
        description="Homes whose sensors show conditions in which damp and mould can start, and that have no open case. Open a case to look into it before anyone has to report it."
      />
      <Panel as="div">
        <AlertsTable />
      </Panel>
    </>
  );
}
