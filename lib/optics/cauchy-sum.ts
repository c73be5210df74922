// Cauchy sums Σ_{m≠n} w_m / (x_n − x_m) at every point of a set on the line, for several weight vectors at once, in O(N·p).
// Sources: Greengard & Rokhlin, J. Comput. Phys. 73, 325 (1987) (the fast multipole method); Dutt, Gu & Rokhlin, SIAM J.
// Numer. Anal. 33, 1689 (1996) (this kernel on the line with Chebyshev expansions); Fong & Darve, J. Comput. Phys. 228,
// 8712 (2009) (black-box FMM: Chebyshev interpolation of the kernel); Dehnen, J. Comput. Phys. 179, 27 (2002) (the
// mutual dual-tree walk).
//
// Method. The points are partitioned into an adaptive binary tree of dyadic boxes [c − a, c + a] (each box's points
// contiguous, the left half's first): the root is aligned to a power-of-two grid, so every centre and half-width is exact
// in floating point and same-sized boxes sit whole numbers of widths apart; a box with at most LEAF_SIZE points (or too
// narrow to halve exactly) is a leaf. Each box carries the Chebyshev moments μ_k = Σ w_m T_k((x_m − c)/a), k < p
// (children's moments shift to the parent exactly: T_k(±½ + u/2) is a polynomial of degree k in u), and a local
// expansion Σ a_k T_k((x − c)/a). A mutual walk over pairs of boxes (A left of B) sends B's moments into A's expansion
// and A's into B's when the boxes are well separated — |c_A − c_B| ≥ 3a_B + a_A and ≥ 3a_A + a_B — which amounts to
// interpolating 1/(x − y) at p × p Chebyshev nodes of the pair (the black-box FMM in the Chebyshev basis); otherwise it
// splits the wider box, and two leaves (or two boxes with few points) are summed directly, one division serving both
// directions. The expansions shift down exactly and are evaluated at the points. Weight vectors go four at a time,
// interleaved, so that every division, node and matrix entry serves four products; one or two vectors (or the last one
// or two of more) go two at a time, through inner loops written for two lanes whose matrix, moment and evaluation loops
// take four rows (coefficients, points) where the four-lane ones take two, so that each value loaded still serves eight
// products. Per lane both sets do the same operations in the same order: a vector's sums do not depend on the vectors
// beside it, bit for bit. Below DIRECT_BELOW points
// the direct double loop is used (the measured cross-over). Measured on the field chain's clustered nodes with four
// vectors: 8.7× faster than the plain direct double loop at N = 1000, 17× at 2000, 59× at 8000; one or two vectors take
// 0.6 of the time of four (not 0.5: the divisions of the direct sums, the tree and the walk do not depend on the lanes).
//
// Error. Through an expansion the kernel K = 1/(x − y) is interpolated in y at the source box's nodes, then in x at the
// target box's: K − I_x I_y K = (K − I_x K) + I_x(K − I_y K). For this kernel the error of interpolation in y is exactly
// ω(y)/ω(x) · K(x, y) (ω the node polynomial), at most |K|/T_p(t) with t ≥ 3 the distance of x from the source centre in
// source half-widths (the separation rule); the same holds in x, and I_x only adds to the second term a relative
// O(1/T_p(3)). So every pair taken through an expansion has a relative error ≤ 2/T_p(3) = 7.7e-11 for p = 14
// (T_14(3) = 2.6e10; the largest |K − I_x I_y K|/|K| over the admissible geometries, on a 1201 × 1201 grid, is 7.66e-11),
// and every output obeys
//   |error of out[k][n]| ≤ 7.7e-11 · Σ_{m≠n} |w_m/(x_n − x_m)|   (plus rounding, ~1e-15 of the same sum).
// tests/unit/optics/cauchy-sum.test.ts measures the ratio: up to ~6e-11 when only a few points carry weight (the far
// pairs dominate), ~2e-12 for dense weights.

/** Chebyshev order p (nodes per box; even, see multiplyAdd): 2/T_p(3) = 7.7e-11 at 14. */
const ORDER = 14;
/** A box with more points than this is split. */
const LEAF_SIZE = 32;
/** Well separated: the other box's centre is at least this many own half-widths beyond one's own edge. */
const SEPARATION = 3;
/** Two boxes whose point counts multiply to at most this are summed directly (cheaper than an expansion). */
const DIRECT_PAIRS = 128;
/** Below this many points the whole sum is the direct double loop. */
const DIRECT_BELOW = 200;
/** Weight vectors are handled four at a time, interleaved (a missing one is zeros); a group of one or two takes two lanes. */
const LANES = 4;
/** Half-widths below this are not halved (they would leave the normal range of doubles). */
const SMALLEST_HALF = 2 ** -1000;
/** A box is halved only while its children's centres stay exact: |c| + a below 2^52 of the child half-width. */
const EXACT_SPAN = 2 ** 52;

const CHEB_NODES = chebyshevNodes();
/** CHEB_TO_NODAL[j·p + k] = (2 − δ_k0)/p · T_k(t_j): the Lagrange polynomial of node j in the Chebyshev basis. */
const CHEB_TO_NODAL = lagrangeCoefficients();
/** T_r(∓½ + u/2) = Σ_l SHIFT[r·p + l] T_l(u): a child's coordinate u in its parent's frame (left, right child). */
const SHIFT_LEFT = shiftMatrix(-1);
const SHIFT_RIGHT = shiftMatrix(1);
const SHIFT_LEFT_T = transpose(SHIFT_LEFT);
const SHIFT_RIGHT_T = transpose(SHIFT_RIGHT);
/** The operators between same-sized boxes two and three widths apart (centre offsets −4 and −6 half-widths). */
const NEXT_BUT_ONE = standardInteraction(-4);
const NEXT_BUT_TWO = standardInteraction(-6);

/**
 * For every n: out[k][n] = Σ_{m≠n} weights[k][m] / (points[n] − points[m]), for each weight vector k.
 * The points must be finite (RangeError otherwise) and distinct (coincident points give non-finite sums, as the direct
 * sum would); out may be the weight vectors themselves.
 */
export function cauchySums(points: Float64Array, weights: readonly Float64Array[], out: readonly Float64Array[]): void {
  const n = points.length;
  checkShapes(points, weights, out);
  if (n === 0 || weights.length === 0) return;
  const xs = points.slice();
  const order = new Int32Array(n);
  for (let i = 0; i < n; i++) order[i] = i;
  const tree = n < DIRECT_BELOW ? null : buildTree(xs, order);
  const groups: Group[] = [];
  for (let first = 0; first < weights.length; first += LANES) {
    const kernels = weights.length - first <= 2 ? TWO : FOUR;
    groups.push({ kernels, w: interleave(weights, first, kernels.lanes, order), o: new Float64Array(kernels.lanes * n) });
  }
  if (tree === null) for (const g of groups) directSelf(g.kernels, xs, g.w, g.o, 0, n);
  else multipole(tree, xs, groups);
  for (let k = 0; k < out.length; k++) {
    const g = groups[Math.floor(k / LANES)];
    deinterleave(g.o, g.kernels.lanes, k % LANES, order, out[k]);
  }
}

function checkShapes(points: Float64Array, weights: readonly Float64Array[], out: readonly Float64Array[]): void {
  const n = points.length;
  if (weights.length !== out.length) throw new RangeError("cauchySums: as many output vectors as weight vectors are needed");
  for (const v of weights) if (v.length !== n) throw new RangeError("cauchySums: every weight vector needs one entry per point");
  for (const v of out) if (v.length !== n) throw new RangeError("cauchySums: every output vector needs one entry per point");
  for (let i = 0; i < n; i++) if (!Number.isFinite(points[i])) throw new RangeError("cauchySums: points must be finite");
}

/** Weight vectors first … first + lanes − 1 (those that exist), reordered like the points and interleaved point by point. */
function interleave(weights: readonly Float64Array[], first: number, lanes: number, order: Int32Array): Float64Array {
  const n = order.length;
  const w = new Float64Array(lanes * n);
  for (let lane = 0; lane < lanes && first + lane < weights.length; lane++) {
    const v = weights[first + lane];
    for (let i = 0; i < n; i++) w[lanes * i + lane] = v[order[i]];
  }
  return w;
}

function deinterleave(o: Float64Array, lanes: number, lane: number, order: Int32Array, out: Float64Array): void {
  for (let i = 0; i < order.length; i++) out[order[i]] = o[lanes * i + lane];
}

// ——— the inner loops, one set per lane count ———

/** Which entries of a p × p matrix may be nonzero: all, k ≤ l (the up-shift) or k ≥ l (the down-shift). */
const FULL = 0;
const LOWER = 1;
const UPPER = 2;

/**
 * Everything that depends on how many weight vectors are interleaved (L, the lanes). Each set is written out with its
 * accumulators unrolled, so that they stay in registers (a loop over the lanes, accumulating in an array, measured 3.3×
 * slower for two lanes). Both sets do, lane by lane, the same operations in the same order (the two-lane matrix loop
 * also takes a few more of a band's zero entries, which add exactly nothing), so a vector's sums are the same bit for bit
 * in a group of four or of two.
 * The loops copy ORDER into a local p: V8 reloads and rechecks a module-level constant at every use inside a loop.
 */
type Kernels = {
  lanes: number;
  /** Point i with the points of [start, end) (i outside it), both directions. */
  directRow: (xs: Float64Array, w: Float64Array, o: Float64Array, i: number, start: number, end: number) => void;
  /** Points i and i + 1 with the points of [start, end), both directions: each point j is loaded and stored once for two. */
  directRows: (xs: Float64Array, w: Float64Array, o: Float64Array, i: number, start: number, end: number) => void;
  /** dst[to + L·l + lane] += scale · Σ_k m[l·p + k] · src[from + L·k + lane], every row l and lane, over the matrix's band. */
  multiplyAdd: (m: Float64Array, band: number, src: Float64Array, from: number, dst: Float64Array, to: number, scale: number) => void;
  /** moments[at + L·l + lane] = Σ_i w[L·i + lane] · rows[i·p + l] over the points i of [start, end). */
  moments: (w: Float64Array, rows: Float64Array, start: number, end: number, moments: Float64Array, at: number) => void;
  /** o[L·i + lane] += Σ_l local[at + L·l + lane] · rows[i·p + l] at the points i of [start, end). */
  evaluate: (local: Float64Array, at: number, rows: Float64Array, start: number, end: number, o: Float64Array) => void;
};

/** All pairs inside the range [start, end). */
function directSelf(k: Kernels, xs: Float64Array, w: Float64Array, o: Float64Array, start: number, end: number): void {
  for (let i = start; i + 1 < end; i += 2) {
    k.directRow(xs, w, o, i, i + 1, i + 2);
    k.directRows(xs, w, o, i, i + 2, end);
  }
}

/** Every point of [startA, endA) with every point of [startB, endB). */
function directPair(k: Kernels, xs: Float64Array, w: Float64Array, o: Float64Array, startA: number, endA: number, startB: number, endB: number): void {
  let i = startA;
  for (; i + 1 < endA; i += 2) k.directRows(xs, w, o, i, startB, endB);
  if (i < endA) k.directRow(xs, w, o, i, startB, endB);
}

// four lanes: two rows (points, coefficients) at a time, so that each value loaded serves eight products

const FOUR: Kernels = { lanes: 4, directRow: directRow4, directRows: directRows4, multiplyAdd: multiplyAdd4, moments: moments4, evaluate: evaluate4 };

function directRow4(xs: Float64Array, w: Float64Array, o: Float64Array, i: number, start: number, end: number): void {
  const xi = xs[i];
  const i4 = 4 * i;
  const v0 = w[i4], v1 = w[i4 + 1], v2 = w[i4 + 2], v3 = w[i4 + 3];
  let a0 = 0, a1 = 0, a2 = 0, a3 = 0;
  for (let j = start; j < end; j++) {
    const d = 1 / (xi - xs[j]);
    const j4 = 4 * j;
    a0 += w[j4] * d;
    a1 += w[j4 + 1] * d;
    a2 += w[j4 + 2] * d;
    a3 += w[j4 + 3] * d;
    o[j4] -= v0 * d;
    o[j4 + 1] -= v1 * d;
    o[j4 + 2] -= v2 * d;
    o[j4 + 3] -= v3 * d;
  }
  add4(o, i4, a0, a1, a2, a3);
}

function directRows4(xs: Float64Array, w: Float64Array, o: Float64Array, i: number, start: number, end: number): void {
  const xi = xs[i];
  const xk = xs[i + 1];
  const i4 = 4 * i;
  const v0 = w[i4], v1 = w[i4 + 1], v2 = w[i4 + 2], v3 = w[i4 + 3];
  const u0 = w[i4 + 4], u1 = w[i4 + 5], u2 = w[i4 + 6], u3 = w[i4 + 7];
  let a0 = 0, a1 = 0, a2 = 0, a3 = 0, b0 = 0, b1 = 0, b2 = 0, b3 = 0;
  for (let j = start; j < end; j++) {
    const x = xs[j];
    const d = 1 / (xi - x);
    const e = 1 / (xk - x);
    const j4 = 4 * j;
    const w0 = w[j4], w1 = w[j4 + 1], w2 = w[j4 + 2], w3 = w[j4 + 3];
    a0 += w0 * d;
    a1 += w1 * d;
    a2 += w2 * d;
    a3 += w3 * d;
    b0 += w0 * e;
    b1 += w1 * e;
    b2 += w2 * e;
    b3 += w3 * e;
    o[j4] -= v0 * d + u0 * e;
    o[j4 + 1] -= v1 * d + u1 * e;
    o[j4 + 2] -= v2 * d + u2 * e;
    o[j4 + 3] -= v3 * d + u3 * e;
  }
  add4(o, i4, a0, a1, a2, a3);
  add4(o, i4 + 4, b0, b1, b2, b3);
}

/** Two rows at a time (ORDER is even). */
function multiplyAdd4(m: Float64Array, band: number, src: Float64Array, from: number, dst: Float64Array, to: number, scale: number): void {
  const p = ORDER;
  for (let l = 0; l < p; l += 2) {
    const first = band === UPPER ? l : 0;
    const last = band === LOWER ? l + 2 : p;
    const rowE = l * p, rowF = rowE + p;
    let s0 = 0, s1 = 0, s2 = 0, s3 = 0, r0 = 0, r1 = 0, r2 = 0, r3 = 0;
    for (let k = first; k < last; k++) {
      const e = m[rowE + k];
      const f = m[rowF + k];
      const at = from + 4 * k;
      const c0 = src[at], c1 = src[at + 1], c2 = src[at + 2], c3 = src[at + 3];
      s0 += e * c0;
      s1 += e * c1;
      s2 += e * c2;
      s3 += e * c3;
      r0 += f * c0;
      r1 += f * c1;
      r2 += f * c2;
      r3 += f * c3;
    }
    const at = to + 4 * l;
    add4(dst, at, scale * s0, scale * s1, scale * s2, scale * s3);
    add4(dst, at + 4, scale * r0, scale * r1, scale * r2, scale * r3);
  }
}

/** Two l at a time. */
function moments4(w: Float64Array, rows: Float64Array, start: number, end: number, moments: Float64Array, at: number): void {
  const p = ORDER;
  for (let l = 0; l < p; l += 2) {
    let s0 = 0, s1 = 0, s2 = 0, s3 = 0, r0 = 0, r1 = 0, r2 = 0, r3 = 0;
    for (let i = start, row = start * p + l; i < end; i++, row += p) {
      const e = rows[row];
      const f = rows[row + 1];
      const i4 = 4 * i;
      const w0 = w[i4], w1 = w[i4 + 1], w2 = w[i4 + 2], w3 = w[i4 + 3];
      s0 += w0 * e;
      s1 += w1 * e;
      s2 += w2 * e;
      s3 += w3 * e;
      r0 += w0 * f;
      r1 += w1 * f;
      r2 += w2 * f;
      r3 += w3 * f;
    }
    set4(moments, at + 4 * l, s0, s1, s2, s3);
    set4(moments, at + 4 * l + 4, r0, r1, r2, r3);
  }
}

/** Two points at a time. */
function evaluate4(local: Float64Array, at: number, rows: Float64Array, start: number, end: number, o: Float64Array): void {
  const p = ORDER;
  for (let i = start; i < end; i += 2) {
    const j = Math.min(i + 1, end - 1); // an odd last point is taken twice and kept once
    const rowI = i * p, rowJ = j * p;
    let s0 = 0, s1 = 0, s2 = 0, s3 = 0, r0 = 0, r1 = 0, r2 = 0, r3 = 0;
    for (let l = 0; l < p; l++) {
      const e = rows[rowI + l];
      const f = rows[rowJ + l];
      const from = at + 4 * l;
      const c0 = local[from], c1 = local[from + 1], c2 = local[from + 2], c3 = local[from + 3];
      s0 += c0 * e;
      s1 += c1 * e;
      s2 += c2 * e;
      s3 += c3 * e;
      r0 += c0 * f;
      r1 += c1 * f;
      r2 += c2 * f;
      r3 += c3 * f;
    }
    add4(o, 4 * i, s0, s1, s2, s3);
    if (j > i) add4(o, 4 * j, r0, r1, r2, r3);
  }
}

function add4(o: Float64Array, at: number, s0: number, s1: number, s2: number, s3: number): void {
  o[at] += s0;
  o[at + 1] += s1;
  o[at + 2] += s2;
  o[at + 3] += s3;
}

// two lanes (one or two weight vectors): the direct sums still take two rows at a time (their divisions, which do not
// depend on the lanes, bound them), the rest four rows, so that each value loaded serves eight products as above

const TWO: Kernels = { lanes: 2, directRow: directRow2, directRows: directRows2, multiplyAdd: multiplyAdd2, moments: moments2, evaluate: evaluate2 };

function directRow2(xs: Float64Array, w: Float64Array, o: Float64Array, i: number, start: number, end: number): void {
  const xi = xs[i];
  const i2 = 2 * i;
  const v0 = w[i2], v1 = w[i2 + 1];
  let a0 = 0, a1 = 0;
  for (let j = start; j < end; j++) {
    const d = 1 / (xi - xs[j]);
    const j2 = 2 * j;
    a0 += w[j2] * d;
    a1 += w[j2 + 1] * d;
    o[j2] -= v0 * d;
    o[j2 + 1] -= v1 * d;
  }
  o[i2] += a0;
  o[i2 + 1] += a1;
}

function directRows2(xs: Float64Array, w: Float64Array, o: Float64Array, i: number, start: number, end: number): void {
  const xi = xs[i];
  const xk = xs[i + 1];
  const i2 = 2 * i;
  const v0 = w[i2], v1 = w[i2 + 1];
  const u0 = w[i2 + 2], u1 = w[i2 + 3];
  let a0 = 0, a1 = 0, b0 = 0, b1 = 0;
  for (let j = start; j < end; j++) {
    const x = xs[j];
    const d = 1 / (xi - x);
    const e = 1 / (xk - x);
    const j2 = 2 * j;
    const w0 = w[j2], w1 = w[j2 + 1];
    a0 += w0 * d;
    a1 += w1 * d;
    b0 += w0 * e;
    b1 += w1 * e;
    o[j2] -= v0 * d + u0 * e;
    o[j2 + 1] -= v1 * d + u1 * e;
  }
  o[i2] += a0;
  o[i2 + 1] += a1;
  o[i2 + 2] += b0;
  o[i2 + 3] += b1;
}

/** Four rows at a time: l, l + 1, g, g + 1 (g = l + 2; in the last group g = l, computed again and not stored). */
function multiplyAdd2(m: Float64Array, band: number, src: Float64Array, from: number, dst: Float64Array, to: number, scale: number): void {
  const p = ORDER;
  for (let l = 0; l < p; l += 4) {
    const g = Math.min(l + 2, p - 2);
    const first = band === UPPER ? l : 0;
    const last = band === LOWER ? g + 2 : p;
    const rowE = l * p, rowF = rowE + p, rowY = g * p, rowZ = rowY + p;
    let s0 = 0, s1 = 0, r0 = 0, r1 = 0, t0 = 0, t1 = 0, q0 = 0, q1 = 0;
    for (let k = first; k < last; k++) {
      const e = m[rowE + k];
      const f = m[rowF + k];
      const y = m[rowY + k];
      const z = m[rowZ + k];
      const at = from + 2 * k;
      const c0 = src[at], c1 = src[at + 1];
      s0 += e * c0;
      s1 += e * c1;
      r0 += f * c0;
      r1 += f * c1;
      t0 += y * c0;
      t1 += y * c1;
      q0 += z * c0;
      q1 += z * c1;
    }
    add4(dst, to + 2 * l, scale * s0, scale * s1, scale * r0, scale * r1);
    if (g > l) add4(dst, to + 2 * g, scale * t0, scale * t1, scale * q0, scale * q1);
  }
}

/** Four l at a time: l, l + 1, g, g + 1 (g = l + 2; in the last group g = l, computed and stored again). */
function moments2(w: Float64Array, rows: Float64Array, start: number, end: number, moments: Float64Array, at: number): void {
  const p = ORDER;
  for (let l = 0; l < p; l += 4) {
    const g = Math.min(l + 2, p - 2);
    let s0 = 0, s1 = 0, r0 = 0, r1 = 0, t0 = 0, t1 = 0, q0 = 0, q1 = 0;
    for (let i = start, row = start * p; i < end; i++, row += p) {
      const e = rows[row + l];
      const f = rows[row + l + 1];
      const y = rows[row + g];
      const z = rows[row + g + 1];
      const w0 = w[2 * i], w1 = w[2 * i + 1];
      s0 += w0 * e;
      s1 += w1 * e;
      r0 += w0 * f;
      r1 += w1 * f;
      t0 += w0 * y;
      t1 += w1 * y;
      q0 += w0 * z;
      q1 += w1 * z;
    }
    set4(moments, at + 2 * l, s0, s1, r0, r1);
    set4(moments, at + 2 * g, t0, t1, q0, q1);
  }
}

/** Four points at a time (the last group repeats its last point as needed, each kept once). */
function evaluate2(local: Float64Array, at: number, rows: Float64Array, start: number, end: number, o: Float64Array): void {
  const p = ORDER;
  for (let i = start; i < end; i += 4) {
    const j = Math.min(i + 1, end - 1);
    const k = Math.min(i + 2, end - 1);
    const h = Math.min(i + 3, end - 1);
    const rowI = i * p, rowJ = j * p, rowK = k * p, rowH = h * p;
    let s0 = 0, s1 = 0, r0 = 0, r1 = 0, t0 = 0, t1 = 0, q0 = 0, q1 = 0;
    for (let l = 0; l < p; l++) {
      const e = rows[rowI + l];
      const f = rows[rowJ + l];
      const y = rows[rowK + l];
      const z = rows[rowH + l];
      const c0 = local[at + 2 * l], c1 = local[at + 2 * l + 1];
      s0 += c0 * e;
      s1 += c1 * e;
      r0 += c0 * f;
      r1 += c1 * f;
      t0 += c0 * y;
      t1 += c1 * y;
      q0 += c0 * z;
      q1 += c1 * z;
    }
    add2(o, 2 * i, s0, s1);
    if (j > i) add2(o, 2 * j, r0, r1);
    if (k > j) add2(o, 2 * k, t0, t1);
    if (h > k) add2(o, 2 * h, q0, q1);
  }
}

function add2(o: Float64Array, at: number, s0: number, s1: number): void {
  o[at] += s0;
  o[at + 1] += s1;
}

function set4(o: Float64Array, at: number, s0: number, s1: number, s2: number, s3: number): void {
  o[at] = s0;
  o[at + 1] = s1;
  o[at + 2] = s2;
  o[at + 3] = s3;
}

// ——— the tree ———

/** Boxes in preorder (a parent before its children); child index −1 when that half holds no point. */
type Tree = {
  size: number;
  centre: Float64Array;
  half: Float64Array;
  start: Int32Array;
  end: Int32Array;
  left: Int32Array;
  right: Int32Array;
};

/**
 * Reorders xs (and order with it) so that every box's points are contiguous, left half before right half; null when
 * the points span no finite nonzero width (then the direct sum is all there is).
 */
function buildTree(xs: Float64Array, order: Int32Array): Tree | null {
  let min = Infinity;
  let max = -Infinity;
  for (const x of xs) {
    min = Math.min(min, x);
    max = Math.max(max, x);
  }
  const span = max - min;
  if (!(span > 0 && span < Infinity)) return null;
  let a = 2 ** Math.ceil(Math.log2(span));
  while (a < span) a *= 2;
  while (a / 2 >= span) a /= 2;
  const lo = Math.floor(min / a) * a; // the root [lo, lo + 2a] holds every point since a ≥ span
  const t = emptyTree(4 * Math.ceil(xs.length / LEAF_SIZE) + 64);
  addBox(t, xs, order, lo + a, a, 0, xs.length);
  return t;
}

function emptyTree(capacity: number): Tree {
  return {
    size: 0,
    centre: new Float64Array(capacity),
    half: new Float64Array(capacity),
    start: new Int32Array(capacity),
    end: new Int32Array(capacity),
    left: new Int32Array(capacity),
    right: new Int32Array(capacity),
  };
}

function addBox(t: Tree, xs: Float64Array, order: Int32Array, c: number, a: number, start: number, end: number): number {
  if (t.size === t.centre.length) grow(t);
  const id = t.size++;
  t.centre[id] = c;
  t.half[id] = a;
  t.start[id] = start;
  t.end[id] = end;
  t.left[id] = -1;
  t.right[id] = -1;
  const h = a / 2;
  if (end - start <= LEAF_SIZE || h < SMALLEST_HALF || Math.abs(c) + a >= EXACT_SPAN * h) return id;
  const split = partition(xs, order, start, end, c);
  // the child is built before its index is stored: building may grow (replace) the arrays
  const left = split > start ? addBox(t, xs, order, c - h, h, start, split) : -1;
  const right = split < end ? addBox(t, xs, order, c + h, h, split, end) : -1;
  t.left[id] = left;
  t.right[id] = right;
  return id;
}

function grow(t: Tree): void {
  const bigger = emptyTree(2 * t.centre.length);
  bigger.centre.set(t.centre);
  bigger.half.set(t.half);
  bigger.start.set(t.start);
  bigger.end.set(t.end);
  bigger.left.set(t.left);
  bigger.right.set(t.right);
  t.centre = bigger.centre;
  t.half = bigger.half;
  t.start = bigger.start;
  t.end = bigger.end;
  t.left = bigger.left;
  t.right = bigger.right;
}

/** Moves the points of [start, end) below c to the front (Hoare's scheme); returns where the rest begins. */
function partition(xs: Float64Array, order: Int32Array, start: number, end: number, c: number): number {
  let i = start;
  let j = end - 1;
  for (;;) {
    while (i <= j && xs[i] < c) i++;
    while (i <= j && xs[j] >= c) j--;
    if (i >= j) return i;
    const x = xs[i];
    xs[i] = xs[j];
    xs[j] = x;
    const k = order[i];
    order[i] = order[j];
    order[j] = k;
    i++;
    j--;
  }
}

function isLeaf(t: Tree, b: number): boolean {
  return t.left[b] < 0 && t.right[b] < 0;
}

// ——— the multipole method ———

/** An M2L operator at unit source half-width and its transpose (the reverse direction, with a minus sign). */
type Interaction = { forward: Float64Array; reverse: Float64Array };

/** One group of up to four weight vectors: its inner loops, interleaved weights and sums. */
type Group = { kernels: Kernels; w: Float64Array; o: Float64Array };

type Work = Group & {
  xs: Float64Array;
  tree: Tree;
  /** Box b's coefficients, (b·p + l)·L + lane for coefficient l (L lanes); stride = p·L. */
  stride: number;
  moments: Float64Array;
  local: Float64Array;
  /** 1 once a box's local expansion holds something. */
  live: Uint8Array;
  /** T_l((x_i − c)/a) of every point in its leaf, at i·p + l. */
  rows: Float64Array;
};

function multipole(tree: Tree, xs: Float64Array, groups: Group[]): void {
  const rows = new Float64Array(xs.length * ORDER);
  for (const g of groups) {
    const stride = ORDER * g.kernels.lanes;
    const size = tree.size * stride;
    const { kernels, w, o } = g; // field by field, not {...g}: a spread object's shape made every work.x load megamorphic
    const work: Work = { kernels, w, o, xs, tree, stride, moments: new Float64Array(size), local: new Float64Array(size), live: new Uint8Array(tree.size), rows };
    for (let b = tree.size - 1; b >= 0; b--) upward(work, b);
    walkSelf(work, 0);
    for (let b = 0; b < tree.size; b++) downward(work, b);
  }
}

/** T_0 … T_{p−1} at u into rows[at …] and at v into rows[bt …]; the two recurrences run side by side. */
function chebyshevRows(u: number, v: number, rows: Float64Array, at: number, bt: number): void {
  const p = ORDER;
  let tu = 1, tv = 1, su = u, sv = v;
  rows[at] = 1;
  rows[bt] = 1;
  for (let k = 1; k < p; k++) {
    rows[at + k] = su;
    rows[bt + k] = sv;
    const nu = 2 * u * su - tu;
    const nv = 2 * v * sv - tv;
    tu = su;
    tv = sv;
    su = nu;
    sv = nv;
  }
}

/** A box's moments: from its points (a leaf) or shifted up from its children. */
function upward(work: Work, b: number): void {
  const t = work.tree;
  const { stride, moments } = work;
  if (isLeaf(t, b)) pointsToMoments(work, b);
  if (t.left[b] >= 0) work.kernels.multiplyAdd(SHIFT_LEFT, LOWER, moments, t.left[b] * stride, moments, b * stride, 1);
  if (t.right[b] >= 0) work.kernels.multiplyAdd(SHIFT_RIGHT, LOWER, moments, t.right[b] * stride, moments, b * stride, 1);
}

/** μ_l = Σ_i w_i T_l(u_i) over the leaf's points; the T_l(u_i) are kept for localToPoints. */
function pointsToMoments(work: Work, b: number): void {
  const { xs, tree, rows } = work;
  const c = tree.centre[b];
  const a = tree.half[b];
  const start = tree.start[b];
  const end = tree.end[b];
  for (let i = start; i < end; i += 2) {
    const j = Math.min(i + 1, end - 1);
    chebyshevRows((xs[i] - c) / a, (xs[j] - c) / a, rows, i * ORDER, j * ORDER);
  }
  work.kernels.moments(work.w, rows, start, end, work.moments, b * work.stride);
}

/** A box's local expansion: shifted down to its children, or evaluated at its points (a leaf). */
function downward(work: Work, b: number): void {
  if (work.live[b] === 0) return;
  const t = work.tree;
  if (isLeaf(t, b)) work.kernels.evaluate(work.local, b * work.stride, work.rows, t.start[b], t.end[b], work.o);
  if (t.left[b] >= 0) shiftDown(work, b, t.left[b], SHIFT_LEFT_T);
  if (t.right[b] >= 0) shiftDown(work, b, t.right[b], SHIFT_RIGHT_T);
}

function shiftDown(work: Work, parent: number, child: number, shiftT: Float64Array): void {
  work.kernels.multiplyAdd(shiftT, UPPER, work.local, parent * work.stride, work.local, child * work.stride, 1);
  work.live[child] = 1;
}

// ——— the mutual walk ———

function walkSelf(work: Work, b: number): void {
  const t = work.tree;
  if (isLeaf(t, b)) {
    directSelf(work.kernels, work.xs, work.w, work.o, t.start[b], t.end[b]);
    return;
  }
  if (t.left[b] >= 0) walkSelf(work, t.left[b]);
  if (t.right[b] >= 0) walkSelf(work, t.right[b]);
  if (t.left[b] >= 0 && t.right[b] >= 0) walkPair(work, t.left[b], t.right[b]);
}

/** Box A lies left of box B. */
function walkPair(work: Work, a: number, b: number): void {
  const t = work.tree;
  const leafA = isLeaf(t, a);
  const leafB = isLeaf(t, b);
  if ((t.end[a] - t.start[a]) * (t.end[b] - t.start[b]) <= DIRECT_PAIRS) directPair(work.kernels, work.xs, work.w, work.o, t.start[a], t.end[a], t.start[b], t.end[b]);
  else if (separated(t, a, b)) interact(work, a, b);
  else if (leafA && leafB) directPair(work.kernels, work.xs, work.w, work.o, t.start[a], t.end[a], t.start[b], t.end[b]);
  else {
    const splitA = !leafA && (leafB || t.half[a] >= t.half[b]);
    const splitB = !leafB && (leafA || t.half[b] >= t.half[a]);
    if (splitA) {
      if (t.left[a] >= 0) walkPairSplitB(work, t.left[a], b, splitB);
      if (t.right[a] >= 0) walkPairSplitB(work, t.right[a], b, splitB);
    } else walkPairSplitB(work, a, b, splitB);
  }
}

function walkPairSplitB(work: Work, a: number, b: number, splitB: boolean): void {
  const t = work.tree;
  if (!splitB) walkPair(work, a, b);
  else {
    if (t.left[b] >= 0) walkPair(work, a, t.left[b]);
    if (t.right[b] >= 0) walkPair(work, a, t.right[b]);
  }
}

function separated(t: Tree, a: number, b: number): boolean {
  const d = t.centre[b] - t.centre[a];
  const ha = t.half[a];
  const hb = t.half[b];
  return d >= SEPARATION * hb + ha && d >= SEPARATION * ha + hb;
}

/** B's moments into A's expansion and A's into B's (the reverse operator is −Mᵀ). */
function interact(work: Work, a: number, b: number): void {
  const t = work.tree;
  const hb = t.half[b];
  const m = operator(t.half[a] / hb, (t.centre[a] - t.centre[b]) / hb);
  const scale = 1 / hb;
  const atA = a * work.stride;
  const atB = b * work.stride;
  work.kernels.multiplyAdd(m.forward, FULL, work.moments, atB, work.local, atA, scale);
  work.kernels.multiplyAdd(m.reverse, FULL, work.moments, atA, work.local, atB, -scale);
  work.live[a] = 1;
  work.live[b] = 1;
}

/**
 * The walk only ever separates same-sized boxes two or three widths apart: it reaches a pair through a parent pair
 * that touches, and a box inside the larger one's neighbour stays within 3 of its half-widths. Any other geometry
 * would still get its exact operator, built here.
 */
function operator(ratio: number, offset: number): Interaction {
  if (ratio === 1 && offset === NEXT_BUT_ONE.offset) return NEXT_BUT_ONE;
  if (ratio === 1 && offset === NEXT_BUT_TWO.offset) return NEXT_BUT_TWO;
  const forward = buildInteraction(ratio, offset);
  return { forward, reverse: transpose(forward) };
}

function standardInteraction(offset: number): Interaction & { offset: number } {
  const forward = buildInteraction(1, offset);
  return { forward, reverse: transpose(forward), offset };
}

/**
 * M = Cᵀ G C for a source box of half-width 1 and a target box of half-width `ratio` whose centre is `offset` from the
 * source's: G_ij = 1/(offset + ratio·t_i − t_j) is the kernel between the nodes, C takes moments to nodal weights on
 * the source side and nodal values to Chebyshev coefficients on the target side.
 */
function buildInteraction(ratio: number, offset: number): Float64Array {
  const p = ORDER;
  const g = new Float64Array(p * p);
  for (let i = 0; i < p; i++) for (let j = 0; j < p; j++) g[i * p + j] = 1 / (offset + ratio * CHEB_NODES[i] - CHEB_NODES[j]);
  const gc = new Float64Array(p * p);
  for (let i = 0; i < p; i++) {
    for (let k = 0; k < p; k++) {
      let s = 0;
      for (let j = 0; j < p; j++) s += g[i * p + j] * CHEB_TO_NODAL[j * p + k];
      gc[i * p + k] = s;
    }
  }
  const m = new Float64Array(p * p);
  for (let l = 0; l < p; l++) {
    for (let k = 0; k < p; k++) {
      let s = 0;
      for (let i = 0; i < p; i++) s += CHEB_TO_NODAL[i * p + l] * gc[i * p + k];
      m[l * p + k] = s;
    }
  }
  return m;
}

// ——— constant tables ———

function chebyshevNodes(): Float64Array {
  const t = new Float64Array(ORDER);
  for (let j = 0; j < ORDER; j++) t[j] = Math.cos(((2 * j + 1) * Math.PI) / (2 * ORDER));
  return t;
}

function lagrangeCoefficients(): Float64Array {
  const c = new Float64Array(ORDER * ORDER);
  for (let j = 0; j < ORDER; j++) {
    for (let k = 0; k < ORDER; k++) c[j * ORDER + k] = ((k === 0 ? 1 : 2) / ORDER) * Math.cos((k * (2 * j + 1) * Math.PI) / (2 * ORDER));
  }
  return c;
}

/** Row r: the Chebyshev coefficients of T_r(z), z = side/2 + u/2, by T_{r+1} = 2z·T_r − T_{r−1} on coefficient rows. */
function shiftMatrix(side: number): Float64Array {
  const p = ORDER;
  const s = new Float64Array(p * p);
  s[0] = 1;
  s[p] = side / 2;
  s[p + 1] = 1 / 2;
  for (let r = 1; r < p - 1; r++) {
    const cur = r * p;
    const next = cur + p;
    for (let l = 0; l <= r; l++) {
      const c = s[cur + l];
      s[next + l] += side * c - s[cur - p + l]; // 2z·T = side·T + u·T, minus T_{r−1}
      if (l === 0) s[next + 1] += c;
      else {
        s[next + l + 1] += c / 2;
        s[next + l - 1] += c / 2;
      }
    }
  }
  return s;
}

function transpose(m: Float64Array): Float64Array {
  const t = new Float64Array(ORDER * ORDER);
  for (let i = 0; i < ORDER; i++) for (let j = 0; j < ORDER; j++) t[j * ORDER + i] = m[i * ORDER + j];
  return t;
}
