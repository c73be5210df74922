// The screen pattern behind an aperture on a table (lib/optics/table-profile.ts) against the rail's screenProfile of
// the same bench laid straight: a flat mirror changes the direction, not the beam (Siegman, Lasers, 1986, §15.1), and the
// profile is normalised to the unobstructed intensity there, so the mirror's absorbed share cancels.
import { describe, expect, it } from "vitest";
import type { BenchDocument } from "@/lib/bench/schema";
import type { BenchDocumentV2 } from "@/lib/bench/schema-v2";
import { analyzeBench, OpticsInputError, screenProfile } from "@/lib/optics";
import { tableScreenProfile } from "@/lib/optics/table-profile";

const rail: BenchDocument = {
  version: 1,
  elements: [
    { id: "laser", kind: "laser", positionMm: 0, wavelengthNm: 632.8, powerMw: 1, beamDiameterMm: 0.8 },
    { id: "lens", kind: "lens", positionMm: 100, focalLengthMm: -25 },
    { id: "iris", kind: "aperture", positionMm: 400, diameterMm: 2 },
    { id: "screen", kind: "screen", positionMm: 1400 },
  ],
};

// the same distances folded once: laser → 200 mm → mirror → 200 mm → iris → 1000 mm → screen
const folded: BenchDocumentV2 = {
  version: 2,
  table: { widthMm: 1500, depthMm: 1500, holePitchMm: 25 },
  elements: [
    { id: "laser", kind: "laser", xMm: 100, yMm: 100, angleDeg: 0, wavelengthNm: 632.8, powerMw: 1, beamDiameterMm: 0.8 },
    { id: "lens", kind: "lens", xMm: 200, yMm: 100, angleDeg: 0, focalLengthMm: -25 },
    { id: "M1", kind: "mirror", xMm: 300, yMm: 100, angleDeg: 135 },
    { id: "iris", kind: "aperture", xMm: 300, yMm: 300, angleDeg: 270, diameterMm: 2 },
    { id: "screen", kind: "screen", xMm: 300, yMm: 1300, angleDeg: 270 },
  ],
};

describe("the screen pattern behind an aperture on a table", () => {
  it("equals the straight rail's pattern at the same unfolded distances", () => {
    const radiiMm = [0, 0.5, 1, 1.5, 2, 3];
    const straight = screenProfile(rail, "iris", { radiiMm });
    const table = tableScreenProfile(folded, analyzeBench(folded), "iris", { radiiMm });
    expect(table.pathId).toBe("p2");
    expect(table.screenId).toBe("screen");
    table.relativeIntensity.forEach((v, i) => expect(v).toBeCloseTo(straight.relativeIntensity[i], 9));
  });

  it("says plainly when the aperture is not lit", () => {
    const dark: BenchDocumentV2 = { ...folded, elements: folded.elements.map((e) => (e.id === "M1" ? { ...e, angleDeg: 90 } : e)) };
    expect(() => tableScreenProfile(dark, analyzeBench(dark), "iris")).toThrow(OpticsInputError);
    expect(() => tableScreenProfile(dark, analyzeBench(dark), "iris")).toThrow(/No light reaches an aperture "iris"/);
  });
});
