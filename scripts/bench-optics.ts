// Benchmark of the optics engine: median timings of analyzeBench and screenProfile, with the profile's error.
// Run: npx tsx scripts/bench-optics.ts (or import runOpticsBench); targets from issue 3.
import { pathToFileURL } from "node:url";
import type { BenchDocument, BenchElement } from "@/lib/bench/schema";
import { analyzeBench, screenProfile } from "@/lib/optics";
import { fresnelRadialIntensity } from "@/lib/optics/profile";
import { FieldChain, type ChainElement } from "@/lib/optics/chain";
import { qAtWaist } from "@/lib/optics/gaussian";

export type BenchFigure = { name: string; value: number; unit: string; target: string };

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : 0.5 * (s[m - 1] + s[m]);
}

function timeMedianMs(fn: () => unknown, runs: number, warmup: number): number {
  for (let i = 0; i < warmup; i++) fn();
  const times: number[] = [];
  for (let i = 0; i < runs; i++) {
    const t0 = performance.now();
    fn();
    times.push(performance.now() - t0);
  }
  return median(times);
}

/** A 20-element bench: laser, two telescopes, filters, three apertures, a screen. */
export function twentyElementBench(): BenchDocument {
  const elements: BenchElement[] = [
    { id: "laser", kind: "laser", positionMm: 0, wavelengthNm: 632.8, powerMw: 5, beamDiameterMm: 0.8 },
    { id: "nd1", kind: "filter", positionMm: 20, opticalDensity: 0.3 },
    { id: "l1", kind: "lens", positionMm: 50, focalLengthMm: -25 },
    { id: "l2", kind: "lens", positionMm: 150, focalLengthMm: 125 },
    { id: "a1", kind: "aperture", positionMm: 200, diameterMm: 3 },
    { id: "l3", kind: "lens", positionMm: 260, focalLengthMm: 100 },
    { id: "l4", kind: "lens", positionMm: 420, focalLengthMm: 60 },
    { id: "nd2", kind: "filter", positionMm: 480, opticalDensity: 1 },
    { id: "a2", kind: "aperture", positionMm: 520, diameterMm: 2 },
    { id: "l5", kind: "lens", positionMm: 600, focalLengthMm: -50 },
    { id: "l6", kind: "lens", positionMm: 700, focalLengthMm: 200 },
    { id: "nd3", kind: "filter", positionMm: 750, opticalDensity: 0.5 },
    { id: "l7", kind: "lens", positionMm: 800, focalLengthMm: 150 },
    { id: "l8", kind: "lens", positionMm: 900, focalLengthMm: -30 },
    { id: "nd4", kind: "filter", positionMm: 950, opticalDensity: 0.1 },
    { id: "l9", kind: "lens", positionMm: 1000, focalLengthMm: 250 },
    { id: "l10", kind: "lens", positionMm: 1100, focalLengthMm: -75 },
    { id: "a3", kind: "aperture", positionMm: 1200, diameterMm: 2 },
    { id: "nd5", kind: "filter", positionMm: 1300, opticalDensity: 0.2 },
    { id: "screen", kind: "screen", positionMm: 1800 },
  ];
  return { version: 1, title: "benchmark: 20 elements", elements };
}

/** The same 20 elements with every aperture opened far beyond the beam: nothing clips (issue 12's speed floor). */
export function twentyElementBenchNoClipping(): BenchDocument {
  const doc = twentyElementBench();
  return { ...doc, title: "benchmark: 20 elements, no clipping aperture", elements: doc.elements.map((e) => (e.kind === "aperture" ? { ...e, diameterMm: 200 } : e)) };
}

/** Three irises in series in a collimated 4 mm beam (N ≈ 2–6 each), a screen 1 m behind the last. */
export function threeIrisBench(): BenchDocument {
  return {
    version: 1,
    title: "benchmark: three apertures in series",
    elements: [
      { id: "laser", kind: "laser", positionMm: 0, wavelengthNm: 632.8, powerMw: 5, beamDiameterMm: 4 },
      { id: "i1", kind: "aperture", positionMm: 100, diameterMm: 2.5 },
      { id: "i2", kind: "aperture", positionMm: 350, diameterMm: 2 },
      { id: "i3", kind: "aperture", positionMm: 600, diameterMm: 1.5 },
      { id: "screen", kind: "screen", positionMm: 1600 },
    ],
  };
}

/** A wide, flat beam on a 5 mm aperture with the screen where N = 200. */
export function fresnel200Bench(): BenchDocument {
  const wavelengthNm = 632.8;
  const radiusM = 2.5e-3;
  const bMm = ((radiusM * radiusM) / (wavelengthNm * 1e-9 * 200)) * 1000;
  return {
    version: 1,
    title: "benchmark: N = 200",
    elements: [
      { id: "laser", kind: "laser", positionMm: 0, wavelengthNm, powerMw: 5, beamDiameterMm: 20 },
      { id: "ap", kind: "aperture", positionMm: 0, diameterMm: 5 },
      { id: "screen", kind: "screen", positionMm: bMm },
    ],
  };
}

export async function runOpticsBench(): Promise<BenchFigure[]> {
  const bench20 = twentyElementBench();
  const analyzeMs = timeMedianMs(() => analyzeBench(bench20), 2001, 500);

  const doc200 = fresnel200Bench();
  const fresnelNumber = analyzeBench(doc200).apertures[0].fresnelNumber;
  const profileMs = timeMedianMs(() => screenProfile(doc200, "ap", { points: 1024 }), 15, 3);

  // error against 16× the panels with the exact J0, on the same radii
  const fast = screenProfile(doc200, "ap", { points: 1024 });
  const a = (2.5 / 10) ** 2;
  const vPerMm = (2 * Math.PI * 2.5e-3) / (632.8e-9 * (doc200.elements[2].positionMm * 1e-3)) * 1e-3;
  const reference = fresnelRadialIntensity(a, fresnelNumber, fast.radiusMm.map((r) => r * vPerMm), { refinement: 16, exactBessel: true });
  let peak = 0;
  let maxError = 0;
  for (let i = 0; i < reference.length; i++) {
    peak = Math.max(peak, reference[i]);
    maxError = Math.max(maxError, Math.abs(reference[i] - fast.relativeIntensity[i]));
  }
  // issue 12: three apertures in series, centre values and a 1024-point profile at the screen
  const three = threeIrisBench();
  const seriesMs = timeMedianMs(() => {
    analyzeBench(three);
    screenProfile(three, "i3", { points: 1024 });
  }, 21, 3);
  const seriesFast = screenProfile(three, "i3", { points: 1024 });
  const laser = three.elements[0] as Extract<BenchElement, { kind: "laser" }>;
  const chainElements = three.elements.slice(1) as ChainElement[];
  const start = { positionMm: 0, q: qAtWaist(laser.beamDiameterMm * 0.5e-3, laser.wavelengthNm * 1e-9), powerMw: laser.powerMw ?? 0 };
  const fine = new FieldChain(start, chainElements, laser.wavelengthNm * 1e-9, 1, { refinement: 16, exactBessel: true });
  const seriesRef = fine.screenIntensity(3, seriesFast.radiusMm.map((r) => r * 1e-3))!.values;
  let seriesPeak = 0;
  let seriesError = 0;
  for (let i = 0; i < seriesRef.length; i++) {
    seriesPeak = Math.max(seriesPeak, seriesRef[i]);
    seriesError = Math.max(seriesError, Math.abs(seriesRef[i] - seriesFast.relativeIntensity[i]));
  }
  const seriesAnalysis = analyzeBench(three);
  const centreError = Math.max(
    ...seriesAnalysis.apertures.slice(1).map((ap, k) => Math.abs(fine.screenIntensity(k + 1, [0])!.values[0] - ap.centreIntensityRatio)),
  );
  const noClip = twentyElementBenchNoClipping();
  const noClipMs = timeMedianMs(() => analyzeBench(noClip), 2001, 500);
  return [
    { name: "analyzeBench, 20-element bench with no clipping aperture (median)", value: noClipMs, unit: "ms", target: "≤ 0.2 ms" },
    { name: "three apertures in series: analyzeBench + 1024-point screenProfile (median)", value: seriesMs, unit: "ms", target: "≤ 30 ms" },
    { name: "three apertures in series: profile max error vs 16× finer reference (exact J0)", value: seriesError / seriesPeak, unit: "of peak", target: "≤ 1e-4" },
    { name: "three apertures in series: centre values max error vs 16× finer reference", value: centreError / seriesPeak, unit: "of peak", target: "≤ 1e-4" },
    { name: "analyzeBench, 20-element bench, three clipping apertures (median)", value: analyzeMs, unit: "ms", target: "none (was ≤ 0.2 ms before the field chain)" },
    { name: `screenProfile, 1024 points at N = ${fresnelNumber.toFixed(1)} (median)`, value: profileMs, unit: "ms", target: "≤ 20 ms" },
    { name: "screenProfile max error vs 16× finer reference", value: maxError / peak, unit: "of peak", target: "≤ 1e-4" },
  ];
}

if (process.argv[1] !== undefined && import.meta.url === pathToFileURL(process.argv[1]).href) {
  runOpticsBench().then((figures) => {
    for (const f of figures) console.log(`${f.name}: ${f.value.toPrecision(3)} ${f.unit} (target ${f.target})`);
  });
}
