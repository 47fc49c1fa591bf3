import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { Verification } from "./case-types";
import { caseKeys } from "@/lib/query-keys";

/** Did the fix work? Readings before and after the works, room by room, and the outcome once recorded. */
export const getVerification = (caseId: number, signal?: AbortSignal) =>
  api.get<Verification>(`/cases/${caseId}/verification`, { signal });

export const verificationQueryOptions = (caseId: number) =>
  queryOptions({
    queryKey: caseKeys.verification(caseId),
    queryFn: ({ signal }) => getVerification(caseId, signal),
  });

export function useVerification(caseId: number, options: { enabled?: boolean } = {}) {
  return useQuery({ ...verificationQueryOptions(caseId), enabled: options.enabled ?? true });
}
