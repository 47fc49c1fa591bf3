// The words the tenant reads in the conversation. The components are shared with staff pages, and staff
// never load the language machinery (the officers' queue's first load must not carry i18next), so the
// components hold no translation code: they take these words as a prop, English by default, and the
// tenant's case page passes the same words in the tenant's language (tenant-words.ts).
import { formatDateTime } from "@/lib/dates";

/** Why a photo cannot go with a message (see attachments.ts). */
export type AttachmentProblem =
  | { kind: "heic" }
  | { kind: "not-a-picture" }
  | { kind: "empty" }
  | { kind: "too-big"; size: string }
  | { kind: "too-many"; max: number };

export interface ConversationWords {
  /** "2 new messages from your landlord since you last looked." */
  unreadNote: (count: number) => string;
  loading: string;
  loadFailed: string;
  tryAgain: string;
  // The thread
  listLabel: string;
  emptyTitle: string;
  emptyBody: string;
  you: string;
  yourLandlord: string;
  /** "Ffion Rhys, Housing officer" */
  staffAuthor: (name: string, role: string) => string;
  summarySuffix: string;
  newTag: string;
  at: (iso: string) => string;
  photosLabel: string;
  photoAlt: (n: number, of: number) => string;
  // The box to write in
  label: string;
  hint: string;
  photos: string;
  optional: string;
  photosHint: (max: number) => string;
  refusedTitle: (count: number) => string;
  problem: (p: AttachmentProblem) => string;
  chosenLabel: string;
  remove: string;
  notSent: string;
  send: string;
  sent: (photoCount: number) => string;
  writeTheMessage: string;
  tooLong: string;
  ctrlEnter: string;
}

const ENGLISH_ROLES: Record<string, string> = {
  tenant: "Tenant",
  officer: "Housing officer",
  maintenance: "Maintenance lead",
  admin: "Administrator",
};

export const englishConversationWords: ConversationWords = {
  unreadNote: (n) => `${n === 1 ? "1 new message" : `${n} new messages`} from your landlord since you last looked.`,
  loading: "Loading the messages…",
  loadFailed: "We couldn't load the messages",
  tryAgain: "Try again",
  listLabel: "Messages, oldest first",
  emptyTitle: "No messages yet",
  emptyBody: "Write to your landlord below. Their replies will appear here, and you will get an e-mail too.",
  you: "You",
  yourLandlord: "Your landlord",
  staffAuthor: (name, role) => `${name}, ${ENGLISH_ROLES[role] ?? role}`,
  summarySuffix: ": the written summary",
  newTag: "New",
  at: (iso) => formatDateTime(iso),
  photosLabel: "Photos sent with this message",
  photoAlt: (n, of) => `Attachment ${n} of ${of} (opens full size)`,
  label: "Write to your landlord",
  hint: "Ask a question or tell them what has changed. They get an e-mail and reply here. In an emergency, phone your landlord.",
  photos: "Photos",
  optional: "(optional)",
  photosHint: (max) => `JPEG, PNG, WebP or AVIF, up to 15 MB each, ${max} at most. They are added to your report's photos too.`,
  refusedTitle: (n) => (n === 1 ? "1 file was left out" : `${n} files were left out`),
  problem: (p) =>
    p.kind === "heic"
      ? "HEIC photos can't be read yet. Share the photo as a JPEG (on an iPhone: Settings, Camera, Formats, Most Compatible)."
      : p.kind === "not-a-picture"
        ? "This isn't a kind of picture we can use. Choose a JPEG, PNG, WebP or AVIF photo."
        : p.kind === "empty"
          ? "This file is empty. Choose the photo again."
          : p.kind === "too-big"
            ? `This photo is ${p.size}, more than the 15 MB we can take.`
            : `A message can carry up to ${p.max} photos.`,
  chosenLabel: "Photos to send with the message",
  remove: "Remove",
  notSent: "This was not sent",
  send: "Send to your landlord",
  sent: (n) =>
    `Message sent${n ? ` with ${n === 1 ? "1 photo" : `${n} photos`}` : ""}. Your landlord has been e-mailed and will reply here.`,
  writeTheMessage: "Write the message.",
  tooLong: "Keep the message to 5,000 characters or fewer.",
  ctrlEnter: "Ctrl + Enter also sends.",
};

/** The box on My reports listing the reports with messages the tenant has not read (unread-messages.tsx). */
export interface UnreadWords {
  heading: string;
  /** "2 new messages", after the heading. */
  total: (count: number) => string;
  /** Before the report's reference in each link: "Report". */
  report: string;
  /** After each link: "1 new message from your landlord". */
  line: (count: number) => string;
}

const newMessages = (n: number) => (n === 1 ? "1 new message" : `${n} new messages`);

export const englishUnreadWords: UnreadWords = {
  heading: "Your landlord has written to you",
  total: newMessages,
  report: "Report",
  line: (n) => `${newMessages(n)} from your landlord`,
};
