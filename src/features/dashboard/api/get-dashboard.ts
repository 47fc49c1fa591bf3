import { keepPreviousData, queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { DashboardResponse } from "@/lib/contracts";
import { insightKeys } from "@/lib/query-keys";
import { insightQuery, type InsightFilters } from "../lib/insight-filters";

export const getDashboard = (filters: InsightFilters, signal?: AbortSignal) =>
  api.get<DashboardResponse>("/insight/dashboard", { query: insightQuery(filters), signal });

export const dashboardQueryOptions = (filters: InsightFilters) =>
  queryOptions({
    queryKey: insightKeys.dashboard(filters),
    queryFn: ({ signal }) => getDashboard(filters, signal),
    placeholderData: keepPreviousData,
  });

export const useDashboard = (filters: InsightFilters) => useQuery(dashboardQueryOptions(filters));
