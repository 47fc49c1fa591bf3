// Photos a tenant attaches to a message: checked in the browser before anything is sent, with the
// limits of the server's photo pipeline (server/modules/photos: JPEG, PNG, WebP or AVIF, 15 MB each,
// 10 at a time). The same rules as the report form's picker, kept here because a feature imports no other.
import { MESSAGE_MAX_PHOTOS } from "@/lib/schemas/messages";
import type { AttachmentProblem } from "./words";

export const MAX_ATTACHMENT_BYTES = 15 * 1024 * 1024;
const TYPES = ["image/jpeg", "image/png", "image/webp", "image/avif"];
const EXTENSIONS = [".jpg", ".jpeg", ".png", ".webp", ".avif"];
export const ATTACHMENT_ACCEPT = [...TYPES, ...EXTENSIONS].join(",");

const extensionOf = (name: string) => {
  const dot = name.lastIndexOf(".");
  return dot === -1 ? "" : name.slice(dot).toLowerCase();
};

export const sizeInWords = (bytes: number) => {
  const mb = bytes / (1024 * 1024);
  return mb >= 1 ? `${mb >= 10 ? Math.round(mb) : mb.toFixed(1)} MB` : `${Math.max(1, Math.round(bytes / 1024))} KB`;
};

/** Why a file cannot go with a message, or null when it can (the words are the reader's: words.ts). */
export function attachmentProblem(file: File): AttachmentProblem | null {
  const ext = extensionOf(file.name);
  if (file.type.toLowerCase().startsWith("image/hei") || ext === ".heic" || ext === ".heif") return { kind: "heic" };
  const known = file.type ? TYPES.includes(file.type.toLowerCase()) : EXTENSIONS.includes(ext);
  if (!known) return { kind: "not-a-picture" };
  if (file.size === 0) return { kind: "empty" };
  if (file.size > MAX_ATTACHMENT_BYTES) return { kind: "too-big", size: sizeInWords(file.size) };
  return null;
}

/** Adds picked files to those already chosen: each is taken or refused on its own, with a reason. */
export function addAttachments(current: readonly File[], picked: readonly File[]) {
  const accepted = [...current];
  const refused: { name: string; problem: AttachmentProblem }[] = [];
  for (const file of picked) {
    const problem = attachmentProblem(file);
    if (problem) refused.push({ name: file.name, problem });
    else if (accepted.some((f) => f.name === file.name && f.size === file.size && f.lastModified === file.lastModified)) continue;
    else if (accepted.length >= MESSAGE_MAX_PHOTOS)
      refused.push({ name: file.name, problem: { kind: "too-many", max: MESSAGE_MAX_PHOTOS } });
    else accepted.push(file);
  }
  return { accepted, refused };
}
