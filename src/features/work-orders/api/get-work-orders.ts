import { keepPreviousData, queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { orderQuery, weekQuery, type OrderListParams, type WeekParams } from "../lib/works-view";
import type { WorkOrderPage } from "./types";
import { workOrderKeys } from "@/lib/query-keys";

export const getWorkOrders = (query: Record<string, string | number | undefined>, signal?: AbortSignal) =>
  api.get<WorkOrderPage>("/work-orders", { query, signal });

/** The orders table: filtered, sorted and paged on the server. */
export const workOrdersQueryOptions = (params: OrderListParams) =>
  queryOptions({
    queryKey: workOrderKeys.list(params),
    queryFn: ({ signal }) => getWorkOrders(orderQuery(params), signal),
    // Keep the last page on screen while the next one loads, so the table does not jump.
    placeholderData: keepPreviousData,
  });

export function useWorkOrders(params: OrderListParams) {
  return useQuery(workOrdersQueryOptions(params));
}

/** The week board: every booked order with a slot from Monday to Friday. */
export const weekOrdersQueryOptions = (week: WeekParams) =>
  queryOptions({
    queryKey: workOrderKeys.week(week),
    queryFn: ({ signal }) => getWorkOrders(weekQuery(week), signal),
  });

export function useWeekOrders(week: WeekParams) {
  return useQuery(weekOrdersQueryOptions(week));
}
