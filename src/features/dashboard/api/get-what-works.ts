import { keepPreviousData, queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { WhatWorksResponse } from "@/lib/contracts";
import { insightKeys } from "@/lib/query-keys";
import { insightQuery, type InsightFilters } from "../lib/insight-filters";

export const getWhatWorks = (filters: InsightFilters, signal?: AbortSignal) =>
  api.get<WhatWorksResponse>("/insight/what-works", { query: insightQuery(filters), signal });

export const whatWorksQueryOptions = (filters: InsightFilters) =>
  queryOptions({
    queryKey: insightKeys.whatWorks(filters),
    queryFn: ({ signal }) => getWhatWorks(filters, signal),
    placeholderData: keepPreviousData,
  });

export const useWhatWorks = (filters: InsightFilters) => useQuery(whatWorksQueryOptions(filters));
