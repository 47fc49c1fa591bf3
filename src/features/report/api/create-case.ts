import { useMutation } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { CaseReport, StaffCaseReport } from "@/lib/schemas/case-report";
import { reportKeys } from "@/lib/query-keys";
import type { CreatedCase } from "./types";

export const createCase = (report: CaseReport) => api.post<CreatedCase>("/cases", report);

/** Staff log a report taken by phone, letter, e-mail or a visit (the same POST, with the channel and date). */
export const createStaffCase = (report: StaffCaseReport) => api.post<CreatedCase>("/cases", report);

export function useCreateCase() {
  return useMutation({ mutationKey: reportKeys.create(), mutationFn: createCase });
}
