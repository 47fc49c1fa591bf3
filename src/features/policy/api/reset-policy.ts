import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { policyKeys } from "@/lib/query-keys";
import type { PolicyView } from "./types";

/** Removes the landlord's own timeframes: the England default applies again. */
export const resetPolicy = () => api.delete<PolicyView>("/policy");

export function useResetPolicy() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: resetPolicy,
    onSuccess: (policy) => queryClient.setQueryData(policyKeys.current(), policy),
  });
}
