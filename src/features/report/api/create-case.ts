import { useMutation } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { CaseReport, StaffCaseReport } from "@/lib/schemas/case-report";
import { reportKeys } from "@/lib/query-keys";
import type { CreatedCase } from "./types";

/** `idempotencyKey`: a report kept on the phone goes with the key it was first given (see lib/report-queue). */
export const createCase = (report: CaseReport, idempotencyKey?: string) =>
  api.post<CreatedCase>("/cases", report, { idempotencyKey });

/** Staff log a report taken by phone, letter, e-mail or a visit (the same POST, with the channel and date). */
export const createStaffCase = (report: StaffCaseReport) => api.post<CreatedCase>("/cases", report);

export function useCreateCase() {
  return useMutation({ mutationKey: reportKeys.create(), mutationFn: (report: CaseReport) => createCase(report) });
}
