import { useSearchParams } from "react-router-dom";
import { readPositiveInt, readString, usePatchSearchParams } from "@/lib/search-params";
import type { SensorListFilters } from "../api/sensor-keys";

const DEFAULT_PAGE_SIZE = 25;
const defaults = { page: 1, pageSize: DEFAULT_PAGE_SIZE };
const STATES = ["active", "revoked", "removed"] as const;

export function sensorsFiltersFrom(params: URLSearchParams): SensorListFilters {
  const state = readString(params, "state");
  const home = readPositiveInt(params, "home", 0);
  return {
    propertyId: home > 0 ? home : undefined,
    state: (STATES as readonly string[]).includes(state) ? (state as SensorListFilters["state"]) : "",
    page: readPositiveInt(params, "page", 1),
    pageSize: readPositiveInt(params, "pageSize", DEFAULT_PAGE_SIZE, 200),
  };
}

/** The Sensors table's state lives in the URL (home, state, page, pageSize). */
export function useSensorsTableParams() {
  const [params] = useSearchParams();
  const patch = usePatchSearchParams(defaults);
  return {
    filters: sensorsFiltersFrom(params),
    setState: (state: string) => patch({ state, page: 1 }),
    clearHome: () => patch({ home: null, page: 1 }),
    setPage: (page: number, pageSize: number) => patch({ page, pageSize }),
  };
}
