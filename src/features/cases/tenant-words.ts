// The tenant's case page in the tenant's language: the `case` namespace (src/locales/<lng>/case.json).
// Staff screens keep the English in labels.ts; the officers' queue imports that file, never this one,
// so its first load carries no i18next (bench:queue).
import { useTranslation } from "react-i18next";
import { i18n } from "@/lib/i18n/i18n";
import { statusLabels, type TenantStageFacts } from "./labels";

/** `t` and the language for the tenant's case page and the parts of it this feature draws. */
export const useCaseText = () => useTranslation("case", { i18n });

/** The tenant's stage in words (see tenantStage in labels.ts): the written summary told apart from "Inspected". */
export function useTenantStage(status: string, facts: TenantStageFacts = {}): { label: string; meaning?: string } {
  const { t } = useCaseText();
  const key =
    status === "investigated" && facts.summarySent ? "findings-sent" : Object.hasOwn(statusLabels, status) ? status : "unknown";
  return {
    label: t(`status.${key}.label`),
    meaning: key === "unknown" ? undefined : t(`status.${key}.meaning`),
  };
}
