// The words of every text message, in one place (so they can be translated later). Short plain
// English for a reading age of about 9: one idea a sentence, no jargon, no staff-only words. Each
// takes only what it shows; the sender name comes first so a tenant knows who is texting.

export interface SmsTexts {
  "appointment-offered": {
    landlord: string;
    reference: string;
    workWords: string;
    slotWords: string;
    link: string;
    rescheduled: boolean;
  };
  "appointment-reminder": { landlord: string; reference: string; workWords: string; slotWords: string; link: string };
  "landlord-replied": { landlord: string; reference: string; link: string };
  "summary-sent": { landlord: string; reference: string; link: string };
}

export type SmsKind = keyof SmsTexts;

export const SMS_KINDS = [
  "appointment-offered",
  "appointment-reminder",
  "landlord-replied",
  "summary-sent",
] as const satisfies readonly SmsKind[];

/** What each kind of text is, in a few words, for the timeline. */
export const SMS_KIND_WORDS: Record<SmsKind, string> = {
  "appointment-offered": "appointment offered",
  "appointment-reminder": "appointment reminder",
  "landlord-replied": "new message",
  "summary-sent": "written summary",
};

export const smsTexts: { [K in SmsKind]: (d: SmsTexts[K]) => string } = {
  "appointment-offered": (d) =>
    `${d.landlord}: ${d.rescheduled ? "We have a new day" : "We can come"} for your damp and mould report ${d.reference}. ` +
    `${d.workWords}: ${d.slotWords}. Please say yes or ask for another day here: ${d.link}`,
  "appointment-reminder": (d) =>
    `${d.landlord}: A reminder that we are coming tomorrow, ${d.slotWords}, for report ${d.reference} (${d.workWords.toLowerCase()}). ` +
    `Need a new day? Tell us here: ${d.link}`,
  "landlord-replied": (d) =>
    `${d.landlord}: We have sent you a message about your report ${d.reference}. Read it here: ${d.link}`,
  "summary-sent": (d) =>
    `${d.landlord}: We have sent you a written summary of what we found and what we will do about report ${d.reference}. Read it here: ${d.link}`,
};

/** The text of one kind. */
export const renderSms = <K extends SmsKind>(kind: K, data: SmsTexts[K]): string => smsTexts[kind](data);
