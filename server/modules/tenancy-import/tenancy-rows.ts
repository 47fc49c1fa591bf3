// The rules for one row of a tenancy file, without the database: column detection, then each row
// read into a tenancy or the reasons it cannot be. Whether the home exists and who the address
// belongs to are decided by the service.
import { z } from "zod";
import { TENANCY_FIELDS, type TenancyField, type TenancyMapping } from "../../../src/lib/contracts/tenancy-import.js";
import { uprnSchema } from "../../../src/lib/schemas/homes.js";

/** Header names each field is recognised by, compared as lower-case letters and digits only. */
const SYNONYMS: Record<TenancyField, readonly string[]> = {
  reference: ["tenancyreference", "tenancyref", "reference", "ref", "tenancyid", "tenancyno", "tenancynumber", "agreementref"],
  uprn: ["uprn", "propertyuprn", "homeuprn"],
  name: ["tenantname", "tenantnames", "name", "names", "fullname", "leadtenant", "tenant"],
  firstName: ["firstname", "forename", "forenames", "givenname"],
  lastName: ["surname", "lastname", "familyname"],
  email: ["email", "emailaddress", "tenantemail", "mail"],
  phone: ["phone", "telephone", "phonenumber", "mobile", "mobilenumber", "tel", "contactnumber"],
  startDate: ["startdate", "tenancystart", "tenancystartdate", "start", "from"],
  endDate: ["enddate", "tenancyend", "tenancyenddate", "end", "to"],
  language: ["language", "preferredlanguage", "lang", "languagecode"],
  accessNeeds: ["accessneeds", "access", "accessrequirements"],
  vulnerability: ["vulnerability", "householdvulnerability", "vulnerabilities", "vulnerable"],
  consent: ["consent", "consentheld", "dataconsent", "consenttohold", "consentgiven"],
};

const headerKey = (h: string) => h.toLowerCase().replace(/[^a-z0-9]/g, "");

/** Proposes a column for each field from the header row; each column is used once. */
export function detectMapping(headers: readonly string[]): TenancyMapping {
  const keys = headers.map(headerKey);
  const used = new Set<number>();
  const mapping = {} as TenancyMapping;
  for (const field of TENANCY_FIELDS) {
    const i = keys.findIndex((k, idx) => !used.has(idx) && SYNONYMS[field].includes(k));
    mapping[field] = i === -1 ? null : i;
    if (i !== -1) used.add(i);
  }
  return mapping;
}

/** The fields a file must have (a name in one column or two). */
export function missingFields(m: TenancyMapping): string[] {
  const missing: string[] = [];
  if (m.reference === null) missing.push("tenancy reference");
  if (m.uprn === null) missing.push("UPRN");
  if (m.name === null && (m.firstName === null || m.lastName === null)) missing.push("tenant name");
  if (m.email === null) missing.push("e-mail");
  if (m.startDate === null) missing.push("start date");
  return missing;
}

/** A row read into what it says of a tenancy (text fields trimmed, empty ones null). */
export interface TenancyRow {
  row: number;
  reference: string;
  uprn: string;
  name: string;
  email: string;
  phone: string | null;
  startDate: string;
  endDate: string | null;
  language: string | null;
  /** Null unless the file records consent (then the text, or null when the cell is empty). */
  accessNeeds: string | null;
  vulnerability: string | null;
  consent: boolean;
  /** What was not stored and why (the row is still imported). */
  notes: string[];
}

export type RowReading = { ok: true; value: TenancyRow } | { ok: false; row: number; reference: string; reasons: string[] };

const email = z.email();
const PHONE = /^\+?\d{7,15}$/;
/** A BCP 47-ish tag: a 2–3 letter language, then optional subtags ("en", "cy", "pt-BR", "zh-Hant"). */
const LANGUAGE = /^[a-z]{2,3}(?:-[a-z0-9]{2,8})*$/i;
const YES = new Set(["yes", "y", "true", "1", "x", "held", "given"]);
const NO = new Set(["", "no", "n", "false", "0", "not held", "none"]);

/** YYYY-MM-DD, or the UK's DD/MM/YYYY (also with - or .); null when it is not a real date. */
export function parseCalendarDate(raw: string): string | null {
  let y: number, m: number, d: number;
  const iso = /^(\d{4})-(\d{1,2})-(\d{1,2})(?:[T ].*)?$/.exec(raw);
  const uk = /^(\d{1,2})[/.-](\d{1,2})[/.-](\d{4})$/.exec(raw);
  if (iso) [y, m, d] = [Number(iso[1]), Number(iso[2]), Number(iso[3])];
  else if (uk) [d, m, y] = [Number(uk[1]), Number(uk[2]), Number(uk[3])];
  else return null;
  const date = new Date(Date.UTC(y, m - 1, d));
  if (date.getUTCFullYear() !== y || date.getUTCMonth() !== m - 1 || date.getUTCDate() !== d) return null;
  return date.toISOString().slice(0, 10);
}

/** Reads one data row; `row` is its spreadsheet row number. */
export function readTenancyRow(cells: readonly string[], m: TenancyMapping, row: number): RowReading {
  const cell = (f: TenancyField) => {
    const i = m[f];
    return i === null ? "" : (cells[i] ?? "").trim();
  };
  const reasons: string[] = [];
  const notes: string[] = [];
  const reference = cell("reference");
  if (!reference) reasons.push("No tenancy reference.");
  else if (reference.length > 64) reasons.push("The tenancy reference is longer than 64 characters.");

  const uprnText = cell("uprn").replace(/\s+/g, "");
  const uprn = uprnSchema.safeParse(uprnText);
  if (!uprnText) reasons.push("No UPRN: each tenancy must name its home by UPRN.");
  else if (!uprn.success) reasons.push(`"${cell("uprn")}" is not a UPRN (a number of up to 12 digits).`);

  const name = cell("name") || [cell("firstName"), cell("lastName")].filter(Boolean).join(" ");
  if (!name) reasons.push("No tenant name.");
  else if (name.length > 190) reasons.push("The tenant's name is longer than 190 characters.");

  const address = cell("email").toLowerCase();
  if (!address) reasons.push("No e-mail address: the tenant needs one to be invited.");
  else if (address.length > 190 || !email.safeParse(address).success)
    reasons.push(`"${cell("email")}" is not an e-mail address.`);

  const startText = cell("startDate");
  const startDate = parseCalendarDate(startText);
  if (!startText) reasons.push("No start date.");
  else if (!startDate) reasons.push(`"${startText}" is not a date (use YYYY-MM-DD or DD/MM/YYYY).`);
  const endText = cell("endDate");
  const endDate = endText ? parseCalendarDate(endText) : null;
  if (endText && !endDate) reasons.push(`"${endText}" is not a date (use YYYY-MM-DD or DD/MM/YYYY).`);
  if (startDate && endDate && endDate < startDate) reasons.push("The end date is before the start date.");

  const phoneText = cell("phone");
  const phoneCompact = phoneText.replace(/[\s().-]/g, "");
  let phone: string | null = null;
  if (phoneText && PHONE.test(phoneCompact)) phone = phoneCompact;
  else if (phoneText) notes.push(`Phone not stored: "${phoneText}" is not a phone number.`);

  const languageText = cell("language");
  let language: string | null = null;
  if (languageText && LANGUAGE.test(languageText) && languageText.length <= 35) {
    const [primary, ...rest] = languageText.split("-");
    language = [primary!.toLowerCase(), ...rest].join("-");
  } else if (languageText) notes.push(`Language not stored: "${languageText}" is not a language code such as en or cy.`);

  const consentText = cell("consent").toLowerCase();
  const consent = YES.has(consentText);
  if (!consent && !NO.has(consentText)) notes.push(`Consent read as not held: "${cell("consent")}" is not yes or no.`);
  const needsText = cell("accessNeeds");
  const vulnerabilityText = cell("vulnerability");
  for (const [text, what] of [
    [needsText, "Access needs"],
    [vulnerabilityText, "Household vulnerability"],
  ] as const) {
    if (text.length > 2000) reasons.push(`${what}: longer than 2 000 characters.`);
  }
  if (!consent && (needsText || vulnerabilityText)) {
    notes.push("Access needs and household vulnerability not stored: the file does not record the household's consent.");
  }

  if (reasons.length) return { ok: false, row, reference, reasons };
  return {
    ok: true,
    value: {
      row,
      reference,
      uprn: uprn.data!,
      name,
      email: address,
      phone,
      startDate: startDate!,
      endDate,
      language,
      accessNeeds: consent && needsText ? needsText : null,
      vulnerability: consent && vulnerabilityText ? vulnerabilityText : null,
      consent,
      notes,
    },
  };
}
