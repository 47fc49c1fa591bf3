// The written summary's first draft, built from the case's structured facts: when the latest
// inspection was, the cause and the mould it recorded, the rooms measured, the Category of the
// latest HHSRS assessment in plain words, and what will be done by when (the deadline clocks).
// The officer's own inspection notes are never copied in: they are written for staff and may hold
// markup or shorthand; what the tenant should read about them is left as "[Fill in: …]" for the
// officer, and sending waits until none is left. No greeting: the e-mail greets the tenant by name.
// Times are London time in plain words ("at 2 pm"), never "GMT" or "BST". It judges the building,
// never the people living there.
import { formatForTenant, formatLongDay } from "@/lib/dates";

export interface SummaryInspection {
  inspectedAt: string;
  cause: string;
  mouldExtent: string;
  /** The officer's own notes: never copied into the tenant's letter (kept here so callers can pass a whole inspection). */
  findings?: string;
  /** Rooms measured at the inspection (by id): only how many is said. */
  roomReadings?: readonly { roomId: number }[];
}

export interface SummaryAssessment {
  version: number;
  band: string;
  category: number;
}

export interface SummaryDeadline {
  stage: string;
  dueAt: string | null;
  doneAt: string | null;
  state: string;
}

export interface SummaryTemplateInput {
  reference: string | null;
  /** The home's address on one line. */
  address: string;
  inspections: readonly SummaryInspection[];
  assessments: readonly SummaryAssessment[];
  deadlines: readonly SummaryDeadline[];
  sender: { name: string; role?: string };
}

export const PLACEHOLDER = "[Fill in";
const fillIn = (what: string) => `${PLACEHOLDER}: ${what}]`;

/** True while the text still has a part the officer has to write. */
export const hasPlaceholder = (text: string): boolean => text.includes(PLACEHOLDER);

const CAUSE_SENTENCES: Record<string, string> = {
  condensation:
    "Condensation: moisture in the air indoors is settling on surfaces in your home that are colder than they should be.",
  "penetrating-damp": "Penetrating damp: water is getting in through the outside of the building.",
  "rising-damp": "Rising damp: moisture from the ground is rising into the walls or floor.",
  "plumbing-leak": "A plumbing leak: water is escaping from pipes, fittings or an appliance.",
  "roof-gutter": "Water getting in from the roof, a gutter or a downpipe.",
  "other-unknown": `We have not found the cause yet. ${fillIn("what we will do next to find it")}`,
};

const MOULD_SENTENCES: Record<string, string> = {
  none: "We did not see mould.",
  "under-1-m2": "We saw mould over less than 1 square metre.",
  "1-to-5-m2": "We saw mould over between 1 and 5 square metres.",
  "over-5-m2": "We saw mould over more than 5 square metres.",
};

/** What each stage means to the tenant; the investigation and this summary itself are done. */
const STAGE_WORK: Record<string, string> = {
  "make-safe": "make your home safe",
  "safety-work": "begin the work to remove the risk to your health",
  "supplementary-work": "begin the further work to stop the damp and mould coming back",
};

export function latestInspection<T extends SummaryInspection>(inspections: readonly T[]): T | null {
  let latest: T | null = null;
  for (const i of inspections) if (!latest || Date.parse(i.inspectedAt) >= Date.parse(latest.inspectedAt)) latest = i;
  return latest;
}

export function latestAssessment<T extends SummaryAssessment>(assessments: readonly T[]): T | null {
  let latest: T | null = null;
  for (const a of assessments) if (!latest || a.version > latest.version) latest = a;
  return latest;
}

/** The HHSRS result in plain words: the Category (the standard's own term), never the band letter. */
function assessmentParagraph(a: SummaryAssessment | null): string {
  if (!a)
    return "We will tell you the result of our Housing Health and Safety Rating System (HHSRS) assessment when it is complete.";
  const intro =
    "We assessed the damp and mould using the Housing Health and Safety Rating System (HHSRS), the way landlords must judge risks to health in a home.";
  return a.category === 1
    ? `${intro} It is a Category 1 hazard: the most serious kind, which we must put right.`
    : `${intro} It is a Category 2 hazard: a risk to health that is less serious than Category 1. We will still deal with it as set out below.`;
}

function workLines(deadlines: readonly SummaryDeadline[]): string[] {
  const lines: string[] = [];
  for (const d of deadlines) {
    const work = STAGE_WORK[d.stage];
    if (!work || d.doneAt || !d.dueAt) continue;
    if (d.state === "pending") lines.push(`- We will ${work} by ${formatForTenant(d.dueAt)}.`);
    else if (d.state === "missed")
      lines.push(
        `- We will ${work} as soon as possible: we should have done so by ${formatForTenant(d.dueAt)}, and we are sorry for the delay.`,
      );
  }
  return lines;
}

export function buildSummaryTemplate(input: SummaryTemplateInput): string {
  const inspection = latestInspection(input.inspections);
  const assessment = latestAssessment(input.assessments);
  const reference = input.reference ? ` (reference ${input.reference})` : "";
  const at = input.address ? ` at ${input.address}` : "";

  const rooms = new Set((inspection?.roomReadings ?? []).map((r) => r.roomId)).size;
  const found = inspection
    ? [
        `We inspected your home on ${formatLongDay(inspection.inspectedAt)}.`,
        MOULD_SENTENCES[inspection.mouldExtent] ?? "",
        rooms > 0 ? `We took measurements in ${rooms === 1 ? "one room" : `${rooms} rooms`}.` : "",
        fillIn("what we found, in plain words for the tenant"),
      ].filter(Boolean)
    : [fillIn("what we found when we inspected your home")];
  const cause = inspection ? (CAUSE_SENTENCES[inspection.cause] ?? fillIn("the cause we found")) : fillIn("the cause we found");
  const lines = workLines(input.deadlines);

  return [
    `This is the written summary of our investigation into the damp and mould you reported${reference}${at}.`,
    ["What we found", ...found].join("\n"),
    ["What is causing it", cause].join("\n"),
    ["How serious it is", assessmentParagraph(assessment)].join("\n"),
    [
      "What we will do, and by when",
      fillIn("the work we will do, room by room"),
      ...(lines.length ? lines : [fillIn("when we will start and finish the work")]),
    ].join("\n"),
    "If the damp or mould gets worse, or you have a question, you can tell us on your case page at any time.",
    [input.sender.name, input.sender.role].filter(Boolean).join("\n"),
  ].join("\n\n");
}
