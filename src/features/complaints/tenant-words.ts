// The complaint parts' words in the tenant's language, for the tenant's case page only (the `case`
// namespace, "complaint"). Staff pages never import this file, so they never load i18next.
import { useMemo } from "react";
import { useTranslation } from "react-i18next";
import { formatDateIn } from "@/lib/dates";
import { i18n } from "@/lib/i18n/i18n";
import type { ComplaintWords } from "./lib/words";

export function useComplaintWords(): ComplaintWords {
  const { t, i18n: active } = useTranslation("case", { i18n });
  const lng = active.language;
  return useMemo(() => {
    const c = (key: string, values?: Record<string, unknown>) => t(`complaint.${key}`, values);
    return {
      status: (status) => c(`status.${status}`),
      // Through `t` too, so the pseudo-locale marks the day as handled.
      day: (iso) => t("landlordMessages.at", { when: formatDateIn(lng, iso, "longDay") }),
      madeOn: (day) => c("madeOn", { day }),
      onBehalf: ` ${c("onBehalf")}`,
      escalated: `${c("escalated")} `,
      finalResponse: c("finalResponse"),
      stage1Response: c("stage1Response"),
      apology: c("apology"),
      yes: c("yes"),
      puttingRight: c("puttingRight"),
      compensation: c("compensation"),
      offered: (amount) => c("offered", { amount }),
      accepted: (day) => `, ${c("accepted", { day })}`,
      paid: (amount) => `, ${c("paid", { amount })}`,
      clocksLabel: c("clocksLabel"),
      stage: (n) => c("stage", { n }),
      acknowledgeBy: c("acknowledgeBy"),
      respondBy: c("respondBy"),
      notYet: c("notYet"),
      clockState: (state) => c(`clock.${state}`, { defaultValue: state }),
      extended: (days, reason) => c("extended", { days, hasReason: reason ? "yes" : "no", reason: reason ?? "" }),
      raiseLabel: c("raiseLabel"),
      raiseHint: c("raiseHint"),
      raiseEmpty: c("raiseEmpty"),
      raiseSubmit: c("raiseSubmit"),
      loading: c("loading"),
      intro: c("intro"),
      earlier: c("earlier"),
      escalateLabel: c("escalateLabel"),
      escalateSubmit: c("escalateSubmit"),
      writeThis: c("writeThis"),
    };
  }, [t, lng]);
}
