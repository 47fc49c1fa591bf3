import type { QueryClient } from "@tanstack/react-query";
import type { LoaderFunctionArgs } from "react-router-dom";
import { PageHeader } from "@/components/ui/page-header";
import { useUser } from "@/features/auth/api/get-me";
import { signedInAs } from "@/features/auth/api/require-role";
import { dashboardQueryOptions } from "@/features/dashboard/api/get-dashboard";
import { BoardReportPanel } from "@/features/board-report/components/board-report-panel";
import { DashboardView } from "@/features/dashboard/components/dashboard-view";
import { filtersFrom } from "@/features/dashboard/lib/insight-filters";

export const clientLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    if (await signedInAs(queryClient, ["officer", "maintenance", "admin"]))
      void queryClient.prefetchQuery(dashboardQueryOptions(filtersFrom(new URL(request.url).searchParams)));
    return null;
  };

export default function DashboardPage() {
  const user = useUser();
  return (
    <>
      <title>Dashboard · Dewline</title>
      <PageHeader
        title="Dashboard"
        description="How the landlord is doing on its deadlines, where damp and mould cluster, who is carrying the work, and which fixes work."
      />
      <DashboardView />
      <div className="mt-6">
        <BoardReportPanel isAdmin={user.role === "admin"} />
      </div>
    </>
  );
}
