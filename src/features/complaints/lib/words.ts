// What the complaint parts say. The summary, clocks and form are shared with staff pages, which never
// load the language machinery, so they take these words as a prop, English by default; the tenant's
// case page passes them in the tenant's language (../tenant-words.ts).
import type { ComplaintStatus } from "@/lib/contracts";
import { formatLongDay } from "@/lib/dates";
import { CLOCK_STATE_LABELS, COMPLAINT_STATUS_LABELS } from "./labels";

export interface ComplaintWords {
  status: (status: ComplaintStatus) => string;
  /** A day as the tenant reads it: "Tuesday 13 January 2026". */
  day: (iso: string) => string;
  madeOn: (day: string) => string;
  onBehalf: string;
  escalated: string;
  finalResponse: string;
  stage1Response: string;
  apology: string;
  yes: string;
  puttingRight: string;
  compensation: string;
  offered: (amount: string) => string;
  accepted: (day: string) => string;
  paid: (amount: string) => string;
  // The clocks
  clocksLabel: string;
  stage: (n: number) => string;
  acknowledgeBy: string;
  respondBy: string;
  notYet: string;
  clockState: (state: string) => string;
  /** "Extended by 10 working days: <reason>" (one text, as one sentence, with the reason staff gave). */
  extended: (days: number, reason: string | null) => string;
  // Making a complaint (the tenant's form)
  raiseLabel: string;
  raiseHint: string;
  raiseEmpty: string;
  raiseSubmit: string;
  // The tenant's section
  loading: string;
  intro: string;
  earlier: string;
  escalateLabel: string;
  escalateSubmit: string;
  writeThis: string;
}

export const englishComplaintWords: ComplaintWords = {
  status: (status) => COMPLAINT_STATUS_LABELS[status],
  day: (iso) => formatLongDay(iso),
  madeOn: (day) => `Made on ${day}`,
  onBehalf: " (written down by staff for the tenant)",
  escalated: "Taken to stage 2: ",
  finalResponse: "Final response",
  stage1Response: "Stage 1 response",
  apology: "Apology",
  yes: "Yes",
  puttingRight: "Putting right",
  compensation: "Compensation",
  offered: (amount) => `${amount} offered`,
  accepted: (day) => `, accepted ${day}`,
  paid: (amount) => `, ${amount} paid`,
  clocksLabel: "Complaint clocks",
  stage: (n) => `Stage ${n}`,
  acknowledgeBy: "Acknowledge by",
  respondBy: "Respond by",
  notYet: "Not yet",
  clockState: (state) => CLOCK_STATE_LABELS[state] ?? state,
  extended: (days, reason) => `Extended by ${days} working ${days === 1 ? "day" : "days"}${reason ? `: ${reason}` : "."}`,
  raiseLabel: "What are you unhappy about?",
  raiseHint: "Tell us in your own words. We will acknowledge your complaint and tell you when to expect our response.",
  raiseEmpty: "Write the complaint.",
  raiseSubmit: "Make a complaint",
  loading: "Loading your complaint…",
  intro:
    "If you are unhappy with how your report has been handled, you can make a formal complaint. You will get a letter to say it has been received and when to expect our response.",
  earlier: "Earlier complaint",
  escalateLabel: "Still unhappy? Tell us why and we will look at it again (stage 2)",
  escalateSubmit: "Take my complaint to stage 2",
  writeThis: "Write this before sending.",
};
