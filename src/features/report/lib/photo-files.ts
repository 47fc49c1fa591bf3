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

export const HEIC_ADVICE =
  "This photo is in HEIC format, which we can't read yet. On an iPhone, go to Settings, then Camera, then Formats, and choose Most Compatible; or share the photo as a JPEG. Then add it again.";

const extension = (name: string) => {
  const dot = name.lastIndexOf(".");
  return dot === -1 ? "" : name.slice(dot).toLowerCase();
};

/** Why a file cannot be sent as a photo, or null when it can. */
export function photoProblem(file: File): string | null {
  const type = file.type.toLowerCase();
  const ext = extension(file.name);
  if (HEIC_TYPES.includes(type) || HEIC_EXTENSIONS.includes(ext)) return HEIC_ADVICE;
  const known = type ? (ACCEPTED_PHOTO_TYPES as readonly string[]).includes(type) : ACCEPTED_EXTENSIONS.includes(ext);
  if (!known) return "This file isn't a kind of picture we can use. Please choose a JPEG, PNG, WebP or AVIF photo.";
  if (file.size > MAX_PHOTO_BYTES)
    return `This photo is ${megabytes(file.size)}, more than the 15 MB we can take. Please choose a smaller photo.`;
  if (file.size === 0) return "This file is empty. Please choose the photo again.";
  return null;
}

export function megabytes(bytes: number): string {
  const mb = bytes / (1024 * 1024);
  return mb >= 10 ? `${Math.round(mb)} MB` : `${mb.toFixed(1)} MB`;
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
  problems: { name: string; message: string }[];
}

/** Adds newly picked files to those already chosen, keeping at most MAX_PHOTOS. */
export function addPhotos(current: readonly File[], picked: readonly File[]): PhotoSelection {
  const accepted = [...current];
  const problems: PhotoSelection["problems"] = [];
  for (const file of picked) {
    const problem = photoProblem(file);
    if (problem) {
      problems.push({ name: file.name, message: problem });
    } else if (accepted.some((f) => f.name === file.name && f.size === file.size && f.lastModified === file.lastModified)) {
      // The same photo picked twice: keep one quietly.
    } else if (accepted.length >= MAX_PHOTOS) {
      problems.push({ name: file.name, message: `You can add up to ${MAX_PHOTOS} photos at a time, so this one was left out.` });
    } else {
      accepted.push(file);
    }
  }
  return { accepted, problems };
}
