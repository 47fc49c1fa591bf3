import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { refreshWorks } from "./refresh-works";
import type { Verification, VerificationInput } from "./case-types";
import { caseKeys } from "@/lib/query-keys";

/** Effective closes the case; not effective sends it back to investigated with a new work order. 409 unless monitoring. */
export const recordVerification = (caseId: number, input: VerificationInput) =>
  api.post<Verification>(`/cases/${caseId}/verification`, input);

export function useRecordVerification(caseId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationKey: [...caseKeys.verification(caseId), "record"],
    mutationFn: (input: VerificationInput) => recordVerification(caseId, input),
    onSuccess: () => refreshWorks(queryClient, caseId),
  });
}
