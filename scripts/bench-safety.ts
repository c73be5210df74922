// Benchmark of the bench-level laser hazard assessment (lib/safety assessBench) on 20-element benches (a CW laser, and a
// three-line pulsed laser with a banded filter); target median ≤ 0.5 ms each.
// Run directly with `npx tsx scripts/bench-safety.ts`, or import runSafetyBench from the project's bench runner.
import { laserBeamPowerMw } from "../lib/bench/laser-power";
import { pathToFileURL } from "node:url";
import type { BenchDocument, BenchElement } from "../lib/bench/schema";
import { assessBench, type BenchBeam } from "../lib/safety/bench";
import { assessRevision } from "../lib/review/hazard";
import { twentyElementBench as twentyElementClipping } from "./bench-optics";

export type BenchFigure = { name: string; value: number; unit: string; target: string };

/** A 20-element bench: laser, expander, iris, filters, focusing lens, apertures and a screen. */
function twentyElementBench(laser?: BenchElement): BenchDocument {
  const els: BenchElement[] = [laser ?? { id: "laser", kind: "laser", positionMm: 0, wavelengthNm: 532, powerMw: 200, beamDiameterMm: 1.5, m2: 1.1 }];
  const kinds: BenchElement["kind"][] = ["lens", "lens", "aperture", "filter", "lens", "aperture", "filter", "lens", "aperture", "lens"];
  let pos = 0;
  for (let i = 0; els.length < 19; i++) {
    pos += 40;
    const kind = kinds[i % kinds.length];
    const id = `e${i}`;
    if (kind === "lens") els.push({ id, kind, positionMm: pos, focalLengthMm: i % 2 === 0 ? 100 : -50 });
    else if (kind === "aperture") els.push({ id, kind, positionMm: pos, diameterMm: 5 });
    else els.push({ id, kind: "filter", positionMm: pos, opticalDensity: 0.3, opticalDensityBands: [{ fromNm: 1000, toNm: 1100, opticalDensity: 0.1 }] });
  }
  els.push({ id: "screen", kind: "screen", positionMm: pos + 200 });
  return { version: 1, elements: els };
}

/** The beam at each element from the Gaussian q-parameter, standing in for the optics engine. */
function gaussianBeam(doc: BenchDocument): BenchBeam {
  const laser = doc.elements[0];
  if (laser.kind !== "laser") throw new Error("the first element must be the laser");
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
      const incident = { radiusMm: w, wavefrontRadiusMm: invRe === 0 ? null : 1 / invRe, powerMw: power };
      if (e.kind === "lens") {
        invRe -= 1 / e.focalLengthMm;
        const dd = invRe * invRe + invIm * invIm;
        re = invRe / dd;
        im = -invIm / dd;
      } else if (e.kind === "filter") power *= 10 ** -e.opticalDensity;
      else if (e.kind === "aperture") power *= -Math.expm1((-2 * (e.diameterMm / 2) ** 2) / (w * w));
      return { id: e.id, kind: e.kind, positionMm: e.positionMm, incident };
    }),
  };
}

/** A Q-switched, frequency-doubled laser: 532 nm at 10 mJ × 20 Hz, 8 ns, with its 1064 nm residual and 808 nm pump. */
const threeLinePulsedLaser: BenchElement = {
  id: "laser",
  kind: "laser",
  positionMm: 0,
  wavelengthNm: 532,
  pulseEnergyJ: 0.01,
  pulseRepetitionRateHz: 20,
  pulseDurationS: 8e-9,
  beamDiameterMm: 6,
  m2: 1.5,
  lines: [
    { wavelengthNm: 1064, powerMw: 50 },
    { wavelengthNm: 808, powerMw: 5 },
  ],
};

function median(run: () => void): number {
  const batch = 50;
  const samples: number[] = [];
  for (let i = 0; i < 200; i++) run(); // warm-up
  for (let s = 0; s < 60; s++) {
    const start = performance.now();
    for (let i = 0; i < batch; i++) run();
    samples.push((performance.now() - start) / batch);
  }
  samples.sort((a, b) => a - b);
  return samples[Math.floor(samples.length / 2)];
}

export async function runSafetyBench(): Promise<BenchFigure[]> {
  const doc = twentyElementBench();
  const beam = gaussianBeam(doc);
  const pulsedDoc = twentyElementBench(threeLinePulsedLaser);
  const pulsedBeam = gaussianBeam(pulsedDoc);
  const cw = median(() => assessBench(doc, beam));
  const pulsed = median(() => assessBench(pulsedDoc, pulsedBeam));
  // The whole hazard picture of a bench whose irises clip (optics, the field probe and the safety engine), as the
  // review screen, checklist and sheet compute it; fewer runs, it is slower.
  const clipping = twentyElementClipping();
  const samples: number[] = [];
  for (let i = 0; i < 5; i++) assessRevision(clipping);
  for (let i = 0; i < 41; i++) {
    const start = performance.now();
    assessRevision(clipping);
    samples.push(performance.now() - start);
  }
  samples.sort((a, b) => a - b);
  return [
    { name: "safety: assessBench, 20-element bench (median)", value: Number(cw.toFixed(4)), unit: "ms", target: "≤ 0.5 ms" },
    { name: "safety: assessBench, 20-element bench, three-line pulsed laser (median)", value: Number(pulsed.toFixed(4)), unit: "ms", target: "≤ 0.5 ms" },
    { name: "hazard picture (analyzeBench + field probe + assessBench), 20-element bench, three clipping irises (median)", value: Number(samples[20].toFixed(3)), unit: "ms", target: "none (reference)" },
  ];
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  const figures = await runSafetyBench();
  for (const f of figures) console.log(`${f.name}: ${f.value} ${f.unit} (target ${f.target})`);
}
