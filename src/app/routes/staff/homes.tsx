import type { QueryClient } from "@tanstack/react-query";
import { Link, type LoaderFunctionArgs } from "react-router-dom";
import { buttonClasses } from "@/components/ui/button";
import { useUser } from "@/features/auth/api/get-me";
import { Panel } from "@/components/ui/card";
import { PageHeader } from "@/components/ui/page-header";
import { signedInAs } from "@/features/auth/api/require-role";
import { prefetchHomesTable } from "@/features/properties/api/prefetch-homes";
import { HomesTable } from "@/features/properties/components/homes-table";

export const clientLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    if (await signedInAs(queryClient, ["officer", "maintenance", "admin"])) prefetchHomesTable(queryClient, request.url);
    return null;
  };

export default function HomesPage() {
  const user = useUser();
  return (
    <>
      <title>Homes · Dewline</title>
      <PageHeader
        title="Homes"
        description="Every home your organisation looks after. Open one to see its tenants, cases and readings."
        actions={
          user.role === "admin" ? (
            <Link to="/homes/new" className={buttonClasses("primary")}>
              Add a home
            </Link>
          ) : null
        }
      />
      <Panel as="div">
        <HomesTable />
      </Panel>
    </>
  );
}
