// Gaussian beam formulas and thin-lens focusing: Siegman, Lasers (1986) ch. 17 and 20; Self, Applied Optics 22, 658 (1983).
import { describe, it, expect } from "vitest";
import {
  applyAbcd,
  beamRadiusM,
  compose,
  freeSpace,
  lensQ,
  propagateQ,
  qAtWaist,
  rayleighRangeM,
  selfThinLens,
  thinLens,
  waistOf,
  wavefrontRadiusM,
} from "@/lib/optics/gaussian";
import { analyzeBench } from "@/lib/optics";

const lambda = 632.8e-9;

describe("free-space Gaussian beam (Siegman ch. 17)", () => {
  const w0 = 0.4e-3;
  const zR = rayleighRangeM(w0, lambda);
  it("zR = πw0²/λ", () => expect(zR).toBeCloseTo((Math.PI * w0 * w0) / lambda, 12));
  it("w(z) = w0 √(1 + (z/zR)²) and R(z) = z (1 + (zR/z)²)", () => {
    for (const z of [0.01, 0.3, zR, 2.5, 40]) {
      const q = propagateQ(qAtWaist(w0, lambda), z);
      expect(beamRadiusM(q, lambda)).toBeCloseTo(w0 * Math.sqrt(1 + (z / zR) ** 2), 12);
      expect((wavefrontRadiusM(q) as number) / (z * (1 + (zR / z) ** 2))).toBeCloseTo(1, 12);
    }
  });
  it("the waist has a flat wavefront (null)", () => expect(wavefrontRadiusM(qAtWaist(w0, lambda))).toBeNull());
  it("M² embedded Gaussian: W(z) = W0 √(1 + (z M²λ/πW0²)²) (Siegman ch. 17, embedded Gaussian)", () => {
    const m2 = 3;
    const q = propagateQ(qAtWaist(w0, m2 * lambda), 2);
    expect(beamRadiusM(q, m2 * lambda)).toBeCloseTo(w0 * Math.sqrt(1 + ((2 * m2 * lambda) / (Math.PI * w0 * w0)) ** 2), 12);
  });
  it("ABCD law q' = (Aq+B)/(Cq+D) agrees with step-by-step propagation (Siegman ch. 20)", () => {
    const m = compose(freeSpace(0.2), compose(thinLens(0.1), freeSpace(0.5)));
    const q0 = qAtWaist(w0, lambda);
    const a = applyAbcd(m, q0);
    const b = propagateQ(lensQ(propagateQ(q0, 0.5), 0.1), 0.2);
    expect(a.re).toBeCloseTo(b.re, 12);
    expect(a.im).toBeCloseTo(b.im, 12);
  });
});

describe("thin-lens focusing (Self 1983)", () => {
  it("waist position and size from q agree with Self's lens equation 1/(s + zR²/(s − f)) + 1/s'' = 1/f", () => {
    for (const [w0, s, f] of [
      [0.4e-3, 0.3, 0.1],
      [0.4e-3, 0.05, 0.2],
      [50e-6, 0.5, 0.05],
      [1e-3, 2, -0.05],
    ] as const) {
      const zR = rayleighRangeM(w0, lambda);
      const qOut = lensQ(propagateQ(qAtWaist(w0, lambda), s), f);
      const waist = waistOf(qOut, lambda);
      const self = selfThinLens(s, zR, f);
      expect(waist.offsetM / self.imageDistanceM).toBeCloseTo(1, 10);
      expect(waist.radiusM / (w0 * self.magnification)).toBeCloseTo(1, 10);
    }
  });
  it("a collimated beam focuses near f to w0' ≈ λf/(πw) (Siegman ch. 17, far-field focusing)", () => {
    const doc = {
      version: 1 as const,
      elements: [
        { id: "laser", kind: "laser" as const, positionMm: 0, wavelengthNm: 632.8, powerMw: 1, beamDiameterMm: 4 },
        { id: "lens", kind: "lens" as const, positionMm: 10, focalLengthMm: 100 },
        { id: "screen", kind: "screen" as const, positionMm: 400 },
      ],
    };
    const r = analyzeBench(doc);
    const focus = r.waists.find((w) => w.afterElementId === "lens");
    expect(focus).toBeDefined();
    expect(focus!.radiusMm / ((632.8e-6 * 100) / (Math.PI * 2))).toBeCloseTo(1, 3);
    expect(focus!.positionMm).toBeCloseTo(110, 0);
    expect(focus!.positionMm).toBeLessThan(110); // Self: the waist sits slightly before f
    // the envelope is dense enough to draw the focus: its minimum is within 1 % of the waist radius
    const min = Math.min(...r.envelope.map((p) => p.radiusMm));
    expect(min / focus!.radiusMm).toBeLessThan(1.01);
    expect(r.warnings.map((w) => w.code)).toContain("lens-focus-in-rayleigh-range");
  });
});
