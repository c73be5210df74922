// Bessel functions of the first kind J0, J1, Jn (own implementation) and a fast tabulated J0 for the profile quadrature.
// Sources: power series and Hankel asymptotic expansion (Abramowitz & Stegun 9.1.10, 9.2.5, 9.2.9–9.2.10); Miller's backward recurrence with the normalisation J0 + 2ΣJ2k = 1 (A&S 9.1.27, 9.1.46; Numerical Recipes §6.5).
//
// Method and accuracy (checked against @stdlib besselj0/besselj1 in tests, |error| < 1e-13 on 0–1e4):
//   |x| ≤ 8        power series (largest term ≈ 114 at x = 8, so the cancellation costs < 1e-13);
//   8 < |x| < 25   Miller backward recurrence from order ⌈x + 12 x^⅓ + 20⌉ (start error < 1e-16);
//   |x| ≥ 25       Hankel asymptotic series P, Q summed until the terms fall below 1e-17 (smallest term ≈ e^{−2x}).
// The tabulated J0 (fastJ0) is a cubic Hermite interpolant on a grid of step 1/16 using J0 and J0' = −J1:
// error ≤ h⁴/384 · max|J0⁗| ≤ 1.5e-8 absolute, and it falls as x^{−½}; beyond x = 8192 it calls besselJ0. fastJ1 is the
// same with J1 and J1' = J0 − J1/x (A&S 9.1.28), the same bound; beyond the table it calls besselJ1.

const TWO_OVER_PI = 2 / Math.PI;
const SQRT_HALF = Math.SQRT1_2;

function seriesJ0(x: number): number {
  const y = -0.25 * x * x;
  let term = 1;
  let sum = 1;
  for (let k = 1; k < 60; k++) {
    term *= y / (k * k);
    sum += term;
    if (Math.abs(term) < 1e-17 * Math.abs(sum) + 1e-300) break;
  }
  return sum;
}

function seriesJ1(x: number): number {
  const y = -0.25 * x * x;
  let term = 0.5 * x;
  let sum = term;
  for (let k = 1; k < 60; k++) {
    term *= y / (k * (k + 1));
    sum += term;
    if (Math.abs(term) < 1e-17 * Math.abs(sum) + 1e-300) break;
  }
  return sum;
}

/** Hankel's asymptotic P(x), Q(x) for order ν (μ = 4ν²), A&S 9.2.9–9.2.10. */
function hankelPQ(mu: number, x: number): [number, number] {
  const eightX = 8 * x;
  let p = 1;
  let q = 0;
  let term = 1; // a_k / (8x)^k with the sign of the expansion folded in below
  for (let k = 1; k < 80; k++) {
    const odd = 2 * k - 1;
    term *= (mu - odd * odd) / (k * eightX);
    if (Math.abs(term) < 1e-17) break;
    // k odd → Q gets (−1)^((k−1)/2) term; k even → P gets (−1)^(k/2) term
    if (k % 2 === 1) q += ((k - 1) / 2) % 2 === 0 ? term : -term;
    else p += (k / 2) % 2 === 0 ? term : -term;
  }
  return [p, q];
}

function asymptoticJ0(x: number): number {
  const [p, q] = hankelPQ(0, x);
  const c = Math.cos(x);
  const s = Math.sin(x);
  // cos(x − π/4) and sin(x − π/4) without losing digits in the subtraction
  const cx = (c + s) * SQRT_HALF;
  const sx = (s - c) * SQRT_HALF;
  return Math.sqrt(TWO_OVER_PI / x) * (p * cx - q * sx);
}

function asymptoticJ1(x: number): number {
  const [p, q] = hankelPQ(4, x);
  const c = Math.cos(x);
  const s = Math.sin(x);
  // cos(x − 3π/4) and sin(x − 3π/4)
  const cx = (s - c) * SQRT_HALF;
  const sx = -(s + c) * SQRT_HALF;
  return Math.sqrt(TWO_OVER_PI / x) * (p * cx - q * sx);
}

/**
 * J_0 … J_nMax at x ≥ 0 by Miller's backward recurrence J_{k−1} = (2k/x) J_k − J_{k+1},
 * normalised with J_0 + 2 Σ J_{2k} = 1. Accurate to ~1e-15 absolute for every order.
 */
export function besselJnArray(nMax: number, x: number): Float64Array {
  const out = new Float64Array(nMax + 1);
  const ax = Math.abs(x);
  if (ax === 0) {
    out[0] = 1;
    return out;
  }
  const m = Math.max(nMax, ax);
  let start = Math.ceil(m + 12 * Math.cbrt(m) + 20);
  if (start % 2 === 1) start += 1;
  let jNext = 0;
  let j = 1e-30;
  let norm = 0;
  for (let k = start; k >= 1; k--) {
    // j holds J_k (unnormalised); compute J_{k−1}
    if (k <= nMax) out[k] = j;
    if (k % 2 === 0) norm += 2 * j;
    const jPrev = ((2 * k) / ax) * j - jNext;
    jNext = j;
    j = jPrev;
    if (Math.abs(j) > 1e250) {
      // rescale everything held so far to stay in range
      const f = 1e-250;
      j *= f;
      jNext *= f;
      norm *= f;
      for (let i = k; i <= nMax; i++) out[i] *= f;
    }
  }
  out[0] = j;
  norm += j;
  for (let i = 0; i <= nMax; i++) out[i] /= norm;
  if (x < 0) for (let i = 1; i <= nMax; i += 2) out[i] = -out[i];
  return out;
}

/** J_0(x), own implementation (see the header for method and accuracy). */
export function besselJ0(x: number): number {
  const ax = Math.abs(x);
  if (ax <= 8) return seriesJ0(ax);
  if (ax < 25) return besselJnArray(1, ax)[0];
  return asymptoticJ0(ax);
}

/** J_1(x), own implementation; odd in x. */
export function besselJ1(x: number): number {
  const ax = Math.abs(x);
  let v: number;
  if (ax <= 8) v = seriesJ1(ax);
  else if (ax < 25) v = besselJnArray(1, ax)[1];
  else v = asymptoticJ1(ax);
  return x < 0 ? -v : v;
}

// ---- tabulated J0 for the hot loop of the profile quadrature ----

const TABLE_STEP = 1 / 16;
const TABLE_INV_STEP = 16;
const TABLE_MAX_X = 8192;
// interleaved [J0(x_i), h·J0'(x_i)] pairs; grown on demand and kept (deterministic, so callers stay pure)
let table = new Float64Array(0);
let tableCount = 0;

function ensureTable(xMax: number): void {
  const needed = Math.min(Math.ceil(Math.min(xMax, TABLE_MAX_X) * TABLE_INV_STEP) + 2, TABLE_MAX_X * TABLE_INV_STEP + 2);
  if (needed <= tableCount) return;
  const count = Math.min(Math.max(needed, tableCount * 2, 4096), TABLE_MAX_X * TABLE_INV_STEP + 2);
  const next = new Float64Array(2 * count);
  next.set(table);
  for (let i = tableCount; i < count; i++) {
    const x = i * TABLE_STEP;
    next[2 * i] = besselJ0(x);
    next[2 * i + 1] = -TABLE_STEP * besselJ1(x);
  }
  table = next;
  tableCount = count;
}

/** Prepare fastJ0 for arguments up to xMax (call once before a loop). */
export function prepareFastJ0(xMax: number): void {
  ensureTable(xMax);
}

/**
 * The Hermite table itself, for loops that inline the lookup: pairs [J0(i/16), J0'(i/16)/16] for i < count.
 * Call after prepareFastJ0; the arrays stay valid until the next prepareFastJ0 grows them.
 */
export function fastJ0Table(): { table: Float64Array; count: number; invStep: number } {
  return { table, count: tableCount, invStep: TABLE_INV_STEP };
}

/**
 * J_0(x) for x ≥ 8192 from Hankel's expansion cut after the terms that matter there (A&S 9.2.5, 9.2.9–9.2.10):
 * P = 1 − 9/(2(8x)²), Q = −1/(8x) + 75/(2(8x)³); the next terms are below 3e-17.
 */
function farJ0(x: number): number {
  const e = 1 / (8 * x);
  const p = 1 - 4.5 * e * e;
  const q = -e + 37.5 * e * e * e;
  const c = Math.cos(x);
  const s = Math.sin(x);
  return Math.sqrt(TWO_OVER_PI / x) * SQRT_HALF * (p * (c + s) - q * (s - c));
}

/** J_0(x) for x ≥ 0 from the Hermite table (≤ 1.5e-8 absolute); call prepareFastJ0 first. */
export function fastJ0(x: number): number {
  const u = x * TABLE_INV_STEP;
  const i = Math.floor(u);
  if (i + 1 >= tableCount) return x >= TABLE_MAX_X ? farJ0(x) : besselJ0(x);
  const t = u - i;
  const k = 2 * i;
  const y0 = table[k];
  const d0 = table[k + 1];
  const y1 = table[k + 2];
  const d1 = table[k + 3];
  const t2 = t * t;
  const t3 = t2 * t;
  return (2 * t3 - 3 * t2 + 1) * y0 + (t3 - 2 * t2 + t) * d0 + (-2 * t3 + 3 * t2) * y1 + (t3 - t2) * d1;
}

// ---- tabulated J1, the same way ----

let table1 = new Float64Array(0);
let table1Count = 0;

/** Prepare fastJ1 for arguments up to xMax (call once before a loop). */
export function prepareFastJ1(xMax: number): void {
  const needed = Math.min(Math.ceil(Math.min(xMax, TABLE_MAX_X) * TABLE_INV_STEP) + 2, TABLE_MAX_X * TABLE_INV_STEP + 2);
  if (needed <= table1Count) return;
  const count = Math.min(Math.max(needed, table1Count * 2, 4096), TABLE_MAX_X * TABLE_INV_STEP + 2);
  const next = new Float64Array(2 * count);
  next.set(table1);
  for (let i = table1Count; i < count; i++) {
    const x = i * TABLE_STEP;
    const j1 = besselJ1(x);
    next[2 * i] = j1;
    next[2 * i + 1] = TABLE_STEP * (x === 0 ? 0.5 : besselJ0(x) - j1 / x);
  }
  table1 = next;
  table1Count = count;
}

/** J_1(x) for x ≥ 0 from the Hermite table (≤ 1.5e-8 absolute); call prepareFastJ1 first. */
export function fastJ1(x: number): number {
  const u = x * TABLE_INV_STEP;
  const i = Math.floor(u);
  if (i + 1 >= table1Count) return besselJ1(x);
  const t = u - i;
  const k = 2 * i;
  const t2 = t * t;
  const t3 = t2 * t;
  return (2 * t3 - 3 * t2 + 1) * table1[k] + (t3 - 2 * t2 + t) * table1[k + 1] + (-2 * t3 + 3 * t2) * table1[k + 2] + (t3 - t2) * table1[k + 3];
}
