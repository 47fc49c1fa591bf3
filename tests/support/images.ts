// Real image files made with sharp for the photo tests.
import { deflateSync } from "node:zlib";
import sharp from "sharp";

/** A JPEG with EXIF that includes a GPS position and a camera model, as phones write them. */
export function jpegWithGps(width = 1200, height = 900, seed = 0): Promise<Buffer> {
  return sharp({ create: { width, height, channels: 3, background: { r: 90 + seed, g: 110, b: 100 } } })
    .jpeg()
    .withExif({
      IFD0: { Make: "TestCam", Model: "Dewline Test Phone", Orientation: "1" },
      IFD3: { GPSLatitudeRef: "N", GPSLatitude: "51/1 30/1 2647/100", GPSLongitudeRef: "W", GPSLongitude: "0/1 7/1 3932/100" },
    })
    .toBuffer();
}

export function png(width = 640, height = 480): Promise<Buffer> {
  return sharp({ create: { width, height, channels: 4, background: { r: 10, g: 20, b: 200, alpha: 1 } } })
    .png()
    .toBuffer();
}

/** A JPEG stored sideways with EXIF Orientation 6 (rotate 90° clockwise to display). */
export function sidewaysJpeg(): Promise<Buffer> {
  return sharp({ create: { width: 400, height: 200, channels: 3, background: "#808080" } })
    .jpeg()
    .withMetadata({ orientation: 6 })
    .toBuffer();
}

/** The first bytes of an HEIC file (ftyp box with the heic brand). */
export const heicHeader = Buffer.concat([Buffer.from([0, 0, 0, 24]), Buffer.from("ftypheic", "latin1"), Buffer.alloc(64)]);

/** A real JPEG cut off after `fraction` of its bytes, as when an upload breaks off part way. */
export async function truncatedJpeg(fraction = 0.6): Promise<Buffer> {
  const full = await sharp({
    create: { width: 1600, height: 1200, channels: 3, background: "#808080", noise: { type: "gaussian", mean: 128, sigma: 30 } },
  })
    .jpeg()
    .toBuffer();
  return full.subarray(0, Math.floor(full.length * fraction));
}

const CRC_TABLE = Array.from({ length: 256 }, (_, n) => {
  let c = n;
  for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
  return c >>> 0;
});
function crc32(bytes: Buffer): number {
  let c = 0xffffffff;
  for (const b of bytes) c = CRC_TABLE[(c ^ b) & 0xff]! ^ (c >>> 8);
  return (c ^ 0xffffffff) >>> 0;
}
function pngChunk(type: string, data: Buffer): Buffer {
  const body = Buffer.concat([Buffer.from(type, "latin1"), data]);
  const length = Buffer.alloc(4);
  length.writeUInt32BE(data.length);
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(crc32(body));
  return Buffer.concat([length, body, crc]);
}

/**
 * A PNG whose header claims `width` × `height` pixels (e.g. 30 000 × 30 000 = 900 megapixels) but
 * holds only a few bytes of image data: enough for a reader of its header, cheap to make and send.
 */
export function pngClaiming(width: number, height: number): Buffer {
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(width, 0);
  ihdr.writeUInt32BE(height, 4);
  ihdr.writeUInt8(8, 8); // bit depth
  ihdr.writeUInt8(2, 9); // colour type: RGB
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    pngChunk("IHDR", ihdr),
    pngChunk("IDAT", deflateSync(Buffer.alloc(64))),
    pngChunk("IEND", Buffer.alloc(0)),
  ]);
}

/** A real, solid-colour PNG of `megapixels` (small on the wire, but a full decode's worth of pixels). */
export function bigPng(megapixels: number): Promise<Buffer> {
  const side = Math.round(Math.sqrt(megapixels * 1_000_000));
  return sharp({ create: { width: side, height: side, channels: 3, background: { r: 120, g: 130, b: 140 } } })
    .png({ compressionLevel: 9 })
    .toBuffer();
}
