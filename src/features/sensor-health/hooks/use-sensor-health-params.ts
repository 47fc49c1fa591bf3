import { useSearchParams } from "react-router-dom";
import { SENSOR_PROBLEMS, type SensorProblemName } from "@/lib/contracts";
import { readPositiveInt, readString, usePatchSearchParams } from "@/lib/search-params";
import type { SensorAttentionFilters } from "../api/get-sensors-needing-attention";

export const SENSOR_HEALTH_DEFAULT_PAGE_SIZE = 50;
const defaults = { page: 1, pageSize: SENSOR_HEALTH_DEFAULT_PAGE_SIZE };
const isProblem = (v: string): v is SensorProblemName => (SENSOR_PROBLEMS as readonly string[]).includes(v);

/** The list's state in the URL (?problem=&page=&pageSize=), so a view can be shared and reloaded. */
export function useSensorHealthParams() {
  const [params] = useSearchParams();
  const patch = usePatchSearchParams(defaults);
  const problem = readString(params, "problem");
  const filters: SensorAttentionFilters = {
    problem: isProblem(problem) ? problem : "",
    page: readPositiveInt(params, "page", 1),
    pageSize: readPositiveInt(params, "pageSize", SENSOR_HEALTH_DEFAULT_PAGE_SIZE, 200),
  };
  return {
    filters,
    setProblem: (p: string) => patch({ problem: p, page: 1 }),
    setPage: (page: number, pageSize: number) => patch({ page, pageSize }),
  };
}
