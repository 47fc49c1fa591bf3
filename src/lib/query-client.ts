import { QueryClient, type QueryClientConfig } from "@tanstack/react-query";
import { ApiError } from "./api-client";

/** Client errors (4xx) are answers, not hiccups: retrying them only delays the message. */
function shouldRetry(failureCount: number, error: unknown): boolean {
  if (error instanceof ApiError && error.status >= 400 && error.status < 500) return false;
  return failureCount < 2;
}

export const queryConfig = {
  queries: {
    staleTime: 30_000,
    refetchOnWindowFocus: false,
    retry: shouldRetry,
  },
  mutations: { retry: false },
} satisfies QueryClientConfig["defaultOptions"];

export function createQueryClient(config: Omit<QueryClientConfig, "defaultOptions"> = {}): QueryClient {
  return new QueryClient({ ...config, defaultOptions: queryConfig });
}
