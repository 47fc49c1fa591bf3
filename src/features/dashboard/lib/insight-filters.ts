import type { QueryValue } from "@/lib/api-client";

/** The dashboard's filters as the URL holds them (?from=&to=&estate=); empty: the server's default, the last 12 months. */
export interface InsightFilters {
  from: string;
  to: string;
  estate: string;
}

const DATE = /^\d{4}-\d{2}-\d{2}$/;

export function filtersFrom(search: URLSearchParams): InsightFilters {
  const date = (key: string) => {
    const v = search.get(key) ?? "";
    return DATE.test(v) ? v : "";
  };
  return { from: date("from"), to: date("to"), estate: (search.get("estate") ?? "").trim() };
}

export const insightQuery = (f: InsightFilters): Record<string, QueryValue> => ({ from: f.from, to: f.to, estate: f.estate });
