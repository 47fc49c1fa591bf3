import i18next, { type TFunction } from "i18next";
import ICU from "i18next-icu";
import cyErrors from "../locales/cy/errors.js";
import cyMail from "../locales/cy/mail.js";
import cySms from "../locales/cy/sms.js";
import enErrors from "../locales/en-GB/errors.js";
import enMail from "../locales/en-GB/mail.js";
import enSms from "../locales/en-GB/sms.js";

/**
 * What tenants receive (e-mails and texts) in their language: one i18next instance of the server's own,
 * with ICU MessageFormat as on the client (`{count, plural, …}`, Welsh plurals zero/one/two/few/many/other).
 * The messages are TypeScript objects under server/locales/<lng>/ so the compiler checks every language
 * has every key of the English, and the build carries them without copying files. Staff e-mails stay English.
 * The "errors" namespace is the error messages a tenant can meet (server/lib/error-language.ts).
 */
export const MESSAGE_LANGUAGES = ["en-GB", "cy"] as const;
export type MessageLanguage = (typeof MESSAGE_LANGUAGES)[number];

export const MESSAGES = {
  "en-GB": { mail: enMail, sms: enSms, errors: enErrors },
  cy: { mail: cyMail, sms: cySms, errors: cyErrors },
} as const satisfies Record<MessageLanguage, Record<string, Record<string, string>>>;

/**
 * The language of a stored tag (users.preferred_language: "en", "cy", "cy-GB", "pl"…, or null).
 * Languages Dewline has no text for get English.
 */
export function messageLanguage(tag: string | null | undefined): MessageLanguage {
  const primary = tag?.trim().toLowerCase().split(/[-_]/)[0];
  return primary === "cy" ? "cy" : "en-GB";
}

/** Dates in messages: always London's calendar day, whatever the server's zone. */
const LONDON = "Europe/London";

const messages = i18next.createInstance();
void messages.use(ICU).init({
  lng: "en-GB",
  fallbackLng: "en-GB",
  supportedLngs: [...MESSAGE_LANGUAGES],
  resources: MESSAGES,
  ns: ["mail", "sms", "errors"],
  defaultNS: "mail",
  // Keys are flat ("caseAcknowledgement.subject"); the text is plain text, never HTML (htmlFromText escapes it).
  keySeparator: false,
  interpolation: { escapeValue: false },
  returnNull: false,
  initAsync: false,
  i18nFormat: {
    formats: {
      date: {
        // "Tuesday, 8 December 2026" / "Dydd Mawrth, 8 Rhagfyr 2026"
        day: { weekday: "long", day: "numeric", month: "long", year: "numeric", timeZone: LONDON },
        // "8 December 2026" / "8 Rhagfyr 2026"
        date: { day: "numeric", month: "long", year: "numeric", timeZone: LONDON },
      },
    },
    // A message that does not parse is a bug, not something to send half-formatted.
    parseErrorHandler: (err: Error, key: string) => {
      throw new Error(`Message ${key} does not parse: ${err.message}`);
    },
  },
});

export type Translate = TFunction;

/** The translator for one language and namespace ("mail", "sms", or "errors": server/lib/error-language.ts). */
export const translator = (language: MessageLanguage, ns: "mail" | "sms" | "errors"): Translate =>
  messages.getFixedT(language, ns);
