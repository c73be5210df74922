// readScreenPhoto: the as-built reading of a screen photo — centre, dark rings, the fitted zone count, scale and screen distance.
// Sources: Born & Wolf, Principles of Optics (7th ed.) §8.2 (half-period zones: N = (R²/λ)(1/ρ + 1/b)) and §8.8 (the pattern, via screenProfile); Otsu 1979 (threshold); Numerical Recipes (3rd ed.) §10.2, §15.2.
//
// Steps: (1) the channel that carries the pattern; refuse a photo whose brightness hardly varies; (2) coarse centre from
// the brightest blob, refined to a fraction of a pixel by radial symmetry; (3) the radial profile as the median of each
// one-to-two-pixel annulus; refuse when it holds no structure above the noise, or when a smooth surface (uneven room
// light) explains the photo as well as rings about the centre do (Numerical Recipes §15.4, linear least squares);
// (4) the outer edge of the lit disc;
// (5) a sweep of zone counts (the screen moved along the drawn bench, never starting from where it is drawn) against
// the pattern's edge radius in pixels, scored by the straight-line fit of the profile to the model's (·)^γ; (6) a
// golden-section polish of the distance with γ, blur and edge around the best sweep point.
//
// Tolerances, measured by tests/unit/photo on photos rendered from an independent series (Lommel, Born & Wolf §8.8.1)
// with blur ≤ 2 px, gamma 1.8–2.4, read noise ≤ 3 levels, hot pixels, a saturated core and a room-light gradient,
// for 1.5 ≤ N ≤ 25, 0.01 ≤ R²/w² ≤ 1 and a pattern 70–520 px in radius: |zoneCount − N| ≤ 0.1 + 1 % of N; the distance
// within 3 % of b, or the change of b that moves N by that much where N hardly depends on b (a diverging beam near its
// far-field count R²/λρ); mmPerPixel likewise within 3 %; the centre within 1 px or 2 % of the pattern's radius.
// Limits: a beam converging to a focus between aperture and screen gives two distances with the same |N| and the same
// pattern shape; the reader reports the better fit of the two. A beam far narrower than the aperture (R²/w² ≫ 1) shows
// no zones to read.
import type { BenchDocument } from "@/lib/bench/schema";
import { analyzeBench } from "./analyze";
import { type CentreAppearance, centreAppearance } from "./fresnel";
import {
  type FitParams,
  type FitResult,
  type FitSample,
  type PatternModel,
  ProfileScorer,
  distancesForZoneCounts,
  goldenMin,
  patternModel,
  totalSumOfSquares,
} from "./photo-fit";
import {
  type PhotoImage,
  type RadialProfile,
  PhotoReadError,
  checkImage,
  coarseCentre,
  findCentre,
  histogramQuantile,
  radialProfile,
  refineCentre,
  workingChannel,
} from "./photo-image";

export { PhotoReadError } from "./photo-image";
export type { PhotoImage } from "./photo-image";

export type PhotoContext = { doc: BenchDocument; apertureId: string };

export type ScreenPhotoReading = {
  centre: CentreAppearance;
  centrePx: { x: number; y: number };
  zoneCount: number;
  screenDistanceMm: number;
  mmPerPixel: number;
  ringRadiiPx: number[];
  quality: number;
  /** The photo's profile and the fitted model, for plotting: radius on the screen (mm), both in the photo's 0–255 levels. */
  profile: {
    radiusMm: number[];
    measuredLevel: number[];
    fittedLevel: number[];
    /** The fitted tone curve: level = offset + gain · (blurred relative intensity)^gamma; blurPx the fitted blur. */
    tone: { offset: number; gain: number; gamma: number; blurPx: number };
    /** The edge of the aperture's geometric shadow at the fitted distance (mm on the screen; edge in pixels × mmPerPixel). */
    shadowRadiusMm: number;
  };
};

/** Less contrast than this (levels between the 0.5th and 99.5th percentile) is a blank photo. */
const MIN_RANGE_LEVELS = 10;
/** The profile must vary this many times more than its noise to count as a pattern. */
const MIN_STRUCTURE_RATIO = 8;
/** Below this share of the profile's variance explained, the best match is not reported. */
const MIN_EXPLAINED = 0.85;
/**
 * Rings about the centre must leave at least this many times less residual than a smooth surface (room light): measured on
 * tests/unit/photo's rendered photos, dark photos with only a room-light gradient give at most 0.32, every readable
 * pattern at least 4.6, and faint patterns under room light stronger than they are (read wrongly before) 0.66–0.87.
 */
const MIN_RINGS_OVER_ROOM_LIGHT = 1;
const SMALLEST_EDGE_PX = 12;
/** Where the edge is taken, as a share of the way from the dark to the bright level (the tone curve makes 1/4 of the light about 0.5). */
const EDGE_LEVEL = 0.35;
/** The tone curve assumed while sweeping (an 8-bit photo stores about linear^(1/2.2)); the polish fits it. */
const SWEEP_GAMMA = 0.45;

function smooth(values: Float64Array, halfWidth: number): Float64Array {
  const out = new Float64Array(values.length);
  for (let k = 0; k < values.length; k++) {
    let s = 0;
    let n = 0;
    for (let i = Math.max(0, k - halfWidth); i <= Math.min(values.length - 1, k + halfWidth); i++) {
      if (Number.isNaN(values[i])) continue;
      s += values[i];
      n++;
    }
    out[k] = n ? s / n : NaN;
  }
  return out;
}

function quantile(values: number[], q: number): number {
  const s = [...values].sort((a, b) => a - b);
  if (s.length === 0) return NaN;
  const u = q * (s.length - 1);
  const i = Math.floor(u);
  return s[i] + (s[Math.min(s.length - 1, i + 1)] - s[i]) * (u - i);
}

/**
 * The radius of the lit disc's outer edge: the outermost fall through a third of the way from dark to bright that the
 * profile does not climb back over for a good stretch (so dark rings inside, and room light in the photo's corners
 * beyond the edge, are not taken for it). Null when the disc runs off the photo.
 */
function edgeRadius(p: RadialProfile, coarseRadiusPx: number): number | null {
  const ys = smooth(p.level, 2);
  const usable: number[] = [];
  for (let k = 0; k < ys.length; k++) if (p.count[k] >= 20 && !Number.isNaN(ys[k])) usable.push(k);
  if (usable.length < 10) return null;
  const dark = quantile(usable.map((k) => ys[k]), 0.05);
  const inner = usable.filter((k) => p.radiusPx[k] <= Math.max(coarseRadiusPx, 3 * p.binPx));
  const bright = quantile((inner.length ? inner : usable).map((k) => ys[k]), 0.95);
  const threshold = dark + EDGE_LEVEL * (bright - dark);
  let edge: number | null = null;
  for (let i = 0; i + 1 < usable.length; i++) {
    const k = usable[i];
    if (!(ys[k] > threshold && ys[usable[i + 1]] <= threshold)) continue;
    const stretch = Math.max(8, Math.ceil((0.08 * p.radiusPx[k]) / p.binPx));
    if (i + stretch >= usable.length) continue;
    let stays = true;
    for (let j = i + 1; j <= i + stretch; j++) if (ys[usable[j]] > threshold) stays = false;
    // and beyond it the photo is mostly dark: half of what lies outside sits in the lower half of the way to the threshold
    const outside = usable.slice(i + 1).map((j) => ys[j]);
    if (stays && quantile(outside, 0.5) <= dark + 0.5 * (threshold - dark)) edge = p.radiusPx[k] + ((ys[k] - threshold) / (ys[k] - ys[usable[i + 1]])) * p.binPx;
  }
  return edge;
}

/** Noise of the annulus median (σ of a median ≈ 1.2533·σ/√n) and the profile's spread about its mean, inside the edge. */
function structureRatio(p: RadialProfile, maxRadiusPx: number): number {
  let sw = 0;
  let sy = 0;
  const ks: number[] = [];
  for (let k = 0; k < p.level.length; k++) {
    if (p.radiusPx[k] > maxRadiusPx || p.count[k] < 5 || Number.isNaN(p.level[k])) continue;
    ks.push(k);
  }
  if (ks.length < 5) return 0;
  const sigma = (k: number) => Math.max(0.3, (1.2533 * p.spread[k]) / Math.sqrt(p.count[k]));
  for (const k of ks) {
    const w = 1 / sigma(k) ** 2;
    sw += w;
    sy += w * p.level[k];
  }
  const mean = sy / sw;
  let chi = 0;
  for (const k of ks) chi += ((p.level[k] - mean) / sigma(k)) ** 2;
  return chi / ks.length;
}

/** Least squares by the normal equations (Gaussian elimination with partial pivoting); null when singular. */
function solveLinear(a: Float64Array, b: Float64Array, n: number): Float64Array | null {
  const m = Float64Array.from(a);
  const x = Float64Array.from(b);
  for (let c = 0; c < n; c++) {
    let piv = c;
    for (let r = c + 1; r < n; r++) if (Math.abs(m[r * n + c]) > Math.abs(m[piv * n + c])) piv = r;
    if (Math.abs(m[piv * n + c]) < 1e-12) return null;
    if (piv !== c) {
      for (let k = 0; k < n; k++) [m[c * n + k], m[piv * n + k]] = [m[piv * n + k], m[c * n + k]];
      [x[c], x[piv]] = [x[piv], x[c]];
    }
    for (let r = c + 1; r < n; r++) {
      const f = m[r * n + c] / m[c * n + c];
      if (f === 0) continue;
      for (let k = c; k < n; k++) m[r * n + k] -= f * m[c * n + k];
      x[r] -= f * x[c];
    }
  }
  for (let c = n - 1; c >= 0; c--) {
    let s = x[c];
    for (let k = c + 1; k < n; k++) s -= m[c * n + k] * x[k];
    x[c] = s / m[c * n + c];
  }
  return x;
}

/**
 * Whether rings about the centre explain the photo better than room light does: the photo's residual about its radial
 * profile (the annulus medians) over its residual about a smooth surface (a polynomial of the given degree in x and y,
 * fitted by least squares, as uneven room light falls across a screen). A ring pattern leaves almost nothing about its profile and much about any
 * smooth surface (its rings and its shadow edge); room light alone is the other way round. Sampled on a grid of at most
 * about 40 000 pixels.
 */
function ringsOverRoomLight(grey: Uint8Array, w: number, h: number, c: { x: number; y: number }, p: RadialProfile, degree = 2): number {
  const step = Math.max(1, Math.floor(Math.sqrt((w * h) / 40_000)));
  const terms: [number, number][] = [];
  for (let i = 0; i <= degree; i++) for (let j = 0; i + j <= degree; j++) terms.push([i, j]);
  const n = terms.length;
  const ata = new Float64Array(n * n);
  const atb = new Float64Array(n);
  const row = new Float64Array(n);
  let radialRss = 0;
  let count = 0;
  const basis = (x: number, y: number) => {
    const u = (2 * x) / w - 1;
    const v = (2 * y) / h - 1;
    for (let t = 0; t < n; t++) row[t] = u ** terms[t][0] * v ** terms[t][1];
  };
  for (let y = step >> 1; y < h; y += step) {
    for (let x = step >> 1; x < w; x += step) {
      const g = grey[y * w + x];
      basis(x + 0.5, y + 0.5);
      for (let a = 0; a < n; a++) {
        atb[a] += row[a] * g;
        for (let b = a; b < n; b++) ata[a * n + b] += row[a] * row[b];
      }
      const k = Math.min(p.level.length - 1, Math.floor(Math.hypot(x + 0.5 - c.x, y + 0.5 - c.y) / p.binPx));
      const level = Number.isNaN(p.level[k]) ? g : p.level[k];
      radialRss += (g - level) ** 2;
      count++;
    }
  }
  for (let a = 0; a < n; a++) for (let b = 0; b < a; b++) ata[a * n + b] = ata[b * n + a];
  const coef = solveLinear(ata, atb, n);
  if (coef === null) return 0;
  let smoothRss = 0;
  for (let y = step >> 1; y < h; y += step) {
    for (let x = step >> 1; x < w; x += step) {
      basis(x + 0.5, y + 0.5);
      let fit = 0;
      for (let t = 0; t < n; t++) fit += coef[t] * row[t];
      smoothRss += (grey[y * w + x] - fit) ** 2;
    }
  }
  return count === 0 ? 0 : smoothRss / Math.max(radialRss, 1e-9);
}

/** Dark rings: local minima of the lightly smoothed profile inside the edge, deeper than the noise on both sides. */
function darkRings(p: RadialProfile, edgePx: number): number[] {
  const ys = smooth(p.level, 1);
  const rings: number[] = [];
  const last = p.radiusPx.findIndex((r) => r > edgePx);
  const end = last < 0 ? ys.length - 1 : last;
  for (let k = 2; k < end - 1; k++) {
    if (!(ys[k] < ys[k - 1] && ys[k] <= ys[k + 1])) continue;
    const noise = Math.max(1, (3 * p.spread[k]) / Math.sqrt(Math.max(1, p.count[k])));
    let leftMax = ys[k];
    for (let i = k - 1; i >= 0 && p.radiusPx[k] - p.radiusPx[i] < 0.5 * edgePx; i--) {
      leftMax = Math.max(leftMax, ys[i]);
      if (ys[i] < ys[k]) break;
    }
    let rightMax = ys[k];
    for (let i = k + 1; i < ys.length && p.radiusPx[i] - p.radiusPx[k] < 0.5 * edgePx; i++) {
      rightMax = Math.max(rightMax, ys[i]);
      if (ys[i] < ys[k]) break;
    }
    if (Math.min(leftMax, rightMax) - ys[k] < noise) continue;
    // parabola through the three annuli for a sub-annulus radius
    const den = ys[k - 1] - 2 * ys[k] + ys[k + 1];
    const shift = den > 0 ? Math.max(-0.5, Math.min(0.5, (0.5 * (ys[k - 1] - ys[k + 1])) / den)) : 0;
    rings.push(p.radiusPx[k] + shift * p.binPx);
  }
  return rings;
}

/** Nearest-screen geometry the sweep may use: from 1 mm behind the aperture to the next element that stops light. */
function sweepRange(doc: BenchDocument, apertureId: string, screenId: string): { minMm: number; maxMm: number } {
  const aperture = doc.elements.find((e) => e.id === apertureId)!;
  let maxMm = 100_000;
  for (const e of doc.elements) {
    if (e.id === screenId || (e.kind !== "screen" && e.kind !== "beam-block")) continue;
    const d = e.positionMm - aperture.positionMm;
    if (d > 1) maxMm = Math.min(maxMm, d - 0.5);
  }
  return { minMm: Math.min(1, maxMm / 10), maxMm };
}

/** The bench document contract "Reading the screen photo": pure and synchronous; throws PhotoReadError with a plain sentence when it cannot read. */
export function readScreenPhoto(image: PhotoImage, context: PhotoContext): ScreenPhotoReading {
  checkImage(image);
  const { doc, apertureId } = context;
  const analysis = analyzeBench(doc);
  const aperture = analysis.apertures.find((a) => a.id === apertureId);
  if (aperture === undefined) {
    throw new PhotoReadError("bad-context", `The bench has no lit aperture "${apertureId}", so there is no pattern to compare the photo with.`);
  }
  if (aperture.screenId === null) {
    throw new PhotoReadError("bad-context", `No screen stands behind the aperture "${apertureId}" in the drawing, so there is no pattern to compare the photo with.`);
  }
  const screenId = aperture.screenId;
  const { widthPx: w, heightPx: h } = image;
  const { grey } = workingChannel(image);

  const hist = new Float64Array(256);
  for (let p = 0; p < grey.length; p++) hist[grey[p]]++;
  const range = histogramQuantile(hist, grey.length, 0.995) - histogramQuantile(hist, grey.length, 0.005);
  if (range < MIN_RANGE_LEVELS) {
    throw new PhotoReadError("uniform", `The photo is almost uniform (its brightness varies by only ${Math.max(0, Math.round(range))} of 255 levels), so no pattern can be seen in it.`);
  }

  // centre: coarse blob, refined by symmetry; again with the edge once it is known
  const coarse = coarseCentre(grey, w, h);
  let centre: { x: number; y: number } = findCentre(grey, w, h, coarse);
  const farthest = (c: { x: number; y: number }) => Math.hypot(Math.max(c.x, w - c.x), Math.max(c.y, h - c.y));
  const binFor = (radiusPx: number) => Math.min(2, Math.max(0.5, radiusPx / 250));
  let profile = radialProfile(grey, w, h, centre.x, centre.y, farthest(centre), binFor(coarse.radiusPx));
  let edgePx = edgeRadius(profile, coarse.radiusPx);
  if (edgePx !== null && Math.abs(edgePx - coarse.radiusPx) > 0.2 * coarse.radiusPx) {
    centre = refineCentre(grey, w, h, { ...centre, radiusPx: edgePx });
    profile = radialProfile(grey, w, h, centre.x, centre.y, farthest(centre), binFor(edgePx));
    edgePx = edgeRadius(profile, edgePx);
  }
  const structure = structureRatio(profile, Math.min(farthest(centre), 1.3 * (edgePx ?? coarse.radiusPx)));
  if (structure < MIN_STRUCTURE_RATIO) {
    throw new PhotoReadError("no-pattern", "The photo shows no ring pattern: about its likeliest centre, its brightness changes from ring to ring no more than its noise does.");
  }
  // Room light falling unevenly on a dark screen has a bright side and a bright "centre" too; rings must explain the
  // photo better than a smooth wash of light does, or the fit would read zones into the room light.
  if (ringsOverRoomLight(grey, w, h, centre, profile) < MIN_RINGS_OVER_ROOM_LIGHT) {
    throw new PhotoReadError(
      "room-light",
      "No ring pattern stands out of the room light: the photo's brightness changes smoothly from one side to the other, as uneven room light does, and rings about its brightest spot explain it no better. Check that the laser is on and lights the screen, and dim the room lights.",
    );
  }
  if (edgePx === null || edgePx < SMALLEST_EDGE_PX) {
    throw new PhotoReadError(
      "no-edge",
      edgePx === null
        ? "The lit disc runs off the photo, so the edge of the aperture's shadow that fixes the scale cannot be seen; take the photo so the whole pattern is in it."
        : `The pattern is only ${Math.round(edgePx)} pixels across its radius; take the photo closer so the rings can be told apart.`,
    );
  }

  // the profile the fit sees: annuli out to 1.25 × the edge, weighted by their pixel count, saturated ones left out
  const fitMax = 1.25 * edgePx;
  const keep: number[] = [];
  for (let k = 0; k < profile.level.length; k++) if (profile.radiusPx[k] <= fitMax && profile.count[k] >= 3 && !Number.isNaN(profile.level[k])) keep.push(k);
  const sample: FitSample = {
    radiusPx: Float64Array.from(keep, (k) => profile.radiusPx[k]),
    level: Float64Array.from(keep, (k) => profile.level[k]),
    weight: Float64Array.from(keep, (k) => (profile.saturated[k] ? 0 : profile.count[k] / (profile.count[k] + 30))),
    binPx: profile.binPx,
  };
  const scorer = new ProfileScorer(sample);
  const rings = darkRings(profile, edgePx);

  // (5) sweep of zone counts; the count of dark rings seen bounds how many zones there can be
  const zonesHi = Math.min(150, Math.max(8, 2.5 * rings.length + 6));
  const range_ = sweepRange(doc, apertureId, screenId);
  const distances = distancesForZoneCounts(doc, apertureId, screenId, { ...range_, zonesLo: 0.3, zonesHi }, (z) => 0.1 + 0.012 * z);
  if (distances.length === 0) throw new PhotoReadError("no-match", "No screen distance on the drawn bench gives a pattern to compare the photo with.");
  type Candidate = { model: PatternModel; fit: FitResult };
  const swept: Candidate[] = [];
  const edgeSteps = Array.from({ length: 28 }, (_, i) => 0.75 + (0.55 * i) / 27);
  for (const d of distances) {
    const model = patternModel(doc, apertureId, screenId, d);
    if (model === null) continue;
    const powered = Float64Array.from(model.values, (v) => Math.pow(v, SWEEP_GAMMA));
    let bestEdge = edgePx;
    let bestRss = Infinity;
    for (const f of edgeSteps) {
      const rss = scorer.sweepScore(powered, f * edgePx);
      if (rss < bestRss) {
        bestRss = rss;
        bestEdge = f * edgePx;
      }
    }
    const best = scorer.score(model, { edgePx: bestEdge, gamma: SWEEP_GAMMA, blurPx: 0 });
    swept.push({ model, fit: best });
  }
  if (swept.length === 0) throw new PhotoReadError("no-match", "No screen distance on the drawn bench gives a pattern to compare the photo with.");
  swept.sort((a, b) => a.fit.rss - b.fit.rss);

  // (6) polish the few best sweep points, then golden-section on log-distance around the best
  let best: Candidate | null = null;
  for (const c of swept.slice(0, 4)) {
    const fit = scorer.polish(c.model, c.fit);
    if (best === null || fit.rss < best.fit.rss) best = { model: c.model, fit };
  }
  const chosen = best!;
  const byDistance = [...swept].sort((a, b) => a.model.distanceMm - b.model.distanceMm);
  const at = byDistance.findIndex((c) => c.model.distanceMm === chosen.model.distanceMm);
  const loMm = byDistance[Math.max(0, at - 1)].model.distanceMm;
  const hiMm = byDistance[Math.min(byDistance.length - 1, at + 1)].model.distanceMm;
  let final = chosen;
  let start: FitParams = chosen.fit;
  const evaluate = (logD: number): number => {
    const model = patternModel(doc, apertureId, screenId, Math.exp(logD));
    if (model === null) return Infinity;
    const fit = scorer.polish(model, start);
    if (fit.rss < final.fit.rss) {
      final = { model, fit };
      start = fit;
    }
    return fit.rss;
  };
  if (hiMm > loMm) goldenMin(evaluate, Math.log(loMm), Math.log(hiMm), 12);

  // quality: share of the profile explained, times how clearly the best count beats counts a zone or more away
  const tss = totalSumOfSquares(sample);
  const explained = tss > 0 ? 1 - final.fit.rss / tss : 0;
  if (explained < MIN_EXPLAINED) {
    throw new PhotoReadError(
      "no-match",
      `The photo's rings do not match any pattern this bench could make (the best match explains only ${Math.round(Math.max(0, explained) * 100)} % of it); check that the photo shows the screen behind "${apertureId}".`,
    );
  }
  const rival = swept.find((c) => Math.abs(c.model.zoneCount - final.model.zoneCount) >= 1);
  const separation = rival === undefined ? 1 : Math.min(1, Math.max(0, (rival.fit.rss - final.fit.rss) / Math.max(rival.fit.rss, 1e-12)) * 4);
  const quality = Math.max(0, Math.min(1, explained * (0.5 + 0.5 * separation)));

  const mmPerPixel = final.model.shadowRadiusMm / final.fit.edgePx;
  const fitted = scorer.curve(final.model, final.fit);
  return {
    centre: centreAppearance(final.model.centreRatio),
    centrePx: { x: centre.x, y: centre.y },
    zoneCount: final.model.zoneCount,
    screenDistanceMm: final.model.distanceMm,
    mmPerPixel,
    ringRadiiPx: rings,
    quality,
    profile: {
      radiusMm: Array.from(sample.radiusPx, (r) => r * mmPerPixel),
      measuredLevel: Array.from(sample.level),
      fittedLevel: Array.from(fitted),
      tone: { offset: final.fit.offset, gain: final.fit.gain, gamma: final.fit.gamma, blurPx: final.fit.blurPx },
      shadowRadiusMm: final.model.shadowRadiusMm,
    },
  };
}
