import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { TenancyImportSummary } from "@/lib/contracts";
import { tenancyImportKeys } from "@/lib/query-keys";

/** GET /api/tenancy-imports: the latest imports, newest first, with their invitations' progress. */
export const getTenancyImports = (signal?: AbortSignal) =>
  api.get<{ items: TenancyImportSummary[] }>("/tenancy-imports", { signal });

/** While a batch is still sending, the progress is read again every 15 seconds. */
export const tenancyImportsQueryOptions = () =>
  queryOptions({
    queryKey: tenancyImportKeys.lists(),
    queryFn: ({ signal }) => getTenancyImports(signal),
    refetchInterval: (query) => (query.state.data?.items.some((i) => i.invitations?.state === "sending") ? 15_000 : false),
  });

export function useTenancyImports() {
  return useQuery(tenancyImportsQueryOptions());
}
