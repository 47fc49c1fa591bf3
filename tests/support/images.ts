// Real image files made with sharp for the photo tests.
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
