// The pixel side of reading a screen photo: the working channel, the pattern's centre and its robust radial profile.
// Sources: Otsu, IEEE Trans. SMC 9, 62 (1979) (threshold); radial symmetry about the true centre (Born & Wolf §8.8: the circular aperture's pattern depends on r only).
//
// Robustness, by construction: the profile is the median over all pixels in each annulus (a hot pixel or a lit speck is
// one vote among hundreds; a linear room-light gradient is odd about the centre and drops out of the median); saturated
// bins are flagged so the fit can leave them out; the centre is refined by minimising the spread across rays at equal
// radius, which a linear gradient does not bias.

export type PhotoImage = { widthPx: number; heightPx: number; data: Uint8Array | Uint8ClampedArray };

export type RadialProfile = {
  /** Mean radius of each annulus in pixels. */
  radiusPx: Float64Array;
  /** Median level (0–255) over the annulus, interpolated within the 8-bit level. */
  level: Float64Array;
  /** Robust spread (1.4826·MAD) of the levels in the annulus. */
  spread: Float64Array;
  /** Number of pixels in the annulus. */
  count: Float64Array;
  /** The median sits at the top of the scale: the sensor clipped there. */
  saturated: Uint8Array;
  binPx: number;
};

/** Thrown for a photo that cannot be read; the message is a plain sentence for the person who uploaded it. */
export class PhotoReadError extends Error {
  readonly code: "bad-image" | "uniform" | "no-pattern" | "room-light" | "no-edge" | "no-match" | "bad-context";
  constructor(code: PhotoReadError["code"], message: string) {
    super(message);
    this.name = "PhotoReadError";
    this.code = code;
  }
}

const MIN_SIDE_PX = 32;
const MAX_PIXELS = 60_000_000;

export function checkImage(image: PhotoImage): void {
  const { widthPx: w, heightPx: h, data } = image;
  if (!Number.isInteger(w) || !Number.isInteger(h) || w < MIN_SIDE_PX || h < MIN_SIDE_PX) {
    throw new PhotoReadError("bad-image", `The photo must be at least ${MIN_SIDE_PX} × ${MIN_SIDE_PX} pixels; this one is ${w} × ${h}.`);
  }
  if (w * h > MAX_PIXELS) throw new PhotoReadError("bad-image", `The photo has ${w * h} pixels; at most ${MAX_PIXELS} can be read.`);
  if (!data || data.length !== w * h * 4) {
    throw new PhotoReadError("bad-image", `The photo's pixel data holds ${data?.length ?? 0} bytes, but ${w} × ${h} RGBA pixels need ${w * h * 4}.`);
  }
}

/** The colour channel that carries the pattern (the one that varies most), as one byte per pixel. */
export function workingChannel(image: PhotoImage): { grey: Uint8Array; channel: 0 | 1 | 2 } {
  const { widthPx: w, heightPx: h, data } = image;
  const n = w * h;
  const sum = [0, 0, 0];
  const sum2 = [0, 0, 0];
  let samples = 0;
  for (let p = 0; p < n; p += 7) {
    for (let c = 0; c < 3; c++) {
      const v = data[4 * p + c];
      sum[c] += v;
      sum2[c] += v * v;
    }
    samples++;
  }
  const variance = sum.map((s, c) => sum2[c] / samples - (s / samples) ** 2);
  const channel = (variance[1] > variance[0] && variance[1] >= variance[2] ? 1 : variance[2] > variance[0] ? 2 : 0) as 0 | 1 | 2;
  const grey = new Uint8Array(n);
  for (let p = 0; p < n; p++) grey[p] = data[4 * p + channel];
  return { grey, channel };
}

/** Level at a fraction of the way up the histogram (0–1). */
export function histogramQuantile(hist: ArrayLike<number>, total: number, q: number): number {
  const target = q * total;
  let acc = 0;
  for (let v = 0; v < hist.length; v++) {
    const next = acc + hist[v];
    if (next >= target && hist[v] > 0) return v - 0.5 + (target - acc) / hist[v];
    acc = next;
  }
  return hist.length - 1;
}

function otsu(hist: Float64Array): number {
  let total = 0;
  let sumAll = 0;
  for (let i = 0; i < hist.length; i++) {
    total += hist[i];
    sumAll += i * hist[i];
  }
  let wB = 0;
  let sumB = 0;
  let best = 0;
  let bestT = 0;
  for (let t = 0; t < hist.length; t++) {
    wB += hist[t];
    if (wB === 0) continue;
    const wF = total - wB;
    if (wF === 0) break;
    sumB += t * hist[t];
    const mB = sumB / wB;
    const mF = (sumAll - sumB) / wF;
    const between = wB * wF * (mB - mF) ** 2;
    if (between > best) {
      best = between;
      bestT = t;
    }
  }
  return bestT + 0.5;
}

export type CoarseCentre = { x: number; y: number; radiusPx: number };

/**
 * A first guess of the centre and size: block-average to ≤ 400 px, remove a plane fitted to the darker half (room light),
 * threshold by Otsu, close the gaps between rings, take the brightest connected blob's weighted centroid.
 */
export function coarseCentre(grey: Uint8Array, w: number, h: number): CoarseCentre {
  const f = Math.max(1, Math.ceil(Math.max(w, h) / 400));
  const sw = Math.ceil(w / f);
  const sh = Math.ceil(h / f);
  const small = new Float64Array(sw * sh);
  const cnt = new Float64Array(sw * sh);
  for (let y = 0; y < h; y++) {
    const row = ((y / f) | 0) * sw;
    for (let x = 0; x < w; x++) {
      const k = row + ((x / f) | 0);
      small[k] += grey[y * w + x];
      cnt[k]++;
    }
  }
  for (let k = 0; k < small.length; k++) small[k] /= cnt[k];
  // plane through the darker half, twice (a least-squares plane a + bx + cy)
  const sorted = Float64Array.from(small).sort();
  let cut = sorted[Math.floor(sorted.length * 0.5)];
  let plane = [cut, 0, 0];
  for (let iter = 0; iter < 2; iter++) {
    const m = new Float64Array(9);
    const r = new Float64Array(3);
    const limit = iter === 0 ? cut - plane[0] : 0;
    for (let y = 0; y < sh; y++) {
      for (let x = 0; x < sw; x++) {
        const v = small[y * sw + x];
        if (v - (plane[0] + plane[1] * x + plane[2] * y) > limit) continue;
        m[0] += 1;
        m[1] += x;
        m[2] += y;
        m[4] += x * x;
        m[5] += x * y;
        m[8] += y * y;
        r[0] += v;
        r[1] += x * v;
        r[2] += y * v;
      }
    }
    m[3] = m[1];
    m[6] = m[2];
    m[7] = m[5];
    const solved = solve3(m, r);
    if (solved === null) break;
    plane = solved;
    cut = Infinity;
  }
  const resid = new Float64Array(sw * sh);
  let lo = Infinity;
  let hi = -Infinity;
  for (let y = 0; y < sh; y++) {
    for (let x = 0; x < sw; x++) {
      const v = small[y * sw + x] - (plane[0] + plane[1] * x + plane[2] * y);
      resid[y * sw + x] = v;
      lo = Math.min(lo, v);
      hi = Math.max(hi, v);
    }
  }
  const bins = 256;
  const hist = new Float64Array(bins);
  const span = hi - lo || 1;
  for (const v of resid) hist[Math.min(bins - 1, Math.floor(((v - lo) / span) * bins))]++;
  const threshold = lo + (otsu(hist) / bins) * span;
  // closing: dilate the lit mask twice so rings separated by thin dark rings join one blob
  let mask = new Uint8Array(sw * sh);
  for (let k = 0; k < mask.length; k++) mask[k] = resid[k] > threshold ? 1 : 0;
  for (let pass = 0; pass < 2; pass++) {
    const next = new Uint8Array(mask.length);
    for (let y = 0; y < sh; y++) {
      const y0 = Math.max(0, y - 1);
      const y1 = Math.min(sh - 1, y + 1);
      for (let x = 0; x < sw; x++) {
        const x0 = Math.max(0, x - 1);
        const x1 = Math.min(sw - 1, x + 1);
        let on = 0;
        for (let yy = y0; yy <= y1 && !on; yy++) for (let xx = x0; xx <= x1; xx++) on |= mask[yy * sw + xx];
        next[y * sw + x] = on;
      }
    }
    mask = next;
  }
  // connected blobs (4-neighbours), each weighted by its light above the threshold
  const label = new Int32Array(sw * sh).fill(-1);
  const stack: number[] = [];
  let best = { weight: 0, sx: 0, sy: 0, area: 0 };
  for (let start = 0; start < mask.length; start++) {
    if (!mask[start] || label[start] >= 0) continue;
    let weight = 0;
    let sx = 0;
    let sy = 0;
    let area = 0;
    label[start] = start;
    stack.push(start);
    while (stack.length) {
      const k = stack.pop()!;
      const x = k % sw;
      const y = (k / sw) | 0;
      const wgt = Math.max(0, resid[k] - threshold);
      weight += wgt;
      sx += wgt * (x + 0.5);
      sy += wgt * (y + 0.5);
      area++;
      for (let side = 0; side < 4; side++) {
        const j = side === 0 ? (x > 0 ? k - 1 : -1) : side === 1 ? (x < sw - 1 ? k + 1 : -1) : side === 2 ? (y > 0 ? k - sw : -1) : y < sh - 1 ? k + sw : -1;
        if (j >= 0 && mask[j] && label[j] < 0) {
          label[j] = start;
          stack.push(j);
        }
      }
    }
    if (weight > best.weight) best = { weight, sx, sy, area };
  }
  if (best.weight <= 0) return { x: w / 2, y: h / 2, radiusPx: Math.min(w, h) / 4 };
  return { x: (best.sx / best.weight) * f, y: (best.sy / best.weight) * f, radiusPx: Math.sqrt(best.area / Math.PI) * f };
}

function solve3(m: Float64Array, r: Float64Array): number[] | null {
  const a = [
    [m[0], m[1], m[2], r[0]],
    [m[3], m[4], m[5], r[1]],
    [m[6], m[7], m[8], r[2]],
  ];
  for (let i = 0; i < 3; i++) {
    let p = i;
    for (let k = i + 1; k < 3; k++) if (Math.abs(a[k][i]) > Math.abs(a[p][i])) p = k;
    if (Math.abs(a[p][i]) < 1e-12) return null;
    [a[i], a[p]] = [a[p], a[i]];
    for (let k = 0; k < 3; k++) {
      if (k === i) continue;
      const f = a[k][i] / a[i][i];
      for (let j = i; j < 4; j++) a[k][j] -= f * a[i][j];
    }
  }
  return [a[0][3] / a[0][0], a[1][3] / a[1][1], a[2][3] / a[2][2]];
}

const RAYS = 48;

type Rays = { cos: Float64Array; sin: Float64Array };

function rays(): Rays {
  const cos = new Float64Array(RAYS);
  const sin = new Float64Array(RAYS);
  for (let a = 0; a < RAYS; a++) {
    cos[a] = Math.cos((2 * Math.PI * (a + 0.5)) / RAYS);
    sin[a] = Math.sin((2 * Math.PI * (a + 0.5)) / RAYS);
  }
  return { cos, sin };
}

/**
 * Asymmetry about (cx, cy): the mean spread across rays at equal radius divided by the spread of all samples. Near 0
 * about the centre of a ring pattern; near 1 on flat background (so a dark corner is not mistaken for a centre).
 */
function asymmetry(grey: Uint8Array, w: number, h: number, cx: number, cy: number, radii: Float64Array, { cos, sin }: Rays): number {
  let angular = 0;
  let used = 0;
  let all = 0;
  let all2 = 0;
  let allN = 0;
  for (let i = 0; i < radii.length; i++) {
    const r = radii[i];
    let n = 0;
    let s = 0;
    let s2 = 0;
    for (let a = 0; a < RAYS; a++) {
      const x = cx + r * cos[a] - 0.5;
      const y = cy + r * sin[a] - 0.5;
      if (x < 0 || y < 0 || x >= w - 1 || y >= h - 1) continue;
      const x0 = x | 0;
      const y0 = y | 0;
      const tx = x - x0;
      const ty = y - y0;
      const k = y0 * w + x0;
      const v = (grey[k] * (1 - tx) + grey[k + 1] * tx) * (1 - ty) + (grey[k + w] * (1 - tx) + grey[k + w + 1] * tx) * ty;
      n++;
      s += v;
      s2 += v * v;
    }
    // at least half a circle inside the photo, so a corner cannot pass a narrow wedge of rings off as symmetric
    if (n < RAYS / 2) continue;
    angular += s2 / n - (s / n) ** 2;
    used++;
    all += s;
    all2 += s2;
    allN += n;
  }
  if (used < Math.max(4, radii.length / 4)) return Infinity;
  const pooled = all2 / allN - (all / allN) ** 2;
  return pooled > 0 ? angular / used / pooled : Infinity;
}

function radiiTo(rMax: number, count: number): Float64Array {
  return Float64Array.from({ length: count }, (_, i) => 1 + ((rMax - 1) * i) / (count - 1));
}

/** Pattern search on the asymmetry from (x, y) with a first step, down to 0.03 px. */
function descend(grey: Uint8Array, w: number, h: number, x: number, y: number, step: number, radii: Float64Array, r: Rays): { x: number; y: number; cost: number } {
  let best = asymmetry(grey, w, h, x, y, radii, r);
  const moves = [
    [1, 0],
    [-1, 0],
    [0, 1],
    [0, -1],
    [1, 1],
    [1, -1],
    [-1, 1],
    [-1, -1],
  ];
  while (step > 0.03) {
    let moved = false;
    for (const [dx, dy] of moves) {
      const cx = x + dx * step;
      const cy = y + dy * step;
      const c = asymmetry(grey, w, h, cx, cy, radii, r);
      if (c < best) {
        best = c;
        x = cx;
        y = cy;
        moved = true;
        break;
      }
    }
    if (!moved) step /= 2;
  }
  return { x, y, cost: best };
}

/**
 * Where the lines along the brightness gradient meet (a radial symmetry transform, Loy & Zelinsky, IEEE PAMI 25, 959
 * (2003), simplified): every ring's edge points at the centre, whatever the ring's brightness, while a room-light
 * gradient's lines run parallel and noise's scatter. Works on a ≤ 400 px copy; returns the peak in photo pixels.
 */
export function gradientVote(grey: Uint8Array, w: number, h: number): { x: number; y: number } {
  const f = Math.max(1, Math.ceil(Math.max(w, h) / 400));
  const sw = Math.ceil(w / f);
  const sh = Math.ceil(h / f);
  const small = new Float64Array(sw * sh);
  const cnt = new Float64Array(sw * sh);
  for (let y = 0; y < h; y++) {
    const row = ((y / f) | 0) * sw;
    for (let x = 0; x < w; x++) {
      const k = row + ((x / f) | 0);
      small[k] += grey[y * w + x];
      cnt[k]++;
    }
  }
  for (let k = 0; k < small.length; k++) small[k] /= cnt[k];
  const gx = new Float64Array(sw * sh);
  const gy = new Float64Array(sw * sh);
  const mags: number[] = [];
  for (let y = 1; y < sh - 1; y++) {
    for (let x = 1; x < sw - 1; x++) {
      const k = y * sw + x;
      const a = small[k - sw - 1];
      const b = small[k - sw];
      const c = small[k - sw + 1];
      const d = small[k - 1];
      const e = small[k + 1];
      const f_ = small[k + sw - 1];
      const g = small[k + sw];
      const hh = small[k + sw + 1];
      gx[k] = c + 2 * e + hh - a - 2 * d - f_;
      gy[k] = f_ + 2 * g + hh - a - 2 * b - c;
      mags.push(Math.hypot(gx[k], gy[k]));
    }
  }
  mags.sort((p, q) => p - q);
  const cut = Math.max(mags[Math.floor(mags.length * 0.9)] ?? 0, 1e-9);
  const acc = new Float64Array(sw * sh);
  const reach = Math.max(sw, sh);
  for (let y = 1; y < sh - 1; y++) {
    for (let x = 1; x < sw - 1; x++) {
      const k = y * sw + x;
      const m = Math.hypot(gx[k], gy[k]);
      if (m < cut) continue;
      const ux = gx[k] / m;
      const uy = gy[k] / m;
      for (let t = -reach; t <= reach; t++) {
        const xx = Math.round(x + t * ux);
        const yy = Math.round(y + t * uy);
        if (xx < 0 || yy < 0 || xx >= sw || yy >= sh) {
          if (t > 0) break;
          continue;
        }
        acc[yy * sw + xx]++;
      }
    }
  }
  let best = 0;
  let bx = sw / 2;
  let by = sh / 2;
  for (let y = 1; y < sh - 1; y++) {
    for (let x = 1; x < sw - 1; x++) {
      let v = 0;
      for (let dy = -1; dy <= 1; dy++) for (let dx = -1; dx <= 1; dx++) v += acc[(y + dy) * sw + x + dx];
      if (v > best) {
        best = v;
        bx = x;
        by = y;
      }
    }
  }
  return { x: (bx + 0.5) * f, y: (by + 0.5) * f };
}

/**
 * The centre to a fraction of a pixel: the asymmetry on a grid of starting points over the whole photo (and the blob's
 * centroid), the best few refined by pattern search. Works when the pattern is off-centre or runs off the photo.
 */
export function findCentre(grey: Uint8Array, w: number, h: number, blob: CoarseCentre): { x: number; y: number; cost: number } {
  const r = rays();
  const reach = Math.max(blob.radiusPx * 1.2, 0.35 * (w + h));
  const coarseRadii = radiiTo(reach, 96);
  const spacing = Math.max(w, h) / 20;
  const voted = gradientVote(grey, w, h);
  const starts: { x: number; y: number; cost: number }[] = [];
  for (let y = spacing / 2; y < h; y += spacing) {
    for (let x = spacing / 2; x < w; x += spacing) starts.push({ x, y, cost: asymmetry(grey, w, h, x, y, coarseRadii, r) });
  }
  starts.sort((a, b) => a.cost - b.cost);
  const fineRadii = radiiTo(reach, 240);
  let best = { x: blob.x, y: blob.y, cost: Infinity };
  const firsts = [voted, blob].map((p) => ({ ...p, cost: 0 }));
  for (const s of [...firsts, ...starts.slice(0, 3)]) {
    const found = descend(grey, w, h, s.x, s.y, spacing / 2, fineRadii, r);
    if (found.cost < best.cost) best = found;
  }
  return best;
}

/** Refine a known centre with radii out to 1.2 × the given radius. */
export function refineCentre(grey: Uint8Array, w: number, h: number, start: CoarseCentre): { x: number; y: number } {
  const radii = radiiTo(Math.max(8, 1.2 * start.radiusPx), 240);
  return descend(grey, w, h, start.x, start.y, Math.max(1, start.radiusPx / 40), radii, rays());
}

/** Median and spread of the levels in annuli of width binPx around the centre, out to maxRadiusPx. */
export function radialProfile(grey: Uint8Array, w: number, h: number, cx: number, cy: number, maxRadiusPx: number, binPx: number): RadialProfile {
  const bins = Math.max(2, Math.ceil(maxRadiusPx / binPx));
  const hist = new Uint32Array(bins * 256);
  const count = new Float64Array(bins);
  const x0 = Math.max(0, Math.floor(cx - maxRadiusPx));
  const x1 = Math.min(w, Math.ceil(cx + maxRadiusPx));
  const y0 = Math.max(0, Math.floor(cy - maxRadiusPx));
  const y1 = Math.min(h, Math.ceil(cy + maxRadiusPx));
  const inv = 1 / binPx;
  for (let y = y0; y < y1; y++) {
    const dy = y + 0.5 - cy;
    const dy2 = dy * dy;
    const row = y * w;
    for (let x = x0; x < x1; x++) {
      const dx = x + 0.5 - cx;
      const b = (Math.sqrt(dx * dx + dy2) * inv) | 0;
      if (b >= bins) continue;
      hist[b * 256 + grey[row + x]]++;
      count[b]++;
    }
  }
  const radiusPx = new Float64Array(bins);
  const level = new Float64Array(bins);
  const spread = new Float64Array(bins);
  const saturated = new Uint8Array(bins);
  let top = 0;
  for (let b = 0; b < bins; b++) {
    const k = b + 1;
    radiusPx[b] = ((2 / 3) * (k ** 3 - b ** 3)) / (k ** 2 - b ** 2) * binPx;
    if (count[b] === 0) {
      level[b] = NaN;
      continue;
    }
    const hb = hist.subarray(b * 256, b * 256 + 256);
    const med = histogramQuantile(hb, count[b], 0.5);
    level[b] = med;
    // MAD from the histogram
    const dev = new Float64Array(256);
    for (let v = 0; v < 256; v++) dev[Math.min(255, Math.abs(Math.round(v - med)))] += hb[v];
    spread[b] = 1.4826 * Math.max(0.5, histogramQuantile(dev, count[b], 0.5));
    for (let v = 255; v >= 0; v--) {
      if (hb[v] > 0) {
        top = Math.max(top, v);
        break;
      }
    }
  }
  // Saturation: the median within a level of the brightest value any annulus holds at the scale's top.
  for (let b = 0; b < bins; b++) saturated[b] = top >= 250 && level[b] >= top - 1.5 ? 1 : 0;
  return { radiusPx, level, spread, count, saturated, binPx };
}
