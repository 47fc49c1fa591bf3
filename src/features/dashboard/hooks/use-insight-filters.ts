import { useCallback, useMemo } from "react";
import { useSearchParams } from "react-router-dom";
import { filtersFrom, type InsightFilters } from "../lib/insight-filters";

/** The period and estate live in the URL, so a view of the dashboard can be shared and reloaded. */
export function useInsightFilters() {
  const [search, setSearch] = useSearchParams();
  const filters = useMemo(() => filtersFrom(search), [search]);
  const setFilters = useCallback(
    (next: Partial<InsightFilters>) =>
      setSearch(
        (prev) => {
          const params = new URLSearchParams(prev);
          for (const [key, value] of Object.entries(next)) {
            if (value) params.set(key, value);
            else params.delete(key);
          }
          return params;
        },
        { replace: true },
      ),
    [setSearch],
  );
  return { filters, setFilters };
}
