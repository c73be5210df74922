// Benchmark of the optics engine: median timings of analyzeBench and screenProfile, with the profile's error.
// Run: npx tsx scripts/bench-optics.ts (or import runOpticsBench); targets from issue 3.
import { pathToFileURL } from "node:url";
import type { BenchDocument, BenchElement } from "@/lib/bench/schema";
import { analyzeBench, screenProfile } from "@/lib/optics";
import { fresnelRadialIntensity } from "@/lib/optics/profile";

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
  return [
    { name: "analyzeBench, 20-element bench (median)", value: analyzeMs, unit: "ms", target: "≤ 0.2 ms" },
    { name: `screenProfile, 1024 points at N = ${fresnelNumber.toFixed(1)} (median)`, value: profileMs, unit: "ms", target: "≤ 20 ms" },
    { name: "screenProfile max error vs 16× finer reference", value: maxError / peak, unit: "of peak", target: "≤ 1e-4" },
  ];
}

if (process.argv[1] !== undefined && import.meta.url === pathToFileURL(process.argv[1]).href) {
  runOpticsBench().then((figures) => {
    for (const f of figures) console.log(`${f.name}: ${f.value.toPrecision(3)} ${f.unit} (target ${f.target})`);
  });
}
