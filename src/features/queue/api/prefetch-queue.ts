import type { QueryClient } from "@tanstack/react-query";
import { queueViewFrom } from "../lib/queue-view";
import { caseQueueQueryOptions } from "./get-case-queue";
import { staffQueryOptions } from "@/lib/staff";

/** Warms the cache for the queue as the URL describes it, without waiting for it. */
export function prefetchCaseQueue(queryClient: QueryClient, url: string | URL): void {
  const { params } = queueViewFrom(new URL(url).searchParams);
  void queryClient.prefetchQuery(caseQueueQueryOptions(params));
  void queryClient.prefetchQuery(staffQueryOptions());
}
