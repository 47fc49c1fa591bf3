import { useSearchParams } from "react-router-dom";
import { readPositiveInt, readString, usePatchSearchParams } from "@/lib/search-params";
import type { PropertyListFilters } from "../api/get-properties";

export const HOMES_DEFAULT_PAGE_SIZE = 25;
const defaults = { page: 1, pageSize: HOMES_DEFAULT_PAGE_SIZE };

export function homesFiltersFrom(params: URLSearchParams): PropertyListFilters {
  return {
    q: readString(params, "q"),
    estate: readString(params, "estate"),
    page: readPositiveInt(params, "page", 1),
    pageSize: readPositiveInt(params, "pageSize", HOMES_DEFAULT_PAGE_SIZE, 200),
  };
}

/** The Homes table's state lives in the URL (q, estate, page, pageSize) so a view can be shared or reloaded. */
export function useHomesTableParams() {
  const [params] = useSearchParams();
  const patch = usePatchSearchParams(defaults);
  return {
    filters: homesFiltersFrom(params),
    setSearch: (q: string) => patch({ q: q.trim(), page: 1 }, { replace: true }),
    setEstate: (estate: string) => patch({ estate, page: 1 }),
    setPage: (page: number, pageSize: number) => patch({ page, pageSize }),
  };
}
