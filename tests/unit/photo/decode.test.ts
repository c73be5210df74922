// Decoding a stored screen photo on the server (lib/server/photo-decode.ts): PNG and JPEG to 8-bit RGBA, the EXIF
// orientation applied (TIFF 6.0, tag 274: 6 = the stored picture must be turned 90° clockwise to stand upright,
// 8 = 90° anticlockwise, 3 = 180°, 2/4 mirrored), sizes read from the header before decoding, anything else refused.
import jpeg from "jpeg-js";
import { PNG } from "pngjs";
import { describe, expect, it } from "vitest";
import { applyOrientation, decodePhoto, PhotoDecodeError } from "@/lib/server/photo-decode";
import { readScreenPhoto } from "@/lib/optics";
import { benchDocument, defaultPhoto, renderPhoto, truePattern, type SyntheticBench } from "./render";

function rgba(w: number, h: number, value: (x: number, y: number) => number): Uint8Array {
  const data = new Uint8Array(w * h * 4);
  for (let y = 0; y < h; y++) for (let x = 0; x < w; x++) {
    const v = value(x, y);
    data.set([v, v, v, 255], 4 * (y * w + x));
  }
  return data;
}

function png(w: number, h: number, data: Uint8Array): Buffer {
  const out = new PNG({ width: w, height: h });
  out.data = Buffer.from(data);
  return PNG.sync.write(out);
}

/** An APP1 EXIF segment holding only the orientation tag (big-endian TIFF, one IFD entry of type SHORT). */
function exifOrientation(orientation: number): Buffer {
  const tiff = Buffer.from([0x4d, 0x4d, 0x00, 0x2a, 0, 0, 0, 8, 0, 1, 0x01, 0x12, 0, 3, 0, 0, 0, 1, 0, orientation, 0, 0, 0, 0, 0, 0]);
  const body = Buffer.concat([Buffer.from("Exif\0\0", "latin1"), tiff]);
  const head = Buffer.from([0xff, 0xe1, 0, 0]);
  head.writeUInt16BE(body.length + 2, 2);
  return Buffer.concat([head, body]);
}

function jpegWithOrientation(w: number, h: number, data: Uint8Array, orientation: number): Buffer {
  const encoded = jpeg.encode({ width: w, height: h, data: Buffer.from(data) }, 95).data;
  return Buffer.concat([encoded.subarray(0, 2), exifOrientation(orientation), encoded.subarray(2)]);
}

const grey = (image: { widthPx: number; data: Uint8Array | Uint8ClampedArray }, x: number, y: number) => image.data[4 * (y * image.widthPx + x)];

describe("decodePhoto", () => {
  it("decodes a PNG to the same RGBA pixels", async () => {
    const data = rgba(40, 36, (x, y) => (x * 5 + y * 3) % 256);
    const decoded = await decodePhoto(png(40, 36, data));
    expect(decoded).toMatchObject({ widthPx: 40, heightPx: 36, format: "png", orientation: 1 });
    expect(Buffer.from(decoded.data).equals(Buffer.from(data))).toBe(true);
  });

  it("turns a JPEG as its EXIF orientation says (6: a quarter turn clockwise)", async () => {
    // Stored 64 wide × 48 high, the left half white: turned clockwise, the left side comes to the top.
    const data = rgba(64, 48, (x) => (x < 32 ? 255 : 0));
    const decoded = await decodePhoto(jpegWithOrientation(64, 48, data, 6));
    expect(decoded).toMatchObject({ widthPx: 48, heightPx: 64, format: "jpeg", orientation: 6 });
    expect(grey(decoded, 24, 5)).toBeGreaterThan(200);
    expect(grey(decoded, 24, 58)).toBeLessThan(50);
    const upright = await decodePhoto(jpegWithOrientation(64, 48, data, 1));
    expect(upright).toMatchObject({ widthPx: 64, heightPx: 48, orientation: 1 });
    expect(grey(upright, 5, 24)).toBeGreaterThan(200);
  }, 30_000);

  it("applies each of the eight orientations to a 3 × 2 picture as the TIFF 6.0 table says", () => {
    // Pixels a b c / d e f stored; what a viewer shows for each orientation, row by row.
    const stored = { widthPx: 3, heightPx: 2, data: Uint8Array.from([1, 2, 3, 4, 5, 6].flatMap((v) => [v, 0, 0, 255])) };
    const shown: Record<number, number[][]> = {
      1: [[1, 2, 3], [4, 5, 6]],
      2: [[3, 2, 1], [6, 5, 4]],
      3: [[6, 5, 4], [3, 2, 1]],
      4: [[4, 5, 6], [1, 2, 3]],
      5: [[1, 4], [2, 5], [3, 6]],
      6: [[4, 1], [5, 2], [6, 3]],
      7: [[6, 3], [5, 2], [4, 1]],
      8: [[3, 6], [2, 5], [1, 4]],
    };
    for (const [orientation, rows] of Object.entries(shown)) {
      const out = applyOrientation(stored, Number(orientation));
      const got = Array.from({ length: out.heightPx }, (_, y) => Array.from({ length: out.widthPx }, (_, x) => out.data[4 * (y * out.widthPx + x)]));
      expect(got, `orientation ${orientation}`).toEqual(rows);
    }
  });

  it("refuses what is not a PNG or JPEG, a picture too large (from its header), too small or damaged", async () => {
    await expect(decodePhoto(Buffer.from("%PDF-1.4 not a photo"))).rejects.toMatchObject({ code: "not-an-image" });
    const header = png(40, 40, rgba(40, 40, () => 128));
    const huge = Buffer.from(header);
    huge.writeUInt32BE(9000, 16);
    huge.writeUInt32BE(9000, 20);
    await expect(decodePhoto(huge)).rejects.toMatchObject({ code: "too-large", message: expect.stringMatching(/9000 × 9000 pixels/) });
    const tiny = png(20, 20, rgba(20, 20, () => 128));
    await expect(decodePhoto(tiny)).rejects.toMatchObject({ code: "too-small" });
    await expect(decodePhoto(Buffer.concat([header.subarray(0, 33), Buffer.alloc(100, 0x55)]))).rejects.toBeInstanceOf(PhotoDecodeError);
    // A JPEG whose frame header claims 20000 × 20000 pixels.
    const big = Buffer.from(jpeg.encode({ width: 40, height: 40, data: Buffer.from(rgba(40, 40, () => 100)) }, 90).data);
    const sof = big.indexOf(Buffer.from([0xff, 0xc0]));
    big.writeUInt16BE(20000, sof + 5);
    big.writeUInt16BE(20000, sof + 7);
    await expect(decodePhoto(big)).rejects.toMatchObject({ code: "too-large" });
  });

  it("a rendered screen photo, stored as a JPEG turned on its side, is read with the centre where the viewer sees it", async () => {
    const bench: SyntheticBench = { wavelengthNm: 632.8, beamDiameterMm: 3, lenses: [], aperturePositionMm: 300, apertureDiameterMm: 2, screenDistanceMm: 500 };
    const photo = renderPhoto(bench, defaultPhoto({ widthPx: 480, heightPx: 360, centrePx: { x: 200.5, y: 170.5 }, mmPerPixel: truePattern(bench).shadowRadiusMm / 120, seed: 4 }));
    const decoded = await decodePhoto(jpegWithOrientation(480, 360, Uint8Array.from(photo.data), 6));
    expect(decoded).toMatchObject({ widthPx: 360, heightPx: 480 });
    const reading = readScreenPhoto(decoded, { doc: benchDocument(bench, 500), apertureId: "iris" });
    // Turned clockwise: stored (x, y) shows at (h − y, x) in pixel-centre coordinates.
    expect(Math.hypot(reading.centrePx.x - (360 - 170.5), reading.centrePx.y - 200.5)).toBeLessThan(2);
    expect(Math.abs(reading.zoneCount - truePattern(bench).fresnelNumber)).toBeLessThan(0.15);
  }, 60_000);
});
