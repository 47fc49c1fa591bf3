import type { QueryClient } from "@tanstack/react-query";
import { homesFiltersFrom } from "../hooks/use-homes-table-params";
import { estatesQueryOptions } from "./get-estates";
import { propertiesQueryOptions } from "./get-properties";

/** Warms the cache for the Homes table as the URL describes it, without waiting for it. */
export function prefetchHomesTable(queryClient: QueryClient, url: string | URL): void {
  const filters = homesFiltersFrom(new URL(url).searchParams);
  void queryClient.prefetchQuery(propertiesQueryOptions(filters));
  void queryClient.prefetchQuery(estatesQueryOptions());
}
