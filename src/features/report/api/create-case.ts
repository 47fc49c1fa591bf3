import { useMutation } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { CaseReport } from "@/lib/schemas/case-report";
import { reportKeys } from "@/lib/query-keys";
import type { CreatedCase } from "./types";

export const createCase = (report: CaseReport) => api.post<CreatedCase>("/cases", report);

export function useCreateCase() {
  return useMutation({ mutationKey: reportKeys.create(), mutationFn: createCase });
}
