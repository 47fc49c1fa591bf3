import { MutationCache, QueryCache, QueryClientProvider, type QueryClient } from "@tanstack/react-query";
import { useState, type ReactNode } from "react";
import { authKeys } from "@/lib/query-keys";
import { ApiError } from "@/lib/api-client";
import { createQueryClient } from "@/lib/query-client";

/**
 * The app's query client. A 401 from any request means the session ended (it expired, or the
 * account was disabled): mark the user signed out, and the guards send them to sign in.
 */
export function createAppQueryClient(): QueryClient {
  const onError = (error: unknown, key?: readonly unknown[]) => {
    if (error instanceof ApiError && error.status === 401 && key?.[0] !== authKeys.all[0]) {
      client.setQueryData(authKeys.me(), null);
    }
  };
  const client = createQueryClient({
    queryCache: new QueryCache({ onError: (error, query) => onError(error, query.queryKey) }),
    mutationCache: new MutationCache({
      // A failed sign-in is a 401 as well, but it is an answer to show, not an expired session.
      onError: (error, _vars, _ctx, mutation) => onError(error, mutation.options.mutationKey ?? ["mutation"]),
    }),
  });
  return client;
}

export function AppProvider({ queryClient, children }: { queryClient?: QueryClient; children: ReactNode }) {
  const [client] = useState(() => queryClient ?? createAppQueryClient());
  return <QueryClientProvider client={client}>{children}</QueryClientProvider>;
}
