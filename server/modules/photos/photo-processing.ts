// The photo pipeline: decode an upload with sharp, refuse anything that is not a real JPEG, PNG,
// WebP or AVIF, auto-rotate, drop every piece of metadata (EXIF with GPS, XMP, ICC comments…),
// re-encode a display copy and a thumbnail under random names. The uploaded bytes are never kept.
import { createHash, randomBytes } from "node:crypto";
import { mkdir, open, rm, writeFile } from "node:fs/promises";
import path from "node:path";
import sharp, { type Metadata, type OutputInfo } from "sharp";
import { UnsupportedMediaTypeError, UnprocessableError } from "../../lib/errors.js";

export const DISPLAY_MAX_PX = 2048;
export const THUMBNAIL_MAX_PX = 320;
/** Larger than any phone camera today (200 MP); refuses decompression bombs before decoding. */
export const MAX_INPUT_PIXELS = 250_000_000;

export interface ProcessedPhoto {
  displayFile: string;
  thumbnailFile: string;
  width: number;
  height: number;
  bytes: number;
  sha256: string;
}

const HEIC_BRANDS = new Set(["heic", "heix", "hevc", "hevx", "heim", "heis", "hevm", "hevs"]);
const HEIC_MESSAGE =
  "This photo is in HEIC format, which we cannot read yet. On an iPhone, choose Settings › Camera › Formats › Most Compatible, or share the photo as JPEG, then try again.";
const WRONG_TYPE = "This file is not a photo we can read. Please send JPEG, PNG, WebP or AVIF images.";

async function brandOf(file: string): Promise<string | null> {
  const handle = await open(file, "r");
  try {
    const head = Buffer.alloc(12);
    await handle.read(head, 0, 12, 0);
    return head.toString("latin1", 4, 8) === "ftyp" ? head.toString("latin1", 8, 12) : null;
  } finally {
    await handle.close();
  }
}

/** Decodes `source` and writes its display copy and thumbnail into `destDir` (created if needed). */
export async function processPhoto(source: string, destDir: string): Promise<ProcessedPhoto> {
  const brand = await brandOf(source);
  if (brand && HEIC_BRANDS.has(brand)) throw new UnsupportedMediaTypeError(HEIC_MESSAGE);

  let meta: Metadata;
  try {
    meta = await sharp(source, { limitInputPixels: MAX_INPUT_PIXELS }).metadata();
  } catch {
    throw new UnsupportedMediaTypeError(WRONG_TYPE);
  }
  const isAvif = meta.format === "heif" && meta.compression === "av1";
  if (meta.format === "heif" && meta.compression === "hevc") throw new UnsupportedMediaTypeError(HEIC_MESSAGE);
  if (!(meta.format === "jpeg" || meta.format === "png" || meta.format === "webp" || isAvif)) {
    throw new UnsupportedMediaTypeError(WRONG_TYPE);
  }
  if ((meta.width ?? 0) * (meta.height ?? 0) > MAX_INPUT_PIXELS) {
    throw new UnprocessableError("This image has too many pixels to process. Please send a smaller photo.");
  }

  let display: { data: Buffer; info: OutputInfo };
  let thumbnail: Buffer;
  try {
    // failOn "error": a truncated or corrupt file is refused rather than half-decoded.
    const decoded = sharp(source, { limitInputPixels: MAX_INPUT_PIXELS, failOn: "error" }).rotate();
    display = await decoded
      .clone()
      .resize({ width: DISPLAY_MAX_PX, height: DISPLAY_MAX_PX, fit: "inside", withoutEnlargement: true })
      .jpeg({ quality: 82, mozjpeg: true })
      .toBuffer({ resolveWithObject: true });
    thumbnail = await sharp(display.data)
      .resize({ width: THUMBNAIL_MAX_PX, height: THUMBNAIL_MAX_PX, fit: "inside", withoutEnlargement: true })
      .jpeg({ quality: 76, mozjpeg: true })
      .toBuffer();
  } catch {
    throw new UnsupportedMediaTypeError(
      "This photo could not be read: it may be damaged or only partly uploaded. Please try again.",
    );
  }

  await mkdir(destDir, { recursive: true });
  const name = randomBytes(16).toString("hex");
  const displayFile = path.join(destDir, `${name}.jpg`);
  const thumbnailFile = path.join(destDir, `${name}.thumb.jpg`);
  await writeFile(displayFile, display.data, { flag: "wx" });
  await writeFile(thumbnailFile, thumbnail, { flag: "wx" });
  return {
    displayFile,
    thumbnailFile,
    width: display.info.width,
    height: display.info.height,
    bytes: display.data.length,
    sha256: createHash("sha256").update(display.data).digest("hex"),
  };
}

export async function removeProcessed(p: Pick<ProcessedPhoto, "displayFile" | "thumbnailFile">): Promise<void> {
  await Promise.all([rm(p.displayFile, { force: true }), rm(p.thumbnailFile, { force: true })]);
}
