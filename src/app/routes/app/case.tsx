import type { QueryClient } from "@tanstack/react-query";
import { lazy, Suspense } from "react";
import type { LoaderFunctionArgs } from "react-router-dom";
import { LoadingState } from "@/components/ui/spinner";
import { meQueryOptions, useUser } from "@/features/auth/api/get-me";

// One address for a case, /cases/:id, whoever opens it (the e-mails link there for both): the
// tenant's page for tenants, the case workspace for staff. Each is loaded only for its own role.
const loadTenantPage = () => import("../tenant/case");
const loadStaffPage = () => import("../staff/case");
const TenantCasePage = lazy(loadTenantPage);
const StaffCasePage = lazy(loadStaffPage);

export const clientLoader = (queryClient: QueryClient) => async (args: LoaderFunctionArgs) => {
  const user = await queryClient.ensureQueryData(meQueryOptions());
  if (!user) return null;
  // Loading the right page here means it is ready by the time the route renders.
  const page = user.role === "tenant" ? await loadTenantPage() : await loadStaffPage();
  return page.clientLoader(queryClient)(args);
};

export default function CaseRoute() {
  const user = useUser();
  return (
    <Suspense fallback={<LoadingState>Opening the case…</LoadingState>}>
      {user.role === "tenant" ? <TenantCasePage /> : <StaffCasePage />}
    </Suspense>
  );
}
