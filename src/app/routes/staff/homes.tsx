import type { QueryClient } from "@tanstack/react-query";
import type { LoaderFunctionArgs } from "react-router-dom";
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
  return (
    <>
      <title>Homes · Dewline</title>
      <PageHeader title="Homes" description="Every home your organisation looks after." />
      <Panel as="div">
        <HomesTable />
      </Panel>
    </>
  );
}
