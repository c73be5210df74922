// Several lines per laser (sum of fractions, ANSI Z136.1-2014 §8.2.4 / Table 4 and IEC 60825-1:2014 §4.3 / Table 1, from memory),
// filter OD per band, diffuse viewing as an extended source (C_E, ANSI Z136.1-2014 Table 6, from memory) and the skin near foci
// (ANSI Z136.1-2014 Table 7, from memory); property tests with fixed seeds. Expected values recomputed by hand beside each check.
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { laserBeamPowerMw } from "@/lib/bench/laser-power";
import { benchDocumentSchema, type BenchDocument, type BenchElement } from "@/lib/bench/schema";
import { assessBeam, assessBench, assessLaserLines, correctionCE, type BenchBeam } from "@/lib/safety";
import { classRank } from "@/lib/safety/types";

const avgOver = (pW: number, wCm: number, rCm: number) => (pW * (1 - Math.exp((-2 * rCm * rCm) / (wCm * wCm)))) / (Math.PI * rCm * rCm);

describe("assessLaserLines: a doubled Nd:YAG with its residual 1064 nm and 808 nm pump", () => {
  const input = { wavelengthNm: 532, powerMw: 1000, beamDiameterMm: 2, divergenceMrad: 1, lines: [{ wavelengthNm: 1064, powerMw: 500 }, { wavelengthNm: 808, powerMw: 200 }] };
  const r = assessLaserLines(input);

  it("per line MPE by ANSI Z136.1-2014 Table 5a at each line's default exposure (from memory)", () => {
    // 532 nm, 0.25 s: 1.8e-3·0.25^0.75/0.25; 1064 nm, 10 s: 9e-3·10^0.75/10; 808 nm, 10 s: 1.8e-3·10^(0.002·108)·10^0.75/10
    expect(r.lines[0].mpeWPerCm2).toBeCloseTo((1.8e-3 * 0.25 ** 0.75) / 0.25, 10);
    expect(r.lines[1].mpeWPerCm2).toBeCloseTo((9e-3 * 10 ** 0.75) / 10, 10);
    expect(r.lines[2].mpeWPerCm2).toBeCloseTo((1.8e-3 * 10 ** 0.216 * 10 ** 0.75) / 10, 10);
  });

  it("all three act on the retina: each line's OD is log10(3·E/MPE), so the fractions after the eyewear sum to 1", () => {
    let sum = 0;
    for (const l of r.lines) {
      const E = avgOver(l.powerMw / 1000, 0.1, 0.35);
      expect(l.group).toBe("retina");
      expect(l.linesInGroup).toBe(3);
      expect(l.opticalDensityRequired).toBeCloseTo(Math.log10((3 * E) / (l.mpeWPerCm2 as number)), 6);
      sum += (E * 10 ** -l.opticalDensityRequired) / (l.mpeWPerCm2 as number);
    }
    expect(sum).toBeCloseTo(1, 9);
    expect(r.notes[0]).toMatch(/ANSI Z136\.1-2014 §8\.2\.4/);
    expect(r.notes[0]).toMatch(/IEC 60825-1:2014 §4\.3/);
  });

  it("the class over all lines is never below a line's own class; a UV line does not raise the retinal lines' OD", () => {
    expect(classRank(r.hazardClass)).toBeGreaterThanOrEqual(Math.max(...r.lines.map((l) => classRank(l.hazardClass))));
    const withUv = assessLaserLines({ ...input, lines: [...input.lines, { wavelengthNm: 355, powerMw: 10 }] });
    expect(withUv.lines[0].opticalDensityRequired).toBeCloseTo(r.lines[0].opticalDensityRequired, 12);
    expect(withUv.lines[3].group).toBe("cornea-lens");
  });

  it("two visible lines each within Class 2 add up to Class 3R (sum of fractions of the 1 mW Class 2 limit)", () => {
    const one = assessBeam({ wavelengthNm: 532, powerMw: 0.7, beamDiameterMm: 1, divergenceMrad: 0.5 });
    expect(one.hazardClass).toBe("2");
    const two = assessLaserLines({ wavelengthNm: 532, powerMw: 0.7, beamDiameterMm: 1, divergenceMrad: 0.5, lines: [{ wavelengthNm: 633, powerMw: 0.7 }] });
    expect(two.hazardClass).toBe("3R");
  });

  it("refuses a line with a bad wavelength, naming the field", () => {
    expect(() => assessLaserLines({ ...input, lines: [{ wavelengthNm: 100, powerMw: 1 }] })).toThrow(/Line wavelength/);
  });
});

/** The beam at each element from the Gaussian q-parameter (stand-in for the optics engine), filters by their single OD. */
function handBeam(doc: BenchDocument): BenchBeam {
  const laser = doc.elements[0];
  if (laser.kind !== "laser") throw new Error("laser first");
  const λm2 = laser.wavelengthNm * 1e-6 * (laser.m2 ?? 1);
  const w0 = laser.beamDiameterMm / 2;
  let re = 0;
  let im = (Math.PI * w0 * w0) / λm2;
  let pos = laser.positionMm;
  let power = laserBeamPowerMw(laser);
  return {
    elements: doc.elements.map((e) => {
      if (e.kind === "laser") return { id: e.id, kind: e.kind, positionMm: e.positionMm, incident: { radiusMm: w0, wavefrontRadiusMm: null, powerMw: power } };
      re += e.positionMm - pos;
      pos = e.positionMm;
      const d = re * re + im * im;
      let invRe = re / d;
      const invIm = -im / d;
      const w = Math.sqrt(-λm2 / (Math.PI * invIm));
      const incident = { radiusMm: w, wavefrontRadiusMm: Math.abs(invRe) < 1e-15 ? null : 1 / invRe, powerMw: power };
      if (e.kind === "lens") {
        invRe -= 1 / e.focalLengthMm;
        const dd = invRe * invRe + invIm * invIm;
        re = invRe / dd;
        im = -invIm / dd;
      } else if (e.kind === "filter") power *= 10 ** -e.opticalDensity;
      return { id: e.id, kind: e.kind, positionMm: e.positionMm, incident };
    }),
  };
}

describe("assessBench with lines, filter bands, diffuse viewing and skin near foci", () => {
  const laser: BenchElement = { id: "L", kind: "laser", positionMm: 0, wavelengthNm: 532, powerMw: 2000, beamDiameterMm: 2, lines: [{ wavelengthNm: 1064, powerMw: 300 }] };
  const doc: BenchDocument = {
    version: 1,
    elements: [
      laser,
      // OD 6 at 532 nm (the single OD) but transparent (OD 0) across 1000–1100 nm
      { id: "F", kind: "filter", positionMm: 100, opticalDensity: 6, opticalDensityBands: [{ fromNm: 1000, toNm: 1100, opticalDensity: 0 }] },
      { id: "S", kind: "screen", positionMm: 300 },
    ],
  };
  const s = assessBench(doc, handBeam(doc));

  it("the 1064 nm line passes the filter whose band is open there: its OD at the screen is that of the unfiltered line", () => {
    const screen = s.points.find((p) => p.elementId === "S" && p.where === "element");
    const line1064 = screen?.lines?.[1];
    expect(line1064?.wavelengthNm).toBe(1064);
    expect(line1064?.powerMw).toBeCloseTo(300, 6);
    // the 532 nm line is down by 10⁶
    expect(screen?.lines?.[0].powerMw).toBeCloseTo(2000e-6, 9);
    expect(s.lasers[0].lines.map((l) => l.wavelengthNm)).toEqual([532, 1064]);
    expect(s.lasers[0].lines[1].opticalDensityRequired).toBeGreaterThan(0);
  });

  it("laser.hazardClass is the class over all lines (a screen reading it never sees the lower main-line class)", () => {
    const weak: BenchDocument = {
      version: 1,
      elements: [
        { id: "L", kind: "laser", positionMm: 0, wavelengthNm: 532, powerMw: 0.5, beamDiameterMm: 1, lines: [{ wavelengthNm: 1064, powerMw: 100 }] },
        { id: "B", kind: "beam-block", positionMm: 100 },
      ],
    };
    const r = assessBench(weak, handBeam(weak), { labelClass: "2" });
    // 0.5 mW at 532 nm alone is Class 2; 100 mW at 1064 nm is above 5 × 1.95 mW (IEC 60825-1:2014 Table 3, from memory) → 3B
    expect(r.lines.lines[0].hazardClass).toBe("2");
    expect(r.hazardClass).toBe("3B");
    expect(r.laser.hazardClass).toBe("3B");
    expect(r.laser.figures.hazardClass.value).toBe("3B");
    expect(r.warnings.some((w) => w.code === "label-class-mismatch")).toBe(true);
  });

  it("a diffuse spot is an extended source: C_E = α/1.5 mrad with α = spot ÷ 100 mm", () => {
    const v = s.diffuseViewing.find((d) => d.elementId === "S" && d.wavelengthNm === 1064);
    expect(v).toBeDefined();
    const α = ((v?.spotDiameterMm ?? 0) / 100) * 1000;
    expect(v?.angularSubtenseMrad).toBeCloseTo(α, 9);
    expect(v?.cE).toBeCloseTo(correctionCE(α), 12);
    // E = P/(π r²) with r = 10 cm, ρ = 1 (Lambertian, on the normal); 1064 nm, two lines in the retinal group share k = 2
    expect(v?.irradianceWPerCm2).toBeCloseTo((0.3 * 2) / (Math.PI * 100), 9);
    expect(correctionCE(1)).toBe(1);
    expect(correctionCE(30)).toBeCloseTo(20, 12);
    expect(correctionCE(200)).toBeCloseTo((200 * 200) / 150, 9);
  });

  it("the skin near the focus of a Class 4 beam is flagged against the skin MPE over 3.5 mm", () => {
    const focused: BenchDocument = {
      version: 1,
      elements: [
        { id: "L", kind: "laser", positionMm: 0, wavelengthNm: 1064, powerMw: 5000, beamDiameterMm: 3 },
        { id: "f", kind: "lens", positionMm: 100, focalLengthMm: 50 },
        { id: "B", kind: "beam-block", positionMm: 300 },
      ],
    };
    const r = assessBench(focused, handBeam(focused));
    expect(r.hazardClass).toBe("4");
    const focus = r.skinHazards.find((h) => h.where === "focus");
    expect(focus?.exceedsSkinMpe).toBe(true);
    // by hand: 5 W inside 3.5 mm at a ~20 µm waist ≈ 5 W/(π·0.175²) = 52 W/cm² vs skin 0.2·C_A(=5) = 1 W/cm² at 10 s
    expect(focus?.ratio).toBeGreaterThan(40);
    expect(r.warnings.some((w) => w.code === "skin-hazard-focus")).toBe(true);
    expect(focus?.source).toMatch(/not yet checked/);
  });

  it("filter bands are validated: overlaps, OD above 10, from ≥ to", () => {
    const bad = (bands: { fromNm: number; toNm: number; opticalDensity: number }[]) =>
      benchDocumentSchema.safeParse({ version: 1, elements: [{ ...laser }, { id: "F", kind: "filter", positionMm: 10, opticalDensity: 3, opticalDensityBands: bands }] });
    expect(bad([{ fromNm: 500, toNm: 600, opticalDensity: 4 }, { fromNm: 590, toNm: 700, opticalDensity: 2 }]).error?.issues[0].message).toMatch(/overlaps/);
    expect(bad([{ fromNm: 500, toNm: 600, opticalDensity: 11 }]).error?.issues[0].message).toMatch(/at most 10/);
    expect(bad([{ fromNm: 600, toNm: 500, opticalDensity: 1 }]).error?.issues[0].message).toMatch(/above its start/);
    expect(bad([{ fromNm: 500, toNm: 600, opticalDensity: 4 }, { fromNm: 600, toNm: 700, opticalDensity: 2 }]).success).toBe(true);
  });
});

describe("properties (fixed seeds)", () => {
  it("the class never falls when power, energy or rate rises", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 180, max: 20_000, noNaN: true }),
        fc.double({ min: -9, max: -1, noNaN: true }),
        fc.double({ min: 0, max: 2, noNaN: true }),
        fc.double({ min: -12, max: -3, noNaN: true }),
        fc.double({ min: 0, max: 5, noNaN: true }),
        fc.double({ min: 0.1, max: 10, noNaN: true }),
        (λ, logE, step, logτ, logF, d) => {
          const τ = 10 ** Math.max(logτ, λ < 400 || λ > 1400 ? -9 : -12);
          const f = Math.min(10 ** logF, 0.5 / τ);
          const base = { wavelengthNm: λ, beamDiameterMm: d, divergenceMrad: 1, pulseDurationS: τ, standard: "IEC 60825-1:2014" as const };
          const a = assessBeam({ ...base, pulseEnergyJ: 10 ** logE, pulseRepetitionRateHz: f }).hazardClass;
          const moreEnergy = assessBeam({ ...base, pulseEnergyJ: 10 ** (logE + step), pulseRepetitionRateHz: f }).hazardClass;
          const moreRate = assessBeam({ ...base, pulseEnergyJ: 10 ** logE, pulseRepetitionRateHz: Math.min(f * 10 ** step, 0.9 / τ) }).hazardClass;
          const single = assessBeam({ ...base, pulseEnergyJ: 10 ** logE }).hazardClass;
          const cwA = assessBeam({ wavelengthNm: λ, powerMw: 10 ** (logE + 3), beamDiameterMm: d, divergenceMrad: 1 }).hazardClass;
          const cwB = assessBeam({ wavelengthNm: λ, powerMw: 10 ** (logE + 3 + step), beamDiameterMm: d, divergenceMrad: 1 }).hazardClass;
          return classRank(moreEnergy) >= classRank(a) && classRank(moreRate) >= classRank(a) && classRank(a) >= classRank(single) && classRank(cwB) >= classRank(cwA);
        },
      ),
      { numRuns: 150, seed: 20261202 },
    );
  });

  it("the OD needed never falls when the exposure time rises", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 180, max: 1e6, noNaN: true }),
        fc.double({ min: -3, max: 4, noNaN: true }),
        fc.double({ min: -2, max: 4.4, noNaN: true }),
        fc.double({ min: 0, max: 3, noNaN: true }),
        fc.double({ min: 0.05, max: 20, noNaN: true }),
        fc.constantFrom("ANSI Z136.1-2014" as const, "IEC 60825-1:2014" as const),
        (λ, logP, logT, step, d, standard) => {
          const t1 = 10 ** logT;
          const t2 = Math.min(3e4, 10 ** (logT + step));
          const a = assessBeam({ wavelengthNm: λ, powerMw: 10 ** logP, beamDiameterMm: d, divergenceMrad: 1, exposureS: t1 }, { standard });
          const b = assessBeam({ wavelengthNm: λ, powerMw: 10 ** logP, beamDiameterMm: d, divergenceMrad: 1, exposureS: t2 }, { standard });
          return b.opticalDensityRaw >= a.opticalDensityRaw - 1e-9;
        },
      ),
      { numRuns: 400, seed: 1202 },
    );
  });

  it("adding a line never lowers the OD any line needs", () => {
    const line = fc.record({ wavelengthNm: fc.double({ min: 180, max: 20_000, noNaN: true }), powerMw: fc.double({ min: 1e-3, max: 1e4, noNaN: true }) });
    fc.assert(
      fc.property(fc.array(line, { maxLength: 3 }), line, fc.double({ min: 200, max: 11_000, noNaN: true }), (lines, extra, λ) => {
        const base = { wavelengthNm: λ, powerMw: 100, beamDiameterMm: 2, divergenceMrad: 1 };
        const before = assessLaserLines({ ...base, lines });
        const after = assessLaserLines({ ...base, lines: [...lines, extra] });
        const ok = before.lines.every((l, i) => after.lines[i].opticalDensityRequired >= l.opticalDensityRequired - 1e-12);
        return ok && after.opticalDensityRequired >= before.opticalDensityRequired - 1e-12 && classRank(after.hazardClass) >= classRank(before.hazardClass);
      }),
      { numRuns: 150, seed: 7 },
    );
  });
});
