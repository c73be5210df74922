// assessBench: OD at every element, at foci and beyond open ends; governing OD; filters/apertures lower it, focusing raises it.
// The beam is built by hand from Gaussian-beam formulas (w(z) = w0·√(1+(z/zR)²), zR = π w0²/(M² λ), thin lens on q), per the bench document contract.
import { laserBeamPowerMw } from "@/lib/bench/laser-power";
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import type { BenchDocument, BenchElement } from "@/lib/bench/schema";
import { assessBench, benchSafetyOptionsSchema, type BenchBeam, waistFrom } from "@/lib/safety/bench";
import { apertureAveragedIrradianceWPerCm2 } from "@/lib/safety/irradiance";

/** Propagate the complex beam parameter q through the bench in position order, as the optics engine would. */
function handBeam(doc: BenchDocument): BenchBeam {
  const laser = doc.elements.find((e) => e.kind === "laser");
  if (!laser || laser.kind !== "laser") throw new Error("no laser");
  const λMm = laser.wavelengthNm * 1e-6;
  const m2 = laser.m2 ?? 1;
  const w0 = laser.beamDiameterMm / 2;
  let re = 0;
  let im = (Math.PI * w0 * w0) / (m2 * λMm); // q = i·zR at the waist
  let pos = laser.positionMm;
  let power = laserBeamPowerMw(laser);
  let stopped = false;
  const sorted = [...doc.elements].sort((a, b) => a.positionMm - b.positionMm);
  return {
    elements: sorted.map((e: BenchElement) => {
      if (e.kind === "laser") return { id: e.id, kind: e.kind, positionMm: e.positionMm, incident: { radiusMm: w0, wavefrontRadiusMm: null, powerMw: power } };
      re += e.positionMm - pos;
      pos = e.positionMm;
      const d = re * re + im * im;
      let invRe = re / d;
      const invIm = -im / d; // 1/q = 1/R − i·λM²/(π w²)
      const w = Math.sqrt((-λMm * m2) / (Math.PI * invIm));
      const incident = stopped ? null : { radiusMm: w, wavefrontRadiusMm: Math.abs(invRe) < 1e-15 ? null : 1 / invRe, powerMw: power };
      if (e.kind === "lens") {
        invRe -= 1 / e.focalLengthMm;
        const dd = invRe * invRe + invIm * invIm;
        re = invRe / dd;
        im = -invIm / dd;
      } else if (e.kind === "filter") power *= 10 ** -e.opticalDensity;
      else if (e.kind === "aperture") power *= -Math.expm1((-2 * (e.diameterMm / 2) ** 2) / (w * w));
      else if (e.kind === "beam-block" || e.kind === "screen") stopped = true;
      return { id: e.id, kind: e.kind, positionMm: e.positionMm, incident };
    }),
  };
}

const laser = (over: Partial<Extract<BenchElement, { kind: "laser" }>> = {}): BenchElement => ({
  id: "L", kind: "laser", positionMm: 0, wavelengthNm: 532, powerMw: 50, beamDiameterMm: 2, ...over,
});
const bench = (...elements: BenchElement[]): BenchDocument => ({ version: 1, elements });

describe("hand-built beam", () => {
  it("matches w(z) = w0·√(1+(z/zR)²)", () => {
    // 632.8 nm, w0 = 0.4 mm: zR = π·0.16/(632.8e-6) = 794.3 mm; at z = 2000 mm: w = 0.4·√(1 + 6.340) = 1.0837 mm
    const doc = bench(laser({ wavelengthNm: 632.8, beamDiameterMm: 0.8 }), { id: "S", kind: "screen", positionMm: 2000 });
    const s = handBeam(doc).elements[1].incident;
    const zR = (Math.PI * 0.16) / 632.8e-6;
    expect(s?.radiusMm).toBeCloseTo(0.4 * Math.sqrt(1 + (2000 / zR) ** 2), 9);
    expect(s?.radiusMm).toBeCloseTo(1.0837, 3);
  });
});

describe("assessBench", () => {
  it("computes the OD at every element from E over the 7 mm aperture and the laser's MPE", () => {
    const doc = bench(laser(), { id: "F", kind: "filter", positionMm: 100, opticalDensity: 2 }, { id: "S", kind: "screen", positionMm: 500 });
    const r = assessBench(doc, handBeam(doc));
    // 532 nm, 0.25 s: MPE 2.5456e-3 W/cm². At the laser: E = 0.05 W·(1 − e^−24.5)/0.384845 cm² = 0.129922 W/cm²
    // OD = log10(0.129922/2.5456e-3) = log10(51.038) = 1.70790
    const atLaser = r.points.find((p) => p.elementId === "L");
    expect(atLaser?.opticalDensityRaw).toBeCloseTo(1.7079, 4);
    // After the OD 2 filter: 0.5 mW → OD 1.7079 − 2 = −0.2921, none required
    const atScreen = r.points.find((p) => p.elementId === "S");
    expect(atScreen?.opticalDensityRaw).toBeCloseTo(-0.2921, 3);
    expect(atScreen?.opticalDensityRequired).toBe(0);
    expect(r.governing?.elementId).toBe("L");
    expect(r.governing?.opticalDensityRequired).toBeCloseTo(1.7079, 4);
    expect(r.governing?.source).toMatch(/log10\(E\/MPE\)/);
    expect(r.openBeamEnd).toBeNull();
    expect(r.screenHazards).toHaveLength(1);
  });

  it("focusing raises the OD: an expanded beam focused by a lens governs at the focus, between elements", () => {
    // 20 mm beam: at the laser only 1 − e^(−2·3.5²/10²) = 0.2173 of 50 mW enters 7 mm → E = 0.028233 W/cm², OD 1.0450
    // f = 200 mm lens at 100 mm; the focus, ~200 mm behind it, passes the whole beam → OD 1.7079 (as the 2 mm beam above)
    const doc = bench(
      laser({ beamDiameterMm: 20 }),
      { id: "lens", kind: "lens", positionMm: 100, focalLengthMm: 200 },
      { id: "S", kind: "screen", positionMm: 600 },
    );
    const r = assessBench(doc, handBeam(doc));
    expect(r.points.find((p) => p.elementId === "L")?.opticalDensityRaw).toBeCloseTo(1.045, 3);
    expect(r.governing?.where).toBe("focus");
    expect(r.governing?.elementId).toBe("lens");
    // zR of the 10 mm waist is 590 m, so the focus sits at f = 200 mm behind the lens (within a fraction of a mm)
    expect(r.governing?.positionMm).toBeCloseTo(300, 0);
    // waist radius ≈ λf/(π w) = 532e-6·200/(π·10) = 3.387e-3 mm
    expect(r.governing?.radiusMm).toBeCloseTo(3.387e-3, 5);
    expect(r.governing?.opticalDensityRaw).toBeCloseTo(1.7079, 3);
    expect(r.lensHazards[0].elementId).toBe("lens");
    expect(r.cautions.map((c) => c.id)).toContain("focusing-optics");
  });

  it("an open beam end is flagged, and a focus beyond the last lens is assessed", () => {
    const doc = bench(laser({ beamDiameterMm: 20 }), { id: "lens", kind: "lens", positionMm: 100, focalLengthMm: 150 });
    const r = assessBench(doc, handBeam(doc));
    expect(r.openBeamEnd).toEqual({ afterElementId: "lens", positionMm: 100 });
    expect(r.warnings.map((w) => w.code)).toContain("open-beam-end");
    const focus = r.points.find((p) => p.where === "open-end-focus");
    expect(focus?.positionMm).toBeCloseTo(250, 0);
    expect(r.governing?.where).toBe("open-end-focus");
    expect(r.cautions.map((c) => c.id)).toEqual(expect.arrayContaining(["open-beam-end", "beam-termination"]));
  });

  it("nothing past a beam block is lit", () => {
    const doc = bench(laser(), { id: "B", kind: "beam-block", positionMm: 50 }, { id: "S", kind: "screen", positionMm: 100 });
    const r = assessBench(doc, handBeam(doc));
    const s = r.points.find((p) => p.elementId === "S");
    expect(s).toMatchObject({ opticalDensityRaw: null, opticalDensityRequired: 0, powerMw: 0 });
    expect(r.openBeamEnd).toBeNull();
  });

  it("passes the label class to the class check and reports a mismatch as a warning", () => {
    const doc = bench(laser(), { id: "S", kind: "screen", positionMm: 100 });
    const r = assessBench(doc, handBeam(doc), { labelClass: "3R" });
    expect(r.laser.hazardClass).toBe("3B");
    expect(r.warnings.find((w) => w.code === "label-class-mismatch")?.message).toMatch(/label says Class 3R/);
  });

  it("uses the pulsed MPE for a pulsed laser", () => {
    const doc = bench(laser({ wavelengthNm: 1064, powerMw: 100, pulseDurationS: 1e-8, pulseRepetitionRateHz: 1000 }), { id: "S", kind: "screen", positionMm: 100 });
    const r = assessBench(doc, handBeam(doc));
    expect(r.mpe.value).toBeCloseTo(2e-4, 12);
    expect(r.laser.pulsedMpe?.governingRule).toBe("pulse-train");
  });

  it("pulse fields the tables cannot take are resolved toward the stricter reading, with a warning", () => {
    // 0.5 s pulses at 10 Hz overlap: assessed as CW at the average power
    const doc = bench(laser({ pulseDurationS: 0.5, pulseRepetitionRateHz: 10 }), { id: "S", kind: "screen", positionMm: 100 });
    const r = assessBench(doc, handBeam(doc));
    expect(r.warnings.map((w) => w.code)).toContain("pulses-overlap");
    expect(r.laser.pulsedMpe).toBeNull();
    expect(r.mpe.value).toBeCloseTo(2.5456e-3, 7);
  });

  it("rejects out-of-range options through its schema with plain messages", () => {
    const parsed = benchSafetyOptionsSchema.safeParse({ exposureS: 1e6, labelClass: "IIIb" });
    expect(parsed.success).toBe(false);
    if (!parsed.success) {
      expect(parsed.error.issues.map((i) => i.message)).toEqual([
        "Exposure duration must be at most 30000 s",
        "Label class must be one of: 1, 1M, 2, 2M, 3R, 3B, 4",
      ]);
    }
  });

  it("every caution defers to the LSO; limitations are attached", () => {
    const doc = bench(laser(), { id: "S", kind: "screen", positionMm: 100 });
    const r = assessBench(doc, handBeam(doc));
    expect(r.cautions.every((c) => /laser safety officer/.test(c.finalSay))).toBe(true);
    expect(r.limitations.length).toBeGreaterThan(5);
  });

  it("waistFrom recovers a known waist from w and R", () => {
    // w0 = 0.5 mm, 1064 nm: zR = π·0.25/1.064e-3 = 738.2 mm; 1000 mm past the waist: w = 0.5·√(1+1.8351) = 0.8419 mm,
    // R = 1000·(1 + 0.5449) = 1544.9 mm
    const zR = (Math.PI * 0.25) / 1.064e-3;
    const w = 0.5 * Math.sqrt(1 + (1000 / zR) ** 2);
    const R = 1000 * (1 + (zR / 1000) ** 2);
    const waist = waistFrom({ radiusMm: w, wavefrontRadiusMm: R, powerMw: 1 }, 1064, 1);
    expect(waist.distanceMm).toBeCloseTo(-1000, 6);
    expect(waist.radiusMm).toBeCloseTo(0.5, 9);
  });
});

describe("properties", () => {
  const arbitraryBench = fc.record({
    wavelengthNm: fc.double({ min: 400, max: 1400, noNaN: true }),
    powerMw: fc.double({ min: 0.01, max: 5000, noNaN: true }),
    beamDiameterMm: fc.double({ min: 0.2, max: 30, noNaN: true }),
    lensAt: fc.double({ min: 10, max: 400, noNaN: true }),
    focalLengthMm: fc.oneof(fc.double({ min: 20, max: 1000, noNaN: true }), fc.double({ min: -500, max: -20, noNaN: true })),
    filterAt: fc.double({ min: 5, max: 400, noNaN: true }),
    filterOd: fc.double({ min: 0, max: 8, noNaN: true }),
    apertureMm: fc.double({ min: 0.5, max: 40, noNaN: true }),
  });

  const build = (p: {
    wavelengthNm: number; powerMw: number; beamDiameterMm: number; lensAt: number; focalLengthMm: number; filterAt: number; filterOd: number; apertureMm: number;
  }, withFilter: boolean, withAperture: boolean): BenchDocument => {
    const els: BenchElement[] = [
      laser({ wavelengthNm: p.wavelengthNm, powerMw: p.powerMw, beamDiameterMm: p.beamDiameterMm }),
      { id: "lens", kind: "lens", positionMm: p.lensAt, focalLengthMm: p.focalLengthMm },
      { id: "S", kind: "screen", positionMm: 800 },
    ];
    // The filter/aperture sits a hair after its nominal place so it never shares a position with the lens.
    if (withFilter) els.push({ id: "F", kind: "filter", positionMm: p.filterAt + 0.001, opticalDensity: p.filterOd });
    if (withAperture) els.push({ id: "A", kind: "aperture", positionMm: p.filterAt + 0.002, diameterMm: p.apertureMm });
    return bench(...els);
  };

  it("a filter never raises the OD anywhere downstream of it, compared with the same bench without it", () => {
    fc.assert(
      fc.property(arbitraryBench, (p) => {
        const withF = build(p, true, false);
        const without = build(p, false, false);
        const a = assessBench(withF, handBeam(withF));
        const b = assessBench(without, handBeam(without));
        const odAt = (r: typeof a, id: string) => r.points.find((x) => x.elementId === id && x.where === "element")?.opticalDensityRaw ?? -Infinity;
        return ["L", "lens", "S"].every((id) => odAt(a, id) <= odAt(b, id) + 1e-9) &&
          (a.governing?.opticalDensityRaw ?? -Infinity) <= (b.governing?.opticalDensityRaw ?? -Infinity) + 1e-9;
      }),
      { numRuns: 300 },
    );
  });

  it("a clipping aperture never raises the OD at the screen", () => {
    fc.assert(
      fc.property(arbitraryBench, (p) => {
        const withA = build(p, false, true);
        const without = build(p, false, false);
        const at = (doc: BenchDocument) => assessBench(doc, handBeam(doc)).points.find((x) => x.elementId === "S")?.opticalDensityRaw ?? -Infinity;
        return at(withA) <= at(without) + 1e-9;
      }),
      { numRuns: 300 },
    );
  });

  it("the governing OD is the maximum over all points", () => {
    fc.assert(
      fc.property(arbitraryBench, (p) => {
        const doc = build(p, true, true);
        const r = assessBench(doc, handBeam(doc));
        const max = Math.max(...r.points.map((x) => x.opticalDensityRaw ?? -Infinity));
        return r.governing !== null && r.governing.opticalDensityRaw === max;
      }),
      { numRuns: 300 },
    );
  });

  it("the aperture-averaged irradiance at a point never exceeds its peak", () => {
    fc.assert(
      fc.property(arbitraryBench, (p) => {
        const doc = build(p, true, true);
        return assessBench(doc, handBeam(doc)).points.every((x) => x.averagedIrradianceWPerCm2 <= x.peakIrradianceWPerCm2 * (1 + 1e-12));
      }),
      { numRuns: 200 },
    );
  });

  it("sanity: the E formula the bench uses is the bench document contract's", () => {
    // 5 mW, w = 5 mm, 7 mm aperture: 5e-3·(1 − e^(−2·12.25/25))/0.384845 = 5e-3·0.624689/0.384845 = 8.1162e-3 W/cm²
    expect(apertureAveragedIrradianceWPerCm2(5, 5, 7)).toBeCloseTo(8.1162e-3, 6);
  });
});
