// What the timeline says to the tenant. The timeline is shared with staff pages, which never load the
// language machinery, so it takes these words as a prop, English by default; the tenant's case page
// passes them in the tenant's language (../tenant-words.ts). Staff sentences stay in case-timeline.tsx.
import { formatDateTime } from "@/lib/dates";
import { isRole, roleLabels } from "@/lib/roles";
import { humanise, statusLabel, statusMeaning } from "../labels";

/** Who did something, as the tenant is told: themselves, someone named, or nobody known. */
export type By = { kind: "you" } | { kind: "who"; who: string } | { kind: "none" };

export interface TimelineWords {
  nothingYet: string;
  at: (iso: string) => string;
  /** "Ffion Rhys (Housing officer)" */
  byWhom: (name: string, role: string) => string;
  statusLabel: (status: string) => string;
  statusMeaning: (status: string) => string | undefined;
  created: (by: By) => string;
  emailSent: string;
  emailSentAgain: string;
  /** `count` 0: the number is not known. */
  photosAdded: (count: number, by: By) => string;
  readingsAdded: (count: number, room?: string) => string;
  readingsSkipped: (count: number) => string;
  readingsImported: (count: number, room?: string) => string;
  readingsAlreadyThere: (count: number) => string;
  rowsUnreadable: (count: number) => string;
  gotWorse: (by: By) => string;
  statusChangedTo: (label: string) => string;
  statusChanged: string;
  statusWas: (label: string) => string;
  textSent: (ending?: string) => string;
  textNotSent: string;
  messageToYou: (who?: string) => string;
  messageFromTenant: (by: By, photos: number) => string;
  summarySent: string;
  inspectionRecorded: string;
  hazardAssessed: string;
  hhsrsAssessed: string;
  assigned: string;
  fixWorked: string;
  fixNotYet: string;
  complaintRaised: (by: By, onBehalf: boolean) => string;
  complaintAcknowledged: (stage: number) => string;
  complaintExtended: (stage: number, days: number) => string;
  complaintFinal: string;
  complaintResponded: (stage: number) => string;
  complaintEscalated: (by: By) => string;
  complaintClosed: string;
  remedyRecorded: string;
  /** An event this version has no words for: its type, made readable. */
  other: (type: string, who?: string) => string;
}

const count = (n: number, one: string, many: string) => `${n.toLocaleString("en-GB")} ${n === 1 ? one : many}`;
const named = (by: By, fallback: string) => (by.kind === "who" ? by.who : fallback);

export const englishTimelineWords: TimelineWords = {
  nothingYet: "Nothing has happened yet.",
  at: (iso) => formatDateTime(iso),
  byWhom: (name, role) => `${name} (${isRole(role) ? roleLabels[role] : humanise(role)})`,
  statusLabel,
  statusMeaning,
  created: (by) =>
    by.kind === "you"
      ? "You sent this report."
      : by.kind === "who"
        ? `${by.who} logged this report.`
        : "The report was received.",
  emailSent: "An e-mail about this report was sent.",
  emailSentAgain: "An e-mail about this report was sent to you again.",
  photosAdded: (n, by) =>
    `${n ? count(n, "photo was", "photos were") : "Photos were"} added${by.kind === "you" ? " by you" : by.kind === "who" ? ` by ${by.who}` : ""}.`,
  readingsAdded: (n, room) => `${count(n, "reading was", "readings were")} added by hand${room ? ` for ${room}` : ""}.`,
  readingsSkipped: (n) =>
    `${count(n, "reading was", "readings were")} already there, so ${n === 1 ? "it was" : "they were"} skipped.`,
  readingsImported: (n, room) =>
    `${count(n, "reading was", "readings were")} added from a logger file${room ? ` for ${room}` : ""}.`,
  readingsAlreadyThere: (n) => `${count(n, "reading was", "readings were")} already there.`,
  rowsUnreadable: (n) => `${count(n, "row", "rows")} of the file couldn't be read.`,
  gotWorse: (by) =>
    by.kind === "you" ? "You told your landlord it has got worse." : `${named(by, "The tenant")} said it has got worse.`,
  statusChangedTo: (label) => `The status changed to “${label}”.`,
  statusChanged: "The status changed.",
  statusWas: (label) => `It was “${label}”.`,
  textSent: (ending) => `We sent you a text${ending ? ` to your number ending ${ending}` : ""}.`,
  textNotSent: "We did not send a text, as texts are off. You got an e-mail.",
  messageToYou: (who) => (who ? `${who} sent you a message.` : "Your landlord sent you a message."),
  messageFromTenant: (by, photos) =>
    `${by.kind === "you" ? "You" : named(by, "The tenant")} wrote to your landlord${photos ? `, with ${count(photos, "photo", "photos")}` : ""}.`,
  summarySent: "Your landlord sent you a written summary of what they found and what happens next.",
  inspectionRecorded: "The inspection of your home was recorded.",
  hazardAssessed: "Your landlord assessed how serious the hazard is.",
  hhsrsAssessed: "Your landlord recorded a health and safety (HHSRS) assessment.",
  assigned: "A member of staff was given this report to look after.",
  fixWorked: "Your landlord recorded that the repair worked.",
  fixNotYet: "Your landlord recorded that the repair did not work yet.",
  complaintRaised: (by, onBehalf) =>
    by.kind === "you"
      ? "You made a formal complaint."
      : `${named(by, "Staff")} recorded a formal complaint${onBehalf ? " for the tenant" : ""}.`,
  complaintAcknowledged: (stage) => `Your landlord acknowledged the complaint at stage ${stage}.`,
  complaintExtended: (stage, days) =>
    `Your landlord extended stage ${stage} of the complaint by ${count(days, "working day", "working days")}.`,
  complaintFinal: "Your landlord sent the final response to the complaint.",
  complaintResponded: (stage) => `Your landlord sent the stage ${stage} response to the complaint.`,
  complaintEscalated: (by) =>
    by.kind === "you" ? "You took your complaint to stage 2." : `${named(by, "Staff")} took the complaint to stage 2.`,
  complaintClosed: "Your complaint was closed.",
  remedyRecorded: "Your landlord recorded how it will put things right.",
  other: (type, who) => `${humanise(type)}${who ? `, by ${who}` : ""}.`,
};
