// The build rules without a database: sign-off status, the checklist, the comparison of an observation
// with its prediction, and which uploaded files are accepted.
import { describe, expect, it } from "vitest";
import {
  checklistFor,
  compareObservation,
  positionWithinTolerance,
  POSITION_TOLERANCE_MM,
  POWER_TOLERANCE_FRACTION,
  predictionsFor,
  safeFileName,
  signOffSentence,
  signOffStatus,
  sniffFileType,
  SPOT_TOLERANCE_FRACTION,
  whyNotSignOff,
  type Predictions,
} from "@/lib/build/rules";
import type { BenchDocument } from "@/lib/bench/schema";
import { analyzeBench } from "@/lib/optics";

const now = new Date("2026-06-01T12:00:00Z");
const later = new Date("2026-12-31T23:59:59Z");
const earlier = new Date("2026-05-01T00:00:00Z");

const doc: BenchDocument = {
  version: 1,
  title: "Pinhole check",
  elements: [
    { id: "scr", kind: "screen", positionMm: 1100 },
    { id: "hene", kind: "laser", positionMm: 0, wavelengthNm: 632.8, powerMw: 1, beamDiameterMm: 0.8 },
    { id: "iris", kind: "aperture", positionMm: 100, diameterMm: 0.3 },
  ],
};

describe("sign-off status", () => {
  it("holds only for an approved revision inside its validity, whatever the clock has marked", () => {
    expect(signOffStatus({ state: "approved", decision: { validUntil: later } }, now)).toBe("valid");
    expect(signOffStatus({ state: "approved", decision: { validUntil: earlier } }, now)).toBe("expired");
    expect(signOffStatus({ state: "expired", decision: { validUntil: later } }, now)).toBe("expired");
    expect(signOffStatus({ state: "superseded", decision: { validUntil: later } }, now)).toBe("superseded");
    expect(signOffStatus({ state: "submitted", decision: null }, now)).toBe("not-signed-off");
    expect(signOffStatus({ state: "approved", decision: null }, now)).toBe("not-signed-off");
  });
  it("says what to do in each case", () => {
    expect(signOffSentence({ number: 4, decision: { validUntil: later } }, "valid")).toBe("Signed off, valid until 31 Dec 2026."); // one date format, in the lab's time zone
    expect(signOffSentence({ number: 4, decision: { validUntil: earlier } }, "expired")).toMatch(/^The sign-off of revision 4 has expired \(it held until 1 May 2026\): do not build/);
    expect(signOffSentence({ number: 4, decision: null }, "superseded")).toMatch(/build the newer one/);
  });
});

describe("the checklist", () => {
  const items = checklistFor(doc, null);
  it("lists the elements in beam order (increasing position), then the eyewear", () => {
    const elements = items.filter((i) => i.group === "element");
    expect(elements.map((i) => i.elementId)).toEqual(["hene", "iris", "scr"]);
    const positions = elements.map((i) => i.expectedPositionMm ?? Number.NaN);
    expect(positions).toEqual([...positions].sort((a, b) => a - b));
    expect(items.at(-1)?.itemKey).toBe("eyewear");
    expect(new Set(items.map((i) => i.itemKey)).size).toBe(items.length);
  });
  it("names each kind and its settings", () => {
    expect(items.find((i) => i.elementId === "iris")?.label).toBe("Aperture (iris) iris at 100 mm");
    expect(items.find((i) => i.elementId === "hene")?.detail).toMatch(/^632.8 nm, 1 mW, beam ⌀ 0.8 mm; within ±2 mm of 0 mm$/);
  });
  it("counts a mount as placed within the tolerance, inclusive", () => {
    expect(positionWithinTolerance(100, 100 + POSITION_TOLERANCE_MM)).toBe(true);
    expect(positionWithinTolerance(100, 100 - POSITION_TOLERANCE_MM - 0.01)).toBe(false);
    expect(positionWithinTolerance(null, 3)).toBeNull();
    expect(positionWithinTolerance(100, null)).toBeNull();
  });
});

describe("predictions and the comparison", () => {
  it("takes the centre from the optics engine and a spot no smaller than the far-field Airy disc", () => {
    const p = predictionsFor(doc);
    const a = analyzeBench(doc).apertures[0];
    expect(p.apertures[0].centre).toBe(a.centre);
    // First dark ring of a circular aperture in the far field: 2 × 1.22 λ b / D (Born & Wolf, Principles of Optics, 7th ed., §8.5.2).
    const airyMm = (2 * 1.22 * 632.8e-6 * 1000) / 0.3;
    expect(p.apertures[0].spotDiameterMm ?? 0).toBeGreaterThanOrEqual(airyMm * (1 - 1e-9));
  });

  const predictions: Predictions = {
    apertures: [{ apertureId: "iris", diameterMm: 1, screenId: "scr", observationDistanceMm: 1000, fresnelNumber: 1, centre: "bright", centreIntensityRatio: 3.9, transmittedFraction: 0.5, spotDiameterMm: 4, screenPowerMw: 10 }],
    screen: null,
    problem: null,
  };
  it("finds nothing to say when the reading agrees within the tolerances", () => {
    const c = compareObservation(predictions, { apertureId: "iris", centreSeen: "bright", spotDiameterMm: 4 * (1 + SPOT_TOLERANCE_FRACTION), screenPowerMw: 10 * (1 - POWER_TOLERANCE_FRACTION) });
    expect(c.reasons).toEqual([]);
  });
  it("gives one sentence per difference", () => {
    const c = compareObservation(predictions, { apertureId: "iris", centreSeen: "dark", spotDiameterMm: 6, screenPowerMw: 5 });
    expect(c.reasons).toEqual([
      "Centre: predicted bright, seen dark.",
      "Spot or ring diameter: predicted 4 mm, measured 6 mm (more than 25 % apart).",
      "Power at the screen: predicted 10 mW, measured 5 mW (more than 20 % apart).",
    ]);
  });
  it("never calls an unclear centre a mismatch", () => {
    expect(compareObservation(predictions, { apertureId: "iris", centreSeen: "unclear" }).reasons).toEqual([]);
  });
});

describe("signing off a build", () => {
  const revision = { number: 2, state: "approved" as const, decision: { validUntil: later } };
  const done = [{ done: true, group: "element" as const, elementId: "iris", withinTolerance: true }];
  it("is allowed to the technician who started it once every item is ticked and placed", () => {
    expect(whyNotSignOff({ state: "in-progress", technicianId: "t1" }, revision, done, "t1", now)).toBeNull();
  });
  it("is refused with the reason otherwise", () => {
    expect(whyNotSignOff({ state: "in-progress", technicianId: "t1" }, revision, done, "t2", now)).toMatch(/Only the technician who started/);
    expect(whyNotSignOff({ state: "in-progress", technicianId: "t1" }, revision, [{ ...done[0], done: false }], "t1", now)).toBe("1 checklist item is not ticked yet.");
    expect(whyNotSignOff({ state: "in-progress", technicianId: "t1" }, revision, [{ ...done[0], withinTolerance: false }], "t1", now)).toMatch(/^iris is not measured within ±2 mm/);
    expect(whyNotSignOff({ state: "in-progress", technicianId: "t1" }, { ...revision, state: "superseded" }, done, "t1", now)).toMatch(/replaced by a newer/);
  });
});

describe("uploaded files", () => {
  it("are recognised by their first bytes only", () => {
    // PNG signature (PNG specification, ISO/IEC 15948 §5.2); JPEG SOI marker FF D8 then a marker FF (ITU-T T.81 B.1.1.3); "%PDF-" (ISO 32000-1 §7.5.2).
    expect(sniffFileType(new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0]))?.contentType).toBe("image/png");
    expect(sniffFileType(new Uint8Array([0xff, 0xd8, 0xff, 0xe0]))?.extension).toBe("jpg");
    expect(sniffFileType(new TextEncoder().encode("%PDF-1.7"))?.contentType).toBe("application/pdf");
    expect(sniffFileType(new TextEncoder().encode("<svg>"))).toBeNull();
    expect(sniffFileType(new Uint8Array([0x89, 0x50]))).toBeNull();
  });
  it("keep a name without path separators or control characters", () => {
    // Stored as given (never a path); the route refuses NUL before this.
    expect(safeFileName("../etc/Ø «光» passwd.png", "png")).toBe("../etc/Ø «光» passwd.png");
    expect(safeFileName("", "pdf")).toBe("upload.pdf");
  });
});
