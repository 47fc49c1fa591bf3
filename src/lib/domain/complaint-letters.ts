// The letters of a formal complaint: our default wording, the placeholders a landlord's own wording
// may use, and how a letter is filled in. Pure: the server fills the letters it sends, the policy page
// previews a landlord's wording with the same function. No date code here (the contract and the
// browser import this file; working-days.ts would bring the holiday data with it).

export const COMPLAINT_LETTER_KINDS = ["acknowledgement", "extension", "stage-response", "final-response"] as const;
export type ComplaintLetterKind = (typeof COMPLAINT_LETTER_KINDS)[number];

/** Every placeholder a letter may use, written {{name}} in a template, with what it stands for. */
export const COMPLAINT_LETTER_PLACEHOLDERS = {
  tenantName: "the tenant's name",
  landlordName: "the landlord's name",
  reference: "the case reference",
  stage: "the complaint's stage, 1 or 2",
  complaint: "the complaint in the tenant's words",
  respondBy: "the day the response is due (after any extension)",
  extensionDays: "the working days the response was extended by",
  extensionReason: "why the response was extended",
  response: "the landlord's response",
  remedy: "the apology, what will be put right and the compensation, as recorded",
  escalationRoute: "how to take the complaint further (the policy's text)",
  link: "the case page's address",
} as const;
export type ComplaintLetterPlaceholder = keyof typeof COMPLAINT_LETTER_PLACEHOLDERS;
export type ComplaintLetterValues = Record<ComplaintLetterPlaceholder, string>;

export interface ComplaintLetterTemplate {
  subject: string;
  body: string;
}

/** The placeholders each kind of letter must keep: the final response always tells the escalation route. */
export const REQUIRED_PLACEHOLDERS: Readonly<Record<ComplaintLetterKind, readonly ComplaintLetterPlaceholder[]>> = {
  acknowledgement: [],
  extension: ["extensionReason"],
  "stage-response": ["response"],
  "final-response": ["response", "escalationRoute"],
};

/**
 * Our default escalation route, in our own words. The Ombudsman's address is from memory [M]: a
 * landlord should check it and put its own wording in the policy.
 */
export const DEFAULT_ESCALATION_ROUTE = [
  "If you are still unhappy after this final response, you can ask the Housing Ombudsman Service to look at your complaint.",
  "The Ombudsman is independent and its service is free. You can contact it through its website, www.housing-ombudsman.org.uk.",
].join(" ");

/** Our default wording of each letter (ours). */
export const DEFAULT_COMPLAINT_LETTERS: Readonly<Record<ComplaintLetterKind, ComplaintLetterTemplate>> = {
  acknowledgement: {
    subject: "We have received your complaint about {{reference}} (stage {{stage}})",
    body: [
      "Thank you for telling us you are unhappy. We have recorded your complaint at stage {{stage}}:",
      "",
      "{{complaint}}",
      "",
      "We will send you our response by {{respondBy}}. If we need more time we will tell you why.",
      "",
      "You can follow your complaint on your case page: {{link}}",
    ].join("\n"),
  },
  extension: {
    subject: "We need more time to respond to your complaint about {{reference}}",
    body: [
      "We are sorry, but we need {{extensionDays}} more working days to respond to your complaint at stage {{stage}}.",
      "",
      "The reason: {{extensionReason}}",
      "",
      "We will now respond by {{respondBy}}.",
    ].join("\n"),
  },
  "stage-response": {
    subject: "Our response to your complaint about {{reference}} (stage {{stage}})",
    body: [
      "{{response}}",
      "",
      "{{remedy}}",
      "",
      "If you are still unhappy, you can ask us to look at your complaint again at stage 2: reply to this e-mail or use your case page, {{link}}, and tell us why.",
    ].join("\n"),
  },
  "final-response": {
    subject: "Our final response to your complaint about {{reference}}",
    body: ["{{response}}", "", "{{remedy}}", "", "This is our final response.", "", "{{escalationRoute}}"].join("\n"),
  },
};

const PLACEHOLDER = /\{\{\s*([A-Za-z]+)\s*\}\}/g;

/** The placeholders a template uses that we do not know. */
export function unknownPlaceholders(text: string): string[] {
  return [...text.matchAll(PLACEHOLDER)].map((m) => m[1]!).filter((name) => !(name in COMPLAINT_LETTER_PLACEHOLDERS));
}

/** The required placeholders a template's body leaves out. */
export function missingPlaceholders(kind: ComplaintLetterKind, body: string): ComplaintLetterPlaceholder[] {
  const used = new Set([...body.matchAll(PLACEHOLDER)].map((m) => m[1]));
  return REQUIRED_PLACEHOLDERS[kind].filter((p) => !used.has(p));
}

/** The letter with each {{placeholder}} filled in; an unknown one is left as written. Blank runs of lines are closed up. */
export function fillComplaintLetter(template: ComplaintLetterTemplate, values: ComplaintLetterValues): ComplaintLetterTemplate {
  const fill = (text: string) =>
    text.replace(PLACEHOLDER, (whole, name: string) => (name in values ? values[name as ComplaintLetterPlaceholder] : whole));
  return {
    subject: fill(template.subject).replace(/\s+/g, " ").trim(),
    body: fill(template.body)
      .replace(/\n{3,}/g, "\n\n")
      .trim(),
  };
}

/** "£125.50" from pence. */
export const formatPence = (pence: number): string =>
  `£${Math.floor(pence / 100).toLocaleString("en-GB")}.${String(pence % 100).padStart(2, "0")}`;

export interface RemedyFacts {
  apology: boolean;
  apologyText: string | null;
  putRight: string | null;
  compensationOfferedPence: number | null;
}

/** The remedy as a paragraph of a letter, or "" when nothing is recorded. */
export function describeRemedy(r: RemedyFacts): string {
  const parts: string[] = [];
  if (r.apology) parts.push(r.apologyText?.trim() || "We apologise for the problems you have had.");
  if (r.putRight?.trim()) parts.push(`What we will put right: ${r.putRight.trim()}`);
  if (r.compensationOfferedPence !== null && r.compensationOfferedPence > 0)
    parts.push(`We offer you ${formatPence(r.compensationOfferedPence)} in compensation.`);
  return parts.join("\n\n");
}
