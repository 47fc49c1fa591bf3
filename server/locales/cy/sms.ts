// Text messages in Welsh. Kept to the GSM-7 alphabet (no â, ŵ, ŷ in our own words), so a Welsh text is
// charged per 160 characters like an English one unless a name or address brings in such a letter
// (then per 70). A Welsh speaker should review the wording before a landlord in Wales relies on it.
import type en from "../en-GB/sms.js";

const cy: Record<keyof typeof en, string> = {
  "appointment-offered":
    "{landlord}: Gallwn ddod ynghylch eich adroddiad lleithder a llwydni {reference}. {work}: {slot}. Cadarnhewch neu gofynnwch am ddiwrnod arall yma: {link}",
  "appointment-offered.rescheduled":
    "{landlord}: Diwrnod newydd ar gyfer eich adroddiad lleithder a llwydni {reference}. {work}: {slot}. Cadarnhewch neu gofynnwch am ddiwrnod arall yma: {link}",
  "appointment-reminder":
    "{landlord}: Rydym yn dod yfory, {slot}, ynghylch adroddiad {reference} ({work}). Angen diwrnod arall? Dywedwch wrthym yma: {link}",
  "landlord-replied": "{landlord}: Rydym wedi anfon neges atoch am eich adroddiad {reference}. Darllenwch hi yma: {link}",
  "summary-sent":
    "{landlord}: Rydym wedi anfon crynodeb atoch o beth welsom ni a beth wnawn ni ynghylch adroddiad {reference}. Darllenwch yma: {link}",
};

export default cy;
