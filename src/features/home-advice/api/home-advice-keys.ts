import { caseKeys } from "@/lib/query-keys";

/** Under the case's own key, so anything that refreshes a case refreshes its advice too. */
export const homeAdviceKeys = {
  forCase: (caseId: number) => [...caseKeys.detail(caseId), "advice"] as const,
};
