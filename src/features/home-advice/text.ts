// Every word the advice section shows beside the server's items, in one place so it can be translated.
// Plain English for tenants (aim: reading age about 9); staff see the same list under their own heading.
import type { AdviceItemResponse } from "@/lib/contracts/home-advice";

export const adviceText = {
  tenantTitle: "Advice for your home",
  staffTitle: "Advice shown to the tenant",
  tenantIntro:
    "These are the few things most likely to help in your home, based on what we know about how it is built. They do not replace repairs: your landlord is still looking into the cause.",
  staffIntro: "Read-only: the same list the tenant sees on their case, worked out from this home's record and the report.",
  loading: "Loading the advice…",
  failed: "We could not load the advice just now. Please try again later.",
  none: "We have no extra tips for this home. Your landlord is looking into the cause.",
  listLabel: "Things that may help, most helpful first",
  summary: (n: number) =>
    n === 0 ? "A safety warning" : `${n} ${n === 1 ? "thing" : "things"} that may help, and a safety warning`,
  whyLabel: "Why this helps in your home:",
  costLabel: "Rough cost:",
  cautionsLabel: "Take care:",
  sourceLabel: "Where this comes from:",
  safetyTitle: "Stay safe",
  trades: "Gas and electrical work is only for qualified trades. Follow local rules and ask your landlord.",
  supportTitle: "Help with heating costs",
  supportPhone: "Phone:",
  supportLink: "Website:",
  // Shown when the landlord has not set their own route: no organisation or number is invented.
  supportNeutral:
    "Many people find heating hard to pay for. Tell your landlord: they may know of help with bills. A local advice service can also help you check what support you can get.",
} as const;

export const costLabels: Record<AdviceItemResponse["cost"], string> = {
  free: "Free",
  "under-20": "Under £20",
  "20-to-100": "£20 to £100",
  "landlords-job": "Nothing for you: this is your landlord's job",
};
