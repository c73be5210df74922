// Counterexamples found by the property tests, kept so they stay fixed.
import { describe, expect, it } from "vitest";
import { analyzeBench } from "@/lib/optics";
import type { BenchDocument } from "@/lib/bench/schema";

describe("regressions", () => {
  it("a laser a denormal distance before an aperture gives only finite zone radii", () => {
    // Found by fast-check: the net curvature 1/ρ + 1/b underflows, so n·λ/k overflows to Infinity.
    const doc: BenchDocument = {
      version: 1,
      elements: [
        { kind: "laser", positionMm: -2.47e-321, wavelengthNm: 180, powerMw: 0.000001, beamDiameterMm: 0.00268321664073889, id: " " },
        { kind: "aperture", positionMm: 0, diameterMm: 0.05, id: "!" },
      ],
    };
    const [aperture] = analyzeBench(doc).apertures;
    expect(aperture.zoneRadiiMm.every(Number.isFinite)).toBe(true);
  });
});
