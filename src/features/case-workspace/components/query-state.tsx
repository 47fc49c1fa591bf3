import type { UseQueryResult } from "@tanstack/react-query";
import type { ReactNode } from "react";
import { Alert } from "@/components/ui/alert";
import { LoadingState } from "@/components/ui/spinner";
import { errorMessage } from "@/lib/api-client";

interface QueryStateProps<T> {
  query: Pick<UseQueryResult<T>, "isPending" | "isError" | "error" | "data">;
  /** The sentence shown while loading. */
  loading: string;
  /** The title of the message when loading failed. */
  failed: string;
  children: (data: T) => ReactNode;
}

/** Every section's three states: loading (with a sentence), failed (with the server's message), or its content. */
export function QueryState<T>({ query, loading, failed, children }: QueryStateProps<T>) {
  if (query.isPending) return <LoadingState className="py-4">{loading}</LoadingState>;
  if (query.isError) {
    return (
      <Alert tone="warning" title={failed}>
        {errorMessage(query.error)}
      </Alert>
    );
  }
  return <>{children(query.data as T)}</>;
}
