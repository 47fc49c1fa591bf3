// The words of every text message, in one place: short plain words for a reading age of about 9, one
// idea a sentence, no jargon, no staff-only words, in the tenant's language (server/locales/<lng>/sms.ts,
// English and Welsh). Each takes only what it shows; the sender name comes first so a tenant knows who
// is texting.
import { translator, type MessageLanguage, type Translate } from "../../lib/i18n.js";
import { slotWords, workWords, type Slot } from "../mail/mail-templates.js";

export interface SmsTexts {
  "appointment-offered": {
    landlord: string;
    reference: string;
    /** The work order's type, worded in the tenant's language. */
    workType: string;
    slot: Slot;
    link: string;
    rescheduled: boolean;
  };
  "appointment-reminder": { landlord: string; reference: string; workType: string; slot: Slot; link: string };
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

/** What each kind of text is, in a few words, for the timeline (staff read it: English). */
export const SMS_KIND_WORDS: Record<SmsKind, string> = {
  "appointment-offered": "appointment offered",
  "appointment-reminder": "appointment reminder",
  "landlord-replied": "new message",
  "summary-sent": "written summary",
};

export const smsTexts: { [K in SmsKind]: (d: SmsTexts[K], t: Translate) => string } = {
  "appointment-offered": (d, t) =>
    t(d.rescheduled ? "appointment-offered.rescheduled" : "appointment-offered", {
      ...d,
      work: workWords(t, d.workType),
      slot: slotWords(t, d.slot),
    }),
  "appointment-reminder": (d, t) =>
    t("appointment-reminder", { ...d, work: workWords(t, d.workType), slot: slotWords(t, d.slot) }),
  "landlord-replied": (d, t) => t("landlord-replied", d),
  "summary-sent": (d, t) => t("summary-sent", d),
};

/** The text of one kind, in a language (English unless given). */
export const renderSms = <K extends SmsKind>(kind: K, data: SmsTexts[K], language: MessageLanguage = "en-GB"): string =>
  smsTexts[kind](data, translator(language, "sms"));
