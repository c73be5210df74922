// Decoding a stored screen photo into the 8-bit RGBA pixels readScreenPhoto takes: PNG through pngjs, JPEG through
// jpeg-js, the EXIF orientation (read by exifr) applied so the pixels stand as the person saw the photo. The size is
// checked from the file's header before any pixel is decoded, so a small file that claims a huge picture is refused
// without the memory it would need. Anything else is refused with a sentence naming the problem.
// No "server-only" guard: it holds no secrets, and the demo seed and the benchmark (plain Node) use it too.
import exifr from "exifr";
import jpeg from "jpeg-js";
import { PNG } from "pngjs";
import type { PhotoImage } from "@/lib/optics";

/** The most pixels a photo may have: a 24-megapixel camera's full frame fits; the reader needs ~12 bytes per pixel. */
export const PHOTO_MAX_PIXELS = 25_000_000;
/** The longest side accepted. */
export const PHOTO_MAX_SIDE_PX = 12_000;
/** The smallest side the reader can use. */
export const PHOTO_MIN_SIDE_PX = 32;

export type DecodedPhoto = PhotoImage & {
  format: "png" | "jpeg";
  /** The EXIF orientation found (1 = as stored, 2–8 turned or mirrored); the pixels returned already have it applied. */
  orientation: number;
};

/** Why a file could not be decoded; the message is a sentence for the person who uploaded it. */
export class PhotoDecodeError extends Error {
  constructor(
    readonly code: "not-an-image" | "too-large" | "too-small" | "damaged",
    message: string,
  ) {
    super(message);
    this.name = "PhotoDecodeError";
  }
}

const PNG_SIGNATURE = [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a];

function isPng(bytes: Uint8Array): boolean {
  return bytes.length >= 8 && PNG_SIGNATURE.every((b, i) => bytes[i] === b);
}
function isJpeg(bytes: Uint8Array): boolean {
  return bytes.length >= 3 && bytes[0] === 0xff && bytes[1] === 0xd8 && bytes[2] === 0xff;
}

/** Width and height from the PNG's IHDR chunk (it must come first, PNG specification §5.6). */
function pngSize(bytes: Buffer): { width: number; height: number } | null {
  if (bytes.length < 24 || bytes.toString("latin1", 12, 16) !== "IHDR") return null;
  return { width: bytes.readUInt32BE(16), height: bytes.readUInt32BE(20) };
}

/** Width and height from the JPEG's first start-of-frame segment (ITU T.81 §B.2.2), walking the marker segments. */
function jpegSize(bytes: Buffer): { width: number; height: number } | null {
  let at = 2;
  while (at + 4 <= bytes.length) {
    if (bytes[at] !== 0xff) return null;
    const marker = bytes[at + 1];
    if (marker === 0xff) {
      at++; // fill byte
      continue;
    }
    if (marker === 0xd8 || (marker >= 0xd0 && marker <= 0xd7) || marker === 0x01) {
      at += 2;
      continue;
    }
    const length = bytes.readUInt16BE(at + 2);
    // SOF0–SOF15 except DHT (C4), JPG (C8) and DAC (CC)
    if (marker >= 0xc0 && marker <= 0xcf && marker !== 0xc4 && marker !== 0xc8 && marker !== 0xcc) {
      if (at + 9 > bytes.length) return null;
      return { height: bytes.readUInt16BE(at + 5), width: bytes.readUInt16BE(at + 7) };
    }
    if (marker === 0xda || marker === 0xd9) return null; // scan data or the end before any frame header
    at += 2 + length;
  }
  return null;
}

function checkSize(size: { width: number; height: number } | null, kind: string): { width: number; height: number } {
  if (size === null) throw new PhotoDecodeError("damaged", `The ${kind} file is damaged: its header does not say how large the picture is.`);
  const { width, height } = size;
  if (width < PHOTO_MIN_SIDE_PX || height < PHOTO_MIN_SIDE_PX) {
    throw new PhotoDecodeError("too-small", `The photo is ${width} × ${height} pixels; it must be at least ${PHOTO_MIN_SIDE_PX} × ${PHOTO_MIN_SIDE_PX} pixels for rings to be seen.`);
  }
  if (width > PHOTO_MAX_SIDE_PX || height > PHOTO_MAX_SIDE_PX || width * height > PHOTO_MAX_PIXELS) {
    throw new PhotoDecodeError(
      "too-large",
      `The photo is ${width} × ${height} pixels (${(width * height / 1e6).toFixed(1)} megapixels); at most ${PHOTO_MAX_PIXELS / 1e6} megapixels and ${PHOTO_MAX_SIDE_PX} pixels a side can be read. Upload a smaller copy of it.`,
    );
  }
  return size;
}

/** The EXIF orientation tag (1–8), or 1 when there is none or it cannot be read. */
async function orientationOf(bytes: Buffer): Promise<number> {
  try {
    const o = await exifr.orientation(bytes);
    return typeof o === "number" && Number.isInteger(o) && o >= 1 && o <= 8 ? o : 1;
  } catch {
    return 1; // no EXIF block, or one exifr cannot parse: show the pixels as stored
  }
}

/**
 * The pixels turned and mirrored as the EXIF orientation asks (TIFF 6.0 tag 274: 1 top-left, 2 top-right, 3 bottom-right,
 * 4 bottom-left, 5 left-top, 6 right-top, 7 right-bottom, 8 left-bottom), so the result stands as a viewer shows it.
 */
export function applyOrientation(image: PhotoImage, orientation: number): PhotoImage {
  if (orientation === 1) return image;
  const { widthPx: w, heightPx: h } = image;
  const src = new Uint32Array(image.data.buffer, image.data.byteOffset, w * h);
  const swap = orientation >= 5;
  const W = swap ? h : w;
  const H = swap ? w : h;
  const out = new Uint8Array(w * h * 4);
  const dst = new Uint32Array(out.buffer);
  for (let y = 0; y < h; y++) {
    for (let x = 0; x < w; x++) {
      let X: number;
      let Y: number;
      switch (orientation) {
        case 2: X = w - 1 - x; Y = y; break;
        case 3: X = w - 1 - x; Y = h - 1 - y; break;
        case 4: X = x; Y = h - 1 - y; break;
        case 5: X = y; Y = x; break;
        case 6: X = h - 1 - y; Y = x; break;
        case 7: X = h - 1 - y; Y = w - 1 - x; break;
        default: X = y; Y = w - 1 - x; break; // 8
      }
      dst[Y * W + X] = src[y * w + x];
    }
  }
  return { widthPx: W, heightPx: H, data: out };
}

/** The photo as 8-bit RGBA pixels, top row first, turned as its EXIF orientation says; a PhotoDecodeError for anything else. */
export async function decodePhoto(bytes: Buffer): Promise<DecodedPhoto> {
  if (isPng(bytes)) {
    const { width, height } = checkSize(pngSize(bytes), "PNG");
    let png: PNG;
    try {
      png = PNG.sync.read(bytes);
    } catch (error) {
      throw new PhotoDecodeError("damaged", `The PNG file is damaged and cannot be decoded (${plain(error)}).`);
    }
    if (png.width !== width || png.height !== height) throw new PhotoDecodeError("damaged", "The PNG file is damaged: its picture does not have the size its header says.");
    const orientation = await orientationOf(bytes);
    const data = new Uint8Array(png.data.buffer, png.data.byteOffset, png.data.length);
    return { ...applyOrientation({ widthPx: width, heightPx: height, data: Uint8Array.from(data) }, orientation), format: "png", orientation };
  }
  if (isJpeg(bytes)) {
    const { width, height } = checkSize(jpegSize(bytes), "JPEG");
    let decoded: { width: number; height: number; data: Uint8Array };
    try {
      decoded = jpeg.decode(bytes, { useTArray: true, formatAsRGBA: true, maxResolutionInMP: PHOTO_MAX_PIXELS / 1e6 + 1, maxMemoryUsageInMB: 1024 });
    } catch (error) {
      throw new PhotoDecodeError("damaged", `The JPEG file is damaged or uses a kind of JPEG that cannot be decoded (${plain(error)}).`);
    }
    if (decoded.width !== width || decoded.height !== height) throw new PhotoDecodeError("damaged", "The JPEG file is damaged: its picture does not have the size its header says.");
    const orientation = await orientationOf(bytes);
    return { ...applyOrientation({ widthPx: width, heightPx: height, data: decoded.data }, orientation), format: "jpeg", orientation };
  }
  throw new PhotoDecodeError("not-an-image", "The file is not a PNG or JPEG picture (its content says otherwise, whatever its name), so it cannot be read as a photo of the screen.");
}

/** A decoder's own message, cut short and without anything that looks like a path or a stack. */
function plain(error: unknown): string {
  const message = error instanceof Error ? error.message : String(error);
  return message.split("\n")[0].replace(/\s+at\s.*$/, "").slice(0, 120) || "unknown reason";
}
