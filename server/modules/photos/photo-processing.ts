// The photo pipeline: decode an upload with sharp, refuse anything that is not a real JPEG, PNG,
// WebP or AVIF, auto-rotate, drop every piece of metadata (EXIF with GPS, XMP, ICC comments…),
// re-encode a display copy and a thumbnail under random names. The uploaded bytes are never kept.
//
// Decoding (decodePhoto) runs on a worker thread (the "decodePhoto" task of server/workers) and
// answers plain data, never throws an AppError (a class does not survive the thread boundary);
// writing (storeDecoded) runs on the request thread, into the object store (server/lib/storage.ts),
// so a failed write is answered and cleaned up here.
import { createHash, randomBytes } from "node:crypto";
import { open } from "node:fs/promises";
import sharp, { type Metadata } from "sharp";
import { ServiceUnavailableError, UnprocessableError, UnsupportedMediaTypeError } from "../../lib/errors.js";
// Types only: this file also runs on every worker thread, which has no use for the S3 client.
import type { ObjectStore } from "../../lib/storage.js";

export const DISPLAY_MAX_PX = 2048;
export const THUMBNAIL_MAX_PX = 320;
/** Larger than any phone camera today (200 MP); refuses decompression bombs before decoding. */
export const MAX_INPUT_PIXELS = 250_000_000;

// libvips settings are per process (every thread shares one libvips). No operation cache: a decoded
// upload is never asked for twice, and a cache of big images is memory held for nothing. One libvips
// thread per image: how many images decode at once is bounded by the worker pool and PhotoService,
// so a large image takes at most about one core and the request thread keeps one.
sharp.cache(false);
sharp.concurrency(1);

export interface ProcessedPhoto {
  /** Object keys in the photo store: <prefix>/<random>.jpg and <prefix>/<random>.thumb.jpg. */
  displayKey: string;
  thumbnailKey: string;
  width: number;
  height: number;
  bytes: number;
  sha256: string;
}

/** Why a file was not decoded; PhotoService turns it into the words for the person who sent it. */
export type Refusal = "heic" | "wrong-type" | "too-many-pixels" | "damaged";

export type DecodedPhoto =
  { ok: true; display: Uint8Array; thumbnail: Uint8Array; width: number; height: number } | { ok: false; refusal: Refusal };

const HEIC_BRANDS = new Set(["heic", "heix", "hevc", "hevx", "heim", "heis", "hevm", "hevs"]);
const AVIF_BRANDS = new Set(["avif", "avis"]);
const HEIC_MESSAGE =
  "This photo is in HEIC format, which we cannot read yet. On an iPhone, choose Settings › Camera › Formats › Most Compatible, or share the photo as JPEG, then try again.";
const WRONG_TYPE = "This file is not a photo we can read. Please send JPEG, PNG, WebP or AVIF images.";
const DAMAGED = "This photo could not be read: it may be damaged or only partly uploaded. Please try again.";
const TOO_MANY_PIXELS = "This image has too many pixels to process. Please send a smaller photo.";

export function refusalError(refusal: Refusal): UnsupportedMediaTypeError | UnprocessableError {
  switch (refusal) {
    case "heic":
      return new UnsupportedMediaTypeError(HEIC_MESSAGE);
    case "wrong-type":
      return new UnsupportedMediaTypeError(WRONG_TYPE);
    case "damaged":
      return new UnsupportedMediaTypeError(DAMAGED);
    case "too-many-pixels":
      return new UnprocessableError(TOO_MANY_PIXELS);
  }
}

/** The first bytes of a file, to know what it claims to be even when its header is cut off. */
async function headOf(file: string): Promise<Buffer> {
  const handle = await open(file, "r");
  try {
    const head = Buffer.alloc(16);
    const { bytesRead } = await handle.read(head, 0, 16, 0);
    return head.subarray(0, bytesRead);
  } finally {
    await handle.close();
  }
}

const brandOf = (head: Buffer): string | null =>
  head.length >= 12 && head.toString("latin1", 4, 8) === "ftyp" ? head.toString("latin1", 8, 12) : null;

/** Starts like a JPEG, PNG, WebP or AVIF file: if it cannot be read, it is damaged rather than something else. */
function looksLikeOurFormat(head: Buffer): boolean {
  if (head.length >= 3 && head[0] === 0xff && head[1] === 0xd8 && head[2] === 0xff) return true;
  if (head.length >= 8 && head.subarray(0, 8).equals(Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]))) return true;
  if (head.length >= 12 && head.toString("latin1", 0, 4) === "RIFF" && head.toString("latin1", 8, 12) === "WEBP") return true;
  const brand = brandOf(head);
  return brand !== null && AVIF_BRANDS.has(brand);
}

/**
 * Reads only the header: the pixel count an image claims, or 0 when it has no readable header.
 * Cheap whatever the size, so a request's and a user's pixel budget can be checked before decoding.
 */
export async function claimedPixels(source: string): Promise<number> {
  try {
    const meta = await sharp(source, { limitInputPixels: false }).metadata();
    return (meta.width ?? 0) * (meta.height ?? 0);
  } catch {
    return 0;
  }
}

/** Decodes `source` into a display copy and a thumbnail, both JPEG without metadata; runs on a worker thread. */
export async function decodePhoto({ source }: { source: string }): Promise<DecodedPhoto> {
  const head = await headOf(source);
  const brand = brandOf(head);
  if (brand && HEIC_BRANDS.has(brand)) return { ok: false, refusal: "heic" };

  let meta: Metadata;
  try {
    // The header only, without the pixel limit: with it, sharp refuses an oversized image here as
    // unreadable, and its sender would never learn that it is merely too large.
    meta = await sharp(source, { limitInputPixels: false }).metadata();
  } catch {
    // A JPEG or PNG cut off inside its header is damaged, not some other kind of file.
    return { ok: false, refusal: looksLikeOurFormat(head) ? "damaged" : "wrong-type" };
  }
  const isAvif = meta.format === "heif" && meta.compression === "av1";
  if (meta.format === "heif" && meta.compression === "hevc") return { ok: false, refusal: "heic" };
  if (!(meta.format === "jpeg" || meta.format === "png" || meta.format === "webp" || isAvif)) {
    return { ok: false, refusal: "wrong-type" };
  }
  if ((meta.width ?? 0) * (meta.height ?? 0) > MAX_INPUT_PIXELS) return { ok: false, refusal: "too-many-pixels" };

  try {
    // failOn "error" includes "truncated": an image whose data ends early is refused, not half-decoded.
    const display = await sharp(source, { limitInputPixels: MAX_INPUT_PIXELS, failOn: "error" })
      .rotate()
      .resize({ width: DISPLAY_MAX_PX, height: DISPLAY_MAX_PX, fit: "inside", withoutEnlargement: true })
      .jpeg({ quality: 82, mozjpeg: true })
      .toBuffer({ resolveWithObject: true });
    const thumbnail = await sharp(display.data)
      .resize({ width: THUMBNAIL_MAX_PX, height: THUMBNAIL_MAX_PX, fit: "inside", withoutEnlargement: true })
      .jpeg({ quality: 76, mozjpeg: true })
      .toBuffer();
    return { ok: true, display: display.data, thumbnail, width: display.info.width, height: display.info.height };
  } catch {
    return { ok: false, refusal: "damaged" };
  }
}

/** The words for a photo that could not be written (disk full, folder not writable…); the cause goes to the log. */
export class PhotoStorageError extends ServiceUnavailableError {
  constructor(readonly fault: unknown) {
    super(
      "Your photo could not be stored just now. Please try again later; if it keeps happening, tell your landlord's support team.",
      300,
    );
  }
}

/**
 * Writes a decoded photo into the store under `prefix` (our ids: "<organisation>/<case>") with a
 * random name. The store writes each object whole or not at all; if the thumbnail fails after the
 * display copy was written, the display copy is removed again, so a failed write (disk full, store
 * unreachable) leaves nothing behind.
 */
export async function storeDecoded(
  decoded: Extract<DecodedPhoto, { ok: true }>,
  store: ObjectStore,
  prefix: string,
): Promise<ProcessedPhoto> {
  const display = Buffer.from(decoded.display.buffer, decoded.display.byteOffset, decoded.display.byteLength);
  const thumbnail = Buffer.from(decoded.thumbnail.buffer, decoded.thumbnail.byteOffset, decoded.thumbnail.byteLength);
  const name = `${prefix ? `${prefix}/` : ""}${randomBytes(16).toString("hex")}`;
  const keys = { displayKey: `${name}.jpg`, thumbnailKey: `${name}.thumb.jpg` };
  try {
    await store.put(keys.displayKey, display, { contentType: "image/jpeg" });
    await store.put(keys.thumbnailKey, thumbnail, { contentType: "image/jpeg" });
  } catch (error) {
    await removeProcessed(store, keys).catch(() => undefined);
    throw new PhotoStorageError(error);
  }
  return {
    ...keys,
    width: decoded.width,
    height: decoded.height,
    bytes: display.length,
    sha256: createHash("sha256").update(display).digest("hex"),
  };
}

/** Decodes and stores under `destDir` on the calling thread (the benchmark's way in); refusals are thrown as 415/422. */
export async function processPhoto(source: string, destDir: string): Promise<ProcessedPhoto> {
  const decoded = await decodePhoto({ source });
  if (!decoded.ok) throw refusalError(decoded.refusal);
  const { DiskObjectStore } = await import("../../lib/storage.js");
  return storeDecoded(decoded, new DiskObjectStore(destDir), "");
}

export async function removeProcessed(store: ObjectStore, p: Pick<ProcessedPhoto, "displayKey" | "thumbnailKey">): Promise<void> {
  await Promise.all([store.delete(p.displayKey), store.delete(p.thumbnailKey)]);
}
