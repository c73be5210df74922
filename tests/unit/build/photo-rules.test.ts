// The mismatch rule for a read screen photo (lib/build/photo-rules.ts): the distance tolerance and the sentences.
// The zone counts checked by hand from Born & Wolf, Principles of Optics (7th ed.) §8.2: N = (R²/λ)(1/ρ + 1/b).
import { describe, expect, it } from "vitest";
import type { BenchDocument } from "@/lib/bench/schema";
import { photoDifferences, photoDistanceTolerance, photoSummary, zoneCountTolerance } from "@/lib/build/photo-rules";

const collimated: BenchDocument = {
  version: 1,
  elements: [
    { id: "laser", kind: "laser", positionMm: 0, wavelengthNm: 632.8, powerMw: 1, beamDiameterMm: 3 },
    { id: "iris", kind: "aperture", positionMm: 300, diameterMm: 2 },
    { id: "screen", kind: "screen", positionMm: 800 },
  ],
};
const diverging: BenchDocument = {
  version: 1,
  elements: [
    { id: "laser-1", kind: "laser", positionMm: 0, wavelengthNm: 632.8, powerMw: 1, beamDiameterMm: 0.8 },
    { id: "lens-1", kind: "lens", positionMm: 100, focalLengthMm: -25 },
    { id: "iris-1", kind: "aperture", positionMm: 400, diameterMm: 2 },
    { id: "screen-1", kind: "screen", positionMm: 1400 },
  ],
};

describe("photoDistanceTolerance", () => {
  it("a nearly collimated beam: N = R²/(λb) changes fast with b, so 5 % of the distance sets the tolerance", () => {
    // N(500 mm) = 1 / (632.8e-6 · 500) = 3.16; dN/db = N/b = 0.0063 per mm; 0.1316 zones ↔ 21 mm < 25 mm.
    expect(zoneCountTolerance(3.16)).toBeCloseTo(0.1316, 4);
    expect(photoDistanceTolerance(collimated, "iris", "screen", 500)).toEqual({ toleranceMm: 25, setBy: "share" });
  });

  it("a diverging beam: N hardly changes with b, so the photo's count accuracy sets a wider tolerance", () => {
    // ρ ≈ 325 mm at the iris (virtual source 25 mm before the lens); N(1000) ≈ 1580 (1/325 + 1/1000) ≈ 6.44;
    // dN/db = 1580 / 1000² = 0.00158 per mm; (0.1 + 0.0644) / 0.00158 ≈ 104 mm.
    const t = photoDistanceTolerance(diverging, "iris-1", "screen-1", 1000);
    expect(t.setBy).toBe("zone-count");
    expect(t.toleranceMm).toBeGreaterThan(95);
    expect(t.toleranceMm).toBeLessThan(115);
  });
});

describe("photoDifferences", () => {
  const prediction = { apertureId: "iris", centre: "dark" as const, drawnDistanceMm: 500, zoneCount: 3.16 };
  it("agrees within the tolerance and with the same centre", () => {
    expect(photoDifferences(prediction, { centre: "dark", screenDistanceMm: 520, zoneCount: 3.04 }, 25)).toEqual([]);
  });
  it("a centre of the other brightness is a mismatch; between is never called one", () => {
    expect(photoDifferences(prediction, { centre: "bright", screenDistanceMm: 500, zoneCount: 3.16 }, 25)).toEqual(["Centre: predicted dark, the photo shows bright."]);
    expect(photoDifferences(prediction, { centre: "between", screenDistanceMm: 500, zoneCount: 3.16 }, 25)).toEqual([]);
  });
  it("a distance beyond the tolerance says by how much and which way", () => {
    const [reason] = photoDifferences(prediction, { centre: "dark", screenDistanceMm: 450, zoneCount: 3.51 }, 25);
    expect(reason).toBe("Screen distance: drawn 500 mm behind iris, the photo's pattern fits 450 mm (50 mm nearer; allowed ±25 mm), 3.51 half-period zones against 3.16 predicted.");
  });
  it("the summary kept as the observation's note", () => {
    expect(photoSummary("s.png", prediction, { centre: "dark", screenDistanceMm: 503.2, zoneCount: 3.141, quality: 0.934 })).toBe(
      'Read from the screen photo "s.png": 3.14 half-period zones (predicted 3.16), dark centre, the screen about 503 mm behind iris (drawn 500 mm); confidence 93 %.',
    );
  });
});
