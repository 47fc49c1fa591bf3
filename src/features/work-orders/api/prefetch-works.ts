import type { QueryClient } from "@tanstack/react-query";
import { staffQueryOptions } from "@/lib/staff";
import { orderViewFrom, weekFrom, weekRange } from "../lib/works-view";
import { contractorsQueryOptions } from "@/lib/contractors";
import { weekOrdersQueryOptions, workOrdersQueryOptions } from "./get-work-orders";

/** Warms the cache for the Works page as the URL describes it, without waiting for it. */
export function prefetchWorks(queryClient: QueryClient, url: string | URL): void {
  const search = new URL(url).searchParams;
  void queryClient.prefetchQuery(weekOrdersQueryOptions(weekRange(weekFrom(search))));
  void queryClient.prefetchQuery(workOrdersQueryOptions(orderViewFrom(search)));
  void queryClient.prefetchQuery(staffQueryOptions());
  void queryClient.prefetchQuery(contractorsQueryOptions());
}
