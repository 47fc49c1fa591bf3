import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { ALERT_SORTS, type AlertSortKey, type HomesAtRiskResponse } from "@/lib/contracts";
import { sensorAlertKeys } from "@/lib/query-keys";

export interface AlertListState {
  sort: AlertSortKey;
  dir: "asc" | "desc";
}

/** The list's sort from the URL (so the view can be shared and reloaded); newest alerts first by default. */
export function alertListState(search: URLSearchParams): AlertListState {
  const sort = search.get("sort");
  const dir = search.get("dir");
  return {
    sort: (ALERT_SORTS as readonly string[]).includes(sort ?? "") ? (sort as AlertSortKey) : "raisedAt",
    dir: dir === "asc" ? "asc" : "desc",
  };
}

/** GET /api/sensor-alerts: homes whose sensors raised alerts and that have no open case. */
export const getAlerts = ({ sort, dir }: AlertListState, signal?: AbortSignal) =>
  api.get<HomesAtRiskResponse>("/sensor-alerts", { query: { sort, dir }, signal });

export const alertsQueryOptions = (state: AlertListState) =>
  queryOptions({ queryKey: sensorAlertKeys.list(state.sort, state.dir), queryFn: ({ signal }) => getAlerts(state, signal) });

export function useAlerts(state: AlertListState) {
  return useQuery(alertsQueryOptions(state));
}
