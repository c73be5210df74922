// The field chain (apertures in series, lenses between, clipping mounts) checked against an independent method of our own:
// direct 2-D quadrature of the Fresnel diffraction integral (Born & Wolf §8.3.3, Fresnel approximation; Goodman,
// Introduction to Fourier Optics (3rd ed.) eq. 4-17), Simpson's rule in ρ and the trapezoidal rule in φ, plane by
// plane, with the thin lens as its phase factor e^{−iπr²/(λf)} (Goodman eq. 5-10). No Bessel function, no Collins
// matrix and no Gauss–Legendre node is shared with lib/optics/chain.ts.
import { describe, expect, it } from "vitest";
import type { BenchDocument, BenchElement } from "@/lib/bench/schema";
import { analyzeBench, fieldPowerProbe, findScreenPositions, screenProfile } from "@/lib/optics";
import { assessBench } from "@/lib/safety";
import { buildChain } from "@/lib/optics/analyze";
import { traceBench } from "@/lib/optics/propagate";

type Field = { r: Float64Array; re: Float64Array; im: Float64Array };

/** Simpson weights on n (even) intervals of [0, R], times 2πr (the area element of an axially symmetric field). */
function simpsonGrid(radiusM: number, intervals: number): { r: Float64Array; w: Float64Array } {
  const r = new Float64Array(intervals + 1);
  const w = new Float64Array(intervals + 1);
  const h = radiusM / intervals;
  for (let i = 0; i <= intervals; i++) {
    r[i] = i * h;
    const c = i === 0 || i === intervals ? 1 : i % 2 === 1 ? 4 : 2;
    w[i] = ((c * h) / 3) * 2 * Math.PI * r[i];
  }
  return { r, w };
}

/**
 * Fresnel propagation over distance d of an axially symmetric field known on a Simpson grid, evaluated at the radii
 * of `target`: u'(x) = (1/(iλd)) e^{iπx²/(λd)} ∫∫ u(ρ) e^{iπρ²/(λd)} e^{−2πi xρcosφ/(λd)} ρ dρ dφ, the φ-integral by the
 * trapezoidal rule (exact to rounding for a periodic integrand once the node count passes the argument).
 */
function fresnel2d(source: Field & { w: Float64Array }, distanceM: number, lambda: number, targetR: Float64Array): Field {
  const n = targetR.length;
  const re = new Float64Array(n);
  const im = new Float64Array(n);
  // source × e^{iπρ²/(λd)} × weight
  const m = source.r.length;
  const sr = new Float64Array(m);
  const si = new Float64Array(m);
  for (let k = 0; k < m; k++) {
    const ph = (Math.PI * source.r[k] * source.r[k]) / (lambda * distanceM);
    const c = Math.cos(ph);
    const s = Math.sin(ph);
    sr[k] = (source.re[k] * c - source.im[k] * s) * source.w[k];
    si[k] = (source.re[k] * s + source.im[k] * c) * source.w[k];
  }
  const rMax = source.r[m - 1];
  for (let i = 0; i < n; i++) {
    const x = targetR[i];
    const argMax = (2 * Math.PI * x * rMax) / (lambda * distanceM);
    const nPhi = Math.max(16, Math.ceil(argMax) + 24);
    const cosPhi = new Float64Array(nPhi);
    for (let j = 0; j < nPhi; j++) cosPhi[j] = Math.cos((Math.PI * (j + 0.5)) / nPhi);
    let accR = 0;
    let accI = 0;
    for (let k = 0; k < m; k++) {
      const a = (2 * Math.PI * x * source.r[k]) / (lambda * distanceM);
      // (1/2π)∫₀^{2π} e^{−ia cosφ} dφ is real (the sine part cancels by symmetry): the midpoint rule on [0, π]
      let avg = 0;
      for (let j = 0; j < nPhi; j++) avg += Math.cos(a * cosPhi[j]);
      avg /= nPhi;
      accR += sr[k] * avg;
      accI += si[k] * avg;
    }
    // × 1/(iλd) × e^{iπx²/(λd)}; the 2π of the area element is in the weights, the φ average carries 1/2π
    const ph = (Math.PI * x * x) / (lambda * distanceM);
    const c = Math.cos(ph);
    const s = Math.sin(ph);
    const br = accI / (lambda * distanceM);
    const bi = -accR / (lambda * distanceM);
    re[i] = br * c - bi * s;
    im[i] = br * s + bi * c;
  }
  return { r: targetR, re, im };
}

/** A Gaussian (P = 1) of 1/e² radius w and wavefront radius R (null flat) cut at radius a, on a Simpson grid. */
function clippedGaussian(w: number, curvatureRadius: number | null, a: number, lambda: number, intervals: number): Field & { w: Float64Array } {
  const g = simpsonGrid(a, intervals);
  const re = new Float64Array(g.r.length);
  const im = new Float64Array(g.r.length);
  for (let i = 0; i < g.r.length; i++) {
    const amp = Math.sqrt(2 / (Math.PI * w * w)) * Math.exp(-(g.r[i] ** 2) / (w * w));
    const ph = curvatureRadius === null ? 0 : (Math.PI * g.r[i] ** 2) / (lambda * curvatureRadius);
    re[i] = amp * Math.cos(ph);
    im[i] = amp * Math.sin(ph);
  }
  return { r: g.r, re, im, w: g.w };
}

/** The Gaussian beam from a waist w0 at distance z (Siegman ch. 17): radius and wavefront radius. */
function gaussianAt(w0: number, lambda: number, z: number): { w: number; R: number | null } {
  const zr = (Math.PI * w0 * w0) / lambda;
  return { w: w0 * Math.sqrt(1 + (z / zr) ** 2), R: z === 0 ? null : z * (1 + (zr / z) ** 2) };
}

/** On-axis |u|² a distance b behind a field on a Simpson grid: |(1/(iλb))∫u e^{iπρ²/(λb)} 2πρ dρ|². */
function onAxisIntensity(f: Field & { w: Float64Array }, b: number, lambda: number): number {
  let re = 0;
  let im = 0;
  for (let k = 0; k < f.r.length; k++) {
    const ph = (Math.PI * f.r[k] ** 2) / (lambda * b);
    re += f.w[k] * (f.re[k] * Math.cos(ph) - f.im[k] * Math.sin(ph));
    im += f.w[k] * (f.re[k] * Math.sin(ph) + f.im[k] * Math.cos(ph));
  }
  return (re * re + im * im) / (lambda * b) ** 2;
}

const withWeights = (f: Field, radiusM: number): Field & { w: Float64Array } => ({ ...f, w: simpsonGrid(radiusM, f.r.length - 1).w });

const laser = (over: Partial<Extract<BenchElement, { kind: "laser" }>> = {}): BenchElement => ({
  id: "laser", kind: "laser", positionMm: 0, wavelengthNm: 632.8, powerMw: 5, beamDiameterMm: 4, ...over,
});

describe("two irises in series (the alignment pair)", () => {
  const lambda = 632.8e-9;
  const doc: BenchDocument = {
    version: 1,
    elements: [
      laser(),
      { id: "i1", kind: "aperture", positionMm: 100, diameterMm: 2 },
      { id: "i2", kind: "aperture", positionMm: 400, diameterMm: 1.6 },
      { id: "s", kind: "screen", positionMm: 900 },
    ],
  };
  const r = analyzeBench(doc);
  // independent: plane 1 → plane 2 by 2-D quadrature, then the on-axis integral to the screen
  const g1 = gaussianAt(2e-3, lambda, 0.1);
  const u1 = clippedGaussian(g1.w, g1.R, 1e-3, lambda, 600);
  const grid2 = simpsonGrid(0.8e-3, 400);
  const u2 = withWeights(fresnel2d(u1, 0.3, lambda, grid2.r), 0.8e-3);
  const gs = gaussianAt(2e-3, lambda, 0.9);
  const reference = 2 / (Math.PI * gs.w * gs.w);

  it("the centre at the screen matches direct 2-D quadrature of the Fresnel integral", () => {
    const independent = onAxisIntensity(u2, 0.5, lambda) / reference;
    expect(r.screens).toHaveLength(1);
    expect(r.screens[0].id).toBe("s");
    expect(Math.abs(r.screens[0].centreIntensityRatio - independent)).toBeLessThan(1e-5);
    expect(r.apertures[1].centreIntensityRatio).toBe(r.screens[0].centreIntensityRatio);
  });
  it("the second iris transmits the propagated field's share, and the screen gets that power", () => {
    let inside = 0;
    for (let k = 0; k < u2.r.length; k++) inside += u2.w[k] * (u2.re[k] ** 2 + u2.im[k] ** 2);
    const arriving = 1 - Math.exp((-2 * 1e-6) / (g1.w * g1.w));
    expect(r.apertures[1].transmittedFraction).toBeCloseTo(inside / arriving, 6);
    expect(r.screens[0].powerMw).toBeCloseTo(5 * inside, 6);
    expect(r.elements.find((e) => e.id === "s")!.incident.powerMw).toBeCloseTo(5 * inside, 6);
  });
  it("the first iris keeps its single-aperture answer (the bench document contract closed form; none downstream)", () => {
    const a = 1e-6 / (g1.w * g1.w);
    const n = (1e-6 / lambda) * (1 / g1.R! + 1 / 0.8);
    expect(r.apertures[0].centreIntensityRatio).toBe(1 - 2 * Math.exp(-a) * Math.cos(Math.PI * (n - 2 * Math.floor(n / 2))) + Math.exp(-2 * a));
  });
  it("the screen profile at r > 0 matches the 2-D quadrature too", () => {
    const radiiMm = [0.2, 0.45, 0.8];
    const p = screenProfile(doc, "i2", { radiiMm });
    const far = fresnel2d(u2, 0.5, lambda, Float64Array.from(radiiMm.map((x) => x * 1e-3)));
    radiiMm.forEach((_, i) => expect(Math.abs(p.relativeIntensity[i] - (far.re[i] ** 2 + far.im[i] ** 2) / reference)).toBeLessThan(1e-5));
  });
});

describe("aperture – lens – aperture", () => {
  const lambda = 632.8e-9;
  const doc: BenchDocument = {
    version: 1,
    elements: [
      laser({ beamDiameterMm: 3 }),
      { id: "a1", kind: "aperture", positionMm: 50, diameterMm: 2 },
      { id: "L", kind: "lens", positionMm: 200, focalLengthMm: 400 },
      { id: "a2", kind: "aperture", positionMm: 450, diameterMm: 1.2 },
      { id: "s", kind: "screen", positionMm: 700 },
    ],
  };
  it("matches two-step 2-D propagation with the lens as a phase screen", () => {
    const r = analyzeBench(doc);
    const g1 = gaussianAt(1.5e-3, lambda, 0.05);
    const u1 = clippedGaussian(g1.w, g1.R, 1e-3, lambda, 500);
    // plane 1 → lens (150 mm), the field kept to 4 mm where its tails are below 1e-4 of the peak
    const lensGrid = simpsonGrid(4e-3, 1000);
    const atLens = fresnel2d(u1, 0.15, lambda, lensGrid.r);
    for (let k = 0; k < atLens.r.length; k++) {
      const ph = (-Math.PI * atLens.r[k] ** 2) / (lambda * 0.4);
      const [re, im] = [atLens.re[k], atLens.im[k]];
      atLens.re[k] = re * Math.cos(ph) - im * Math.sin(ph);
      atLens.im[k] = re * Math.sin(ph) + im * Math.cos(ph);
    }
    const grid2 = simpsonGrid(0.6e-3, 300);
    const u2 = withWeights(fresnel2d({ ...atLens, w: lensGrid.w }, 0.25, lambda, grid2.r), 0.6e-3);
    // the unclipped Gaussian on the screen, through the same lens (Siegman ch. 20, q-parameter)
    const zr = (Math.PI * 1.5e-3 ** 2) / lambda;
    let q = { re: 0.2, im: zr };
    const inv = (z: { re: number; im: number }) => ({ re: z.re / (z.re ** 2 + z.im ** 2), im: -z.im / (z.re ** 2 + z.im ** 2) });
    const iq = inv(q);
    q = inv({ re: iq.re - 1 / 0.4, im: iq.im });
    q = { re: q.re + 0.5, im: q.im };
    const ws2 = ((q.re ** 2 + q.im ** 2) * lambda) / (Math.PI * q.im);
    const independent = onAxisIntensity(u2, 0.25, lambda) / (2 / (Math.PI * ws2));
    expect(Math.abs(r.screens[0].centreIntensityRatio - independent)).toBeLessThan(2e-4 * Math.max(1, independent));
    let inside = 0;
    for (let k = 0; k < u2.r.length; k++) inside += u2.w[k] * (u2.re[k] ** 2 + u2.im[k] ** 2);
    expect(r.screens[0].powerMw).toBeCloseTo(5 * inside, 4);
  }, 60_000); // the independent 2-D quadrature takes seconds
});

describe("a clipping iris in front of a powerful beam: safety E from the field", () => {
  const lambda = 532e-9;
  const doc: BenchDocument = {
    version: 1,
    elements: [
      laser({ wavelengthNm: 532, powerMw: 2000, beamDiameterMm: 20 }),
      { id: "iris", kind: "aperture", positionMm: 100, diameterMm: 5 },
      { id: "block", kind: "beam-block", positionMm: 1500 },
    ],
  };
  const analysis = analyzeBench(doc);
  const probe = fieldPowerProbe(doc)!;
  // independent: the field at the block by 2-D quadrature, its power inside the 7 mm pupil by Simpson's rule
  const g = gaussianAt(10e-3, lambda, 0.1);
  const u1 = clippedGaussian(g.w, g.R, 2.5e-3, lambda, 600);
  const pupil = simpsonGrid(3.5e-3, 500);
  const atBlock = fresnel2d(u1, 1.4, lambda, pupil.r);
  let insideRel = 0;
  for (let k = 0; k < pupil.r.length; k++) insideRel += pupil.w[k] * (atBlock.re[k] ** 2 + atBlock.im[k] ** 2);

  it("the power inside the 7 mm limiting aperture matches the 2-D quadrature", () => {
    expect(probe(1500, 3.5, "block")! / (2000 * insideRel)).toBeCloseTo(1, 4);
  });
  it("assessBench uses it: E at the block is several times the old rescaled-Gaussian figure", () => {
    const withField = assessBench(doc, { elements: analysis.elements, enclosedPowerMw: probe });
    const rescaled = assessBench(doc, { elements: analysis.elements });
    const at = (a: typeof withField) => a.points.find((p) => p.elementId === "block" && p.where === "element")!;
    const eField = at(withField).averagedIrradianceWPerCm2;
    const eOld = at(rescaled).averagedIrradianceWPerCm2;
    expect(eField).toBeCloseTo((2000 * insideRel * 1e-3) / (Math.PI * 0.35 ** 2), 6);
    expect(eField / eOld).toBeGreaterThan(3);
    expect(at(withField).opticalDensityRaw!).toBeGreaterThan(at(rescaled).opticalDensityRaw!);
    // upstream of the iris nothing changes
    const laserPoint = (a: typeof withField) => a.points.find((p) => p.elementId === "laser")!;
    expect(laserPoint(withField).averagedIrradianceWPerCm2).toBe(laserPoint(rescaled).averagedIrradianceWPerCm2);
  });
});

describe("edges that cut almost nothing, and pupils wider than the field (the power probe's shortcuts)", () => {
  const lambda = 632.8e-9;
  it("an iris cutting e⁻¹⁸ of the beam is no clip plane, yet the probe never falls below the field's own power (and stays within 0.1 %)", () => {
    // w = 2 mm at the iris (z_R ≈ 20 m), R = 3w: R²/w² = 9, beyond the clip limit of 8
    const doc: BenchDocument = {
      version: 1,
      elements: [laser({ beamDiameterMm: 4 }), { id: "iris", kind: "aperture", positionMm: 100, diameterMm: 12 }, { id: "block", kind: "beam-block", positionMm: 1500 }],
    };
    const probe = fieldPowerProbe(doc);
    expect(probe).toBeDefined(); // the edge's loss is carried even though it is no plane
    const g = gaussianAt(2e-3, lambda, 0.1);
    const u1 = clippedGaussian(g.w, g.R, 6e-3, lambda, 1200);
    const pupil = simpsonGrid(1e-3, 200);
    const atBlock = fresnel2d(u1, 1.4, lambda, pupil.r);
    let insideRel = 0;
    for (let k = 0; k < pupil.r.length; k++) insideRel += pupil.w[k] * (atBlock.re[k] ** 2 + atBlock.im[k] ** 2);
    const ratio = probe!(1500, 1, "block")! / (5 * insideRel);
    expect(ratio).toBeGreaterThanOrEqual(1 - 1e-6); // the independent quadrature's own error
    expect(ratio).toBeLessThan(1.001);
  }, 60_000);
  it("a pupil wider than the clipped field's extent takes all the power behind the iris: never less than the field's figure, at most 1 % more", () => {
    const doc: BenchDocument = {
      version: 1,
      elements: [laser({ wavelengthNm: 532, powerMw: 2000, beamDiameterMm: 20 }), { id: "iris", kind: "aperture", positionMm: 100, diameterMm: 5 }, { id: "block", kind: "beam-block", positionMm: 300 }],
    };
    const analysis = analyzeBench(doc);
    const transmittedMw = analysis.elements.find((e) => e.id === "iris")!.outgoingPowerMw;
    const probe = fieldPowerProbe(doc)!;
    const g = gaussianAt(10e-3, 532e-9, 0.1);
    const u1 = clippedGaussian(g.w, g.R, 2.5e-3, 532e-9, 600);
    const pupil = simpsonGrid(3.5e-3, 700);
    const atBlock = fresnel2d(u1, 0.2, 532e-9, pupil.r);
    let insideRel = 0;
    for (let k = 0; k < pupil.r.length; k++) insideRel += pupil.w[k] * (atBlock.re[k] ** 2 + atBlock.im[k] ** 2);
    const inside = probe(300, 3.5, "block")!;
    expect(inside).toBeCloseTo(transmittedMw, 9); // the shortcut: everything behind the iris
    expect(inside / (2000 * insideRel)).toBeGreaterThanOrEqual(1 - 1e-6);
    expect(inside / (2000 * insideRel)).toBeLessThan(1.01);
  }, 60_000);
});

describe("the power in a circle's sampling (5 cycles a panel)", () => {
  it("moves by at most 1e-6 of itself against 3× the panels, with lenses either side of a clipping iris", () => {
    const setups: [number, number, number | null][] = [[5, 1500, null], [6, 400, null], [6, 500, 300], [8, 300, -200], [4, 2500, 500]];
    for (const [diameterMm, blockMm, focalMm] of setups) {
      const doc: BenchDocument = {
        version: 1,
        elements: [
          laser({ wavelengthNm: 532, powerMw: 2000, beamDiameterMm: 20 }),
          { id: "iris", kind: "aperture", positionMm: 100, diameterMm },
          ...(focalMm === null ? [] : [{ id: "lens", kind: "lens" as const, positionMm: 200, focalLengthMm: focalMm }]),
          { id: "block", kind: "beam-block", positionMm: blockMm },
        ],
      };
      const at = (refinement: number) => buildChain(traceBench(doc), { refinement })!.chain.powerInsideMw(blockMm, 3.5e-3, focalMm === null ? 2 : 3)!;
      const reference = at(3);
      expect(reference).toBeGreaterThan(0);
      expect(Math.abs(at(1) / reference - 1)).toBeLessThan(1e-6);
    }
  });
});

describe("chain properties", () => {
  const base: BenchElement[] = [
    laser(),
    { id: "i1", kind: "aperture", positionMm: 100, diameterMm: 2 },
    { id: "L", kind: "lens", positionMm: 250, focalLengthMm: 300 },
    { id: "i2", kind: "aperture", positionMm: 400, diameterMm: 1.6 },
    { id: "nd", kind: "filter", positionMm: 500, opticalDensity: 0.5 },
    { id: "s", kind: "screen", positionMm: 900 },
  ];
  it("an aperture much larger than the beam changes nothing", () => {
    const plain = analyzeBench({ version: 1, elements: base });
    const wide = analyzeBench({ version: 1, elements: [...base, { id: "big", kind: "aperture", positionMm: 650, diameterMm: 200 }] });
    expect(wide.screens[0].centreIntensityRatio).toBeCloseTo(plain.screens[0].centreIntensityRatio, 12);
    expect(wide.screens[0].powerMw).toBeCloseTo(plain.screens[0].powerMw, 12);
    expect(wide.apertures.find((a) => a.id === "big")!.transmittedFraction).toBe(1);
  });
  it("reordering the elements array changes nothing", () => {
    const a = analyzeBench({ version: 1, elements: base });
    const b = analyzeBench({ version: 1, elements: [...base].reverse() });
    expect(b).toEqual(a);
  });
  it("power never grows from element to element", () => {
    const r = analyzeBench({ version: 1, elements: base });
    for (let i = 1; i < r.elements.length; i++) expect(r.elements[i].incident.powerMw).toBeLessThanOrEqual(r.elements[i - 1].incident.powerMw);
  });
  it("a far pinhole behind a wide iris gives the Airy pattern (Born & Wolf §8.5.2: I ∝ [2J₁(v)/v]²)", () => {
    const lambda = 632.8e-9;
    const doc: BenchDocument = {
      version: 1,
      elements: [
        laser({ beamDiameterMm: 30 }),
        { id: "wide", kind: "aperture", positionMm: 10, diameterMm: 95 },
        { id: "pin", kind: "aperture", positionMm: 1010, diameterMm: 0.1 },
        { id: "s", kind: "screen", positionMm: 51010 },
      ],
    };
    const p = screenProfile(doc, "pin", { radiiMm: [0, 50, 100, 150, 200] });
    const b = 50;
    const j1 = (x: number) => {
      // J1 by its integral (1/π)∫₀^π cos(τ − x sin τ) dτ, Simpson (A&S 9.1.21)
      let s = 0;
      const n = 400;
      for (let i = 0; i <= n; i++) s += (i === 0 || i === n ? 1 : i % 2 ? 4 : 2) * Math.cos((Math.PI * i) / n - x * Math.sin((Math.PI * i) / n));
      return (s * (Math.PI / n)) / 3 / Math.PI;
    };
    [50, 100, 150, 200].forEach((rMm, i) => {
      const v = (2 * Math.PI * 0.05e-3 * rMm * 1e-3) / (lambda * b);
      const airy = (2 * j1(v) / v) ** 2;
      // the pinhole holds 8e-5 zones as seen from the screen, and the wide iris (R²/w² = 10) lights it evenly: Fraunhofer
      expect(Math.abs(p.relativeIntensity[i + 1] / p.relativeIntensity[0] - airy)).toBeLessThan(0.01);
    });
  });
});

describe("clear apertures on lenses and filters", () => {
  it("a lens mount smaller than the beam clips like an aperture, with a warning", () => {
    const doc: BenchDocument = {
      version: 1,
      elements: [laser({ beamDiameterMm: 6 }), { id: "L", kind: "lens", positionMm: 100, focalLengthMm: 500, clearApertureMm: 4 }, { id: "s", kind: "screen", positionMm: 600 }],
    };
    const r = analyzeBench(doc);
    expect(r.warnings.map((w) => w.code)).toContain("clear-aperture-clips");
    const wL = r.elements.find((e) => e.id === "L")!.incident.radiusMm;
    expect(r.elements.find((e) => e.id === "s")!.incident.powerMw).toBeCloseTo(5 * (1 - Math.exp((-2 * 4) / (wL * wL))), 10);
    expect(r.screens[0].centreIntensityRatio).not.toBeCloseTo(1, 3);
    // without the mount size the lens is unlimited (version 1)
    const open = analyzeBench({ version: 1, elements: [laser({ beamDiameterMm: 6 }), { id: "L", kind: "lens", positionMm: 100, focalLengthMm: 500 }, { id: "s", kind: "screen", positionMm: 600 }] });
    expect(open.warnings.map((w) => w.code)).not.toContain("clear-aperture-clips");
    expect(open.screens[0].powerMw).toBe(5);
  });
});

describe("honest limits", () => {
  it("warns and says 'between' when the zone count is uncertain by more than 0.1 zone (R⁴/(4λb³), Born & Wolf §8.2 expanded)", () => {
    const lambda = 632.8e-9;
    const doc: BenchDocument = {
      version: 1,
      elements: [laser({ beamDiameterMm: 200 }), { id: "ap", kind: "aperture", positionMm: 0, diameterMm: 10 }, { id: "s", kind: "screen", positionMm: 80 }],
    };
    const r = analyzeBench(doc);
    const ap = r.apertures[0];
    expect(ap.nonParaxialZoneShift).toBeCloseTo((5e-3) ** 4 / (4 * lambda * 0.08 ** 3), 6);
    expect(ap.nonParaxialZoneShift).toBeGreaterThan(0.1);
    expect(ap.centre).toBe("between");
    expect(r.warnings.map((w) => w.code)).toContain("zone-count-non-paraxial");
    // far enough away the term is small and the label stands
    const far = analyzeBench({ ...doc, elements: [...doc.elements.slice(0, 2), { id: "s", kind: "screen", positionMm: 5000 }] });
    expect(far.apertures[0].nonParaxialZoneShift).toBeLessThan(0.1);
    expect(far.warnings.map((w) => w.code)).not.toContain("zone-count-non-paraxial");
  });
});

describe("the finder with several apertures", () => {
  it("searches the last iris's screen distance with the first in place, each answer checked by re-analysis", () => {
    const elements: BenchElement[] = [
      laser(),
      { id: "i1", kind: "aperture", positionMm: 100, diameterMm: 2 },
      { id: "i2", kind: "aperture", positionMm: 400, diameterMm: 1.6 },
      { id: "s", kind: "screen", positionMm: 900 },
    ];
    const found = findScreenPositions({ version: 1, elements }, "i2", { fromMm: 450, toMm: 4000, maxResults: 4 });
    expect(found.bright.length + found.dark.length).toBeGreaterThan(0);
    for (const [list, want] of [[found.bright, "bright"], [found.dark, "dark"]] as const) {
      for (const c of list) {
        const moved = analyzeBench({ version: 1, elements: elements.map((e) => (e.id === "s" ? { ...e, positionMm: c.positionMm } : e)) });
        expect(moved.screens[0].centre).toBe(want);
        expect(moved.screens[0].centreIntensityRatio).toBeCloseTo(c.centreIntensityRatio, 9);
        expect(Math.abs(moved.apertures[1].fresnelNumber)).toBeCloseTo(c.zoneCount, 6);
      }
    }
    expect(found.notes.join(" ")).toMatch(/upstream/);
  });
});
