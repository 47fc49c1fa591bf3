// The same limits as the server (server/modules/photos), checked in the browser first so a
// person hears about a file that will not go before they wait for an upload.

export const MAX_PHOTOS = 10;
export const MAX_PHOTO_BYTES = 15 * 1024 * 1024;
export const ACCEPTED_PHOTO_TYPES = ["image/jpeg", "image/png", "image/webp", "image/avif"] as const;
const ACCEPTED_EXTENSIONS = [".jpg", ".jpeg", ".png", ".webp", ".avif"];
const HEIC_TYPES = ["image/heic", "image/heif", "image/heic-sequence", "image/heif-sequence"];
const HEIC_EXTENSIONS = [".heic", ".heif"];

/** For the file input: lets phones offer the camera and the photo library. */
export const PHOTO_ACCEPT = [...ACCEPTED_PHOTO_TYPES, ...ACCEPTED_EXTENSIONS].join(",");

const extension = (name: string) => {
  const dot = name.lastIndexOf(".");
  return dot === -1 ? "" : name.slice(dot).toLowerCase();
};

/**
 * Why a file cannot be sent as a photo, or null when it can: a key under `photos.problem` in the
 * `report` namespace (the picker says it in the person's language).
 */
export type PhotoProblem = "heic" | "type" | "tooBig" | "empty" | "tooMany";

export function photoProblem(file: File): PhotoProblem | null {
  const type = file.type.toLowerCase();
  const ext = extension(file.name);
  if (HEIC_TYPES.includes(type) || HEIC_EXTENSIONS.includes(ext)) return "heic";
  const known = type ? (ACCEPTED_PHOTO_TYPES as readonly string[]).includes(type) : ACCEPTED_EXTENSIONS.includes(ext);
  if (!known) return "type";
  if (file.size > MAX_PHOTO_BYTES) return "tooBig";
  if (file.size === 0) return "empty";
  return null;
}

/** A file's size in megabytes as shown: one decimal under 10 MB, whole megabytes from 10. */
export function megabytesOf(bytes: number): { key: "megabytes" | "megabytesWhole"; mb: number } {
  const mb = bytes / (1024 * 1024);
  return mb >= 10 ? { key: "megabytesWhole", mb: Math.round(mb) } : { key: "megabytes", mb: Number(mb.toFixed(1)) };
}

/** The files the server refused, from a 4xx whose `details.refused` lists them (none of the batch was taken). */
export function refusedFromError(error: unknown): { name: string; message: string }[] {
  const details = (error as { details?: { refused?: unknown } } | null)?.details;
  const refused = details && typeof details === "object" ? details.refused : undefined;
  if (!Array.isArray(refused)) return [];
  return refused
    .filter((r): r is { name: string; reason: string } => typeof r?.name === "string" && typeof r?.reason === "string")
    .map((r) => ({ name: r.name, message: r.reason }));
}

export interface PhotoSelection {
  accepted: File[];
  problems: { name: string; size: number; problem: PhotoProblem }[];
}

/** Adds newly picked files to those already chosen, keeping at most MAX_PHOTOS. */
export function addPhotos(current: readonly File[], picked: readonly File[]): PhotoSelection {
  const accepted = [...current];
  const problems: PhotoSelection["problems"] = [];
  for (const file of picked) {
    const problem = photoProblem(file);
    if (problem) {
      problems.push({ name: file.name, size: file.size, problem });
    } else if (accepted.some((f) => f.name === file.name && f.size === file.size && f.lastModified === file.lastModified)) {
      // The same photo picked twice: keep one quietly.
    } else if (accepted.length >= MAX_PHOTOS) {
      problems.push({ name: file.name, size: file.size, problem: "tooMany" });
    } else {
      accepted.push(file);
    }
  }
  return { accepted, problems };
}
