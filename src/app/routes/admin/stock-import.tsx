import type { QueryClient } from "@tanstack/react-query";
import { Panel } from "@/components/ui/card";
import { PageHeader } from "@/components/ui/page-header";
import { signedInAs } from "@/features/auth/api/require-role";
import { stockImportsQueryOptions } from "@/features/stock-import/api/get-stock-imports";
import { StockImportForm } from "@/features/stock-import/components/stock-import-form";
import { StockImportHistory } from "@/features/stock-import/components/stock-import-history";

export const clientLoader = (queryClient: QueryClient) => async () => {
  if (await signedInAs(queryClient, ["admin"])) void queryClient.prefetchQuery(stockImportsQueryOptions());
  return null;
};

export default function StockImportPage() {
  return (
    <>
      <title>Import homes · Dewline</title>
      <PageHeader
        title="Import homes"
        description="Bring in your housing stock from your asset register. The construction details feed the risk engine's surface estimates."
      />
      <Panel title="Asset register" id="register" className="max-w-reading">
        <StockImportForm />
      </Panel>
      <Panel title="Earlier imports" id="history">
        <StockImportHistory />
      </Panel>
    </>
  );
}
