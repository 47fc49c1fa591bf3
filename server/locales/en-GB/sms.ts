// Text messages in English (ICU MessageFormat): short plain English for a reading age of about 9, the
// sender first. {work} and {slot} are the e-mails' work words and slot lines (mail.ts).
export default {
  "appointment-offered":
    "{landlord}: We can come for your damp and mould report {reference}. {work}: {slot}. Please say yes or ask for another day here: {link}",
  "appointment-offered.rescheduled":
    "{landlord}: We have a new day for your damp and mould report {reference}. {work}: {slot}. Please say yes or ask for another day here: {link}",
  "appointment-reminder":
    "{landlord}: A reminder that we are coming tomorrow, {slot}, for report {reference} ({work}). Need a new day? Tell us here: {link}",
  "landlord-replied": "{landlord}: We have sent you a message about your report {reference}. Read it here: {link}",
  "summary-sent":
    "{landlord}: We have sent you a written summary of what we found and what we will do about report {reference}. Read it here: {link}",
} as const;
