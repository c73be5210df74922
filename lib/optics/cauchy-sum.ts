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
// interleaved, so that every division, node and matrix entry serves four products. Below DIRECT_BELOW points the
// direct double loop is used (the measured cross-over). Measured on the field chain's clustered nodes with four vectors:
// 8.7× faster than the plain direct double loop at N = 1000, 17× at 2000, 59× at 8000.
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
/** Weight vectors are handled four at a time, interleaved (a missing fourth is zeros). */
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
  const w: Float64Array[] = [];
  const o: Float64Array[] = [];
  for (let first = 0; first < weights.length; first += LANES) {
    w.push(interleave(weights, first, order));
    o.push(new Float64Array(LANES * n));
  }
  if (tree === null) for (let g = 0; g < w.length; g++) directSelf(xs, w[g], o[g], 0, n);
  else multipole(tree, xs, w, o);
  for (let k = 0; k < out.length; k++) deinterleave(o[Math.floor(k / LANES)], k % LANES, order, out[k]);
}

function checkShapes(points: Float64Array, weights: readonly Float64Array[], out: readonly Float64Array[]): void {
  const n = points.length;
  if (weights.length !== out.length) throw new RangeError("cauchySums: as many output vectors as weight vectors are needed");
  for (const v of weights) if (v.length !== n) throw new RangeError("cauchySums: every weight vector needs one entry per point");
  for (const v of out) if (v.length !== n) throw new RangeError("cauchySums: every output vector needs one entry per point");
  for (let i = 0; i < n; i++) if (!Number.isFinite(points[i])) throw new RangeError("cauchySums: points must be finite");
}

/** Weight vectors first … first + 3, reordered like the points and interleaved point by point. */
function interleave(weights: readonly Float64Array[], first: number, order: Int32Array): Float64Array {
  const n = order.length;
  const w = new Float64Array(LANES * n);
  for (let lane = 0; lane < LANES && first + lane < weights.length; lane++) {
    const v = weights[first + lane];
    for (let i = 0; i < n; i++) w[LANES * i + lane] = v[order[i]];
  }
  return w;
}

function deinterleave(o: Float64Array, lane: number, order: Int32Array, out: Float64Array): void {
  for (let i = 0; i < order.length; i++) out[order[i]] = o[LANES * i + lane];
}

// ——— direct sums (one division serves the pair in both directions) ———

/** All pairs inside the range [start, end). */
function directSelf(xs: Float64Array, w: Float64Array, o: Float64Array, start: number, end: number): void {
  for (let i = start; i + 1 < end; i += 2) {
    directRow(xs, w, o, i, i + 1, i + 2);
    directRows(xs, w, o, i, i + 2, end);
  }
}

/** Every point of [startA, endA) with every point of [startB, endB). */
function directPair(xs: Float64Array, w: Float64Array, o: Float64Array, startA: number, endA: number, startB: number, endB: number): void {
  let i = startA;
  for (; i + 1 < endA; i += 2) directRows(xs, w, o, i, startB, endB);
  if (i < endA) directRow(xs, w, o, i, startB, endB);
}

/** Point i with the points of [start, end) (i outside it), both directions. */
function directRow(xs: Float64Array, w: Float64Array, o: Float64Array, i: number, start: number, end: number): void {
  const xi = xs[i];
  const i4 = LANES * i;
  const v0 = w[i4], v1 = w[i4 + 1], v2 = w[i4 + 2], v3 = w[i4 + 3];
  let a0 = 0, a1 = 0, a2 = 0, a3 = 0;
  for (let j = start; j < end; j++) {
    const d = 1 / (xi - xs[j]);
    const j4 = LANES * j;
    a0 += w[j4] * d;
    a1 += w[j4 + 1] * d;
    a2 += w[j4 + 2] * d;
    a3 += w[j4 + 3] * d;
    o[j4] -= v0 * d;
    o[j4 + 1] -= v1 * d;
    o[j4 + 2] -= v2 * d;
    o[j4 + 3] -= v3 * d;
  }
  addLanes(o, i4, a0, a1, a2, a3);
}

/** Points i and i + 1 with the points of [start, end), both directions: each point j is loaded and stored once for two. */
function directRows(xs: Float64Array, w: Float64Array, o: Float64Array, i: number, start: number, end: number): void {
  const xi = xs[i];
  const xk = xs[i + 1];
  const i4 = LANES * i;
  const v0 = w[i4], v1 = w[i4 + 1], v2 = w[i4 + 2], v3 = w[i4 + 3];
  const u0 = w[i4 + 4], u1 = w[i4 + 5], u2 = w[i4 + 6], u3 = w[i4 + 7];
  let a0 = 0, a1 = 0, a2 = 0, a3 = 0, b0 = 0, b1 = 0, b2 = 0, b3 = 0;
  for (let j = start; j < end; j++) {
    const x = xs[j];
    const d = 1 / (xi - x);
    const e = 1 / (xk - x);
    const j4 = LANES * j;
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
  addLanes(o, i4, a0, a1, a2, a3);
  addLanes(o, i4 + LANES, b0, b1, b2, b3);
}

function addLanes(o: Float64Array, at: number, s0: number, s1: number, s2: number, s3: number): void {
  o[at] += s0;
  o[at + 1] += s1;
  o[at + 2] += s2;
  o[at + 3] += s3;
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

type Work = {
  xs: Float64Array;
  tree: Tree;
  /** One group of four weight vectors: interleaved weights and sums, moments and local coefficients. */
  w: Float64Array;
  o: Float64Array;
  /** Box b, coefficient l, lane at (b·p + l)·4 + lane. */
  moments: Float64Array;
  local: Float64Array;
  /** 1 once a box's local expansion holds something. */
  live: Uint8Array;
  /** T_l((x_i − c)/a) of every point in its leaf, at i·p + l. */
  rows: Float64Array;
};

function multipole(tree: Tree, xs: Float64Array, w: Float64Array[], o: Float64Array[]): void {
  const rows = new Float64Array(xs.length * ORDER);
  const size = tree.size * ORDER * LANES;
  for (let g = 0; g < w.length; g++) {
    const work: Work = { xs, tree, w: w[g], o: o[g], moments: new Float64Array(size), local: new Float64Array(size), live: new Uint8Array(tree.size), rows };
    for (let b = tree.size - 1; b >= 0; b--) upward(work, b);
    walkSelf(work, 0);
    for (let b = 0; b < tree.size; b++) downward(work, b);
  }
}

/** T_0 … T_{p−1} at u into rows[at …] and at v into rows[bt …]; the two recurrences run side by side. */
function chebyshevRows(u: number, v: number, rows: Float64Array, at: number, bt: number): void {
  let tu = 1, tv = 1, su = u, sv = v;
  rows[at] = 1;
  rows[bt] = 1;
  for (let k = 1; k < ORDER; k++) {
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

/** Which entries of a p × p matrix may be nonzero: all, k ≤ l (the up-shift) or k ≥ l (the down-shift). */
const FULL = 0;
const LOWER = 1;
const UPPER = 2;

/**
 * dst[to + 4l + lane] += scale · Σ_k m[l·p + k] · src[from + 4k + lane], every row l and lane, over the matrix's band;
 * two rows at a time (ORDER is even) so that each source coefficient loaded serves eight products.
 */
function multiplyAdd(m: Float64Array, band: number, src: Float64Array, from: number, dst: Float64Array, to: number, scale: number): void {
  for (let l = 0; l < ORDER; l += 2) {
    const first = band === UPPER ? l : 0;
    const last = band === LOWER ? l + 2 : ORDER;
    let s0 = 0, s1 = 0, s2 = 0, s3 = 0, r0 = 0, r1 = 0, r2 = 0, r3 = 0;
    for (let k = first; k < last; k++) {
      const e = m[l * ORDER + k];
      const f = m[(l + 1) * ORDER + k];
      const at = from + k * LANES;
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
    const at = to + l * LANES;
    dst[at] += scale * s0;
    dst[at + 1] += scale * s1;
    dst[at + 2] += scale * s2;
    dst[at + 3] += scale * s3;
    dst[at + 4] += scale * r0;
    dst[at + 5] += scale * r1;
    dst[at + 6] += scale * r2;
    dst[at + 7] += scale * r3;
  }
}

/** A box's moments: from its points (a leaf) or shifted up from its children. */
function upward(work: Work, b: number): void {
  const t = work.tree;
  const to = b * ORDER * LANES;
  if (isLeaf(t, b)) pointsToMoments(work, b);
  if (t.left[b] >= 0) multiplyAdd(SHIFT_LEFT, LOWER, work.moments, t.left[b] * ORDER * LANES, work.moments, to, 1);
  if (t.right[b] >= 0) multiplyAdd(SHIFT_RIGHT, LOWER, work.moments, t.right[b] * ORDER * LANES, work.moments, to, 1);
}

/** μ_l = Σ_i w_i T_l(u_i) over the leaf's points, two l at a time; the T_l(u_i) are kept for localToPoints. */
function pointsToMoments(work: Work, b: number): void {
  const { xs, w, tree, rows, moments } = work;
  const c = tree.centre[b];
  const a = tree.half[b];
  const start = tree.start[b];
  const end = tree.end[b];
  for (let i = start; i < end; i += 2) {
    const j = Math.min(i + 1, end - 1);
    chebyshevRows((xs[i] - c) / a, (xs[j] - c) / a, rows, i * ORDER, j * ORDER);
  }
  for (let l = 0; l < ORDER; l += 2) {
    let s0 = 0, s1 = 0, s2 = 0, s3 = 0, r0 = 0, r1 = 0, r2 = 0, r3 = 0;
    for (let i = start; i < end; i++) {
      const e = rows[i * ORDER + l];
      const f = rows[i * ORDER + l + 1];
      const i4 = LANES * i;
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
    const at = (b * ORDER + l) * LANES;
    moments[at] = s0;
    moments[at + 1] = s1;
    moments[at + 2] = s2;
    moments[at + 3] = s3;
    moments[at + 4] = r0;
    moments[at + 5] = r1;
    moments[at + 6] = r2;
    moments[at + 7] = r3;
  }
}

/** A box's local expansion: shifted down to its children, or evaluated at its points (a leaf). */
function downward(work: Work, b: number): void {
  if (work.live[b] === 0) return;
  const t = work.tree;
  if (isLeaf(t, b)) localToPoints(work, b);
  if (t.left[b] >= 0) shiftDown(work, b, t.left[b], SHIFT_LEFT_T);
  if (t.right[b] >= 0) shiftDown(work, b, t.right[b], SHIFT_RIGHT_T);
}

function shiftDown(work: Work, parent: number, child: number, shiftT: Float64Array): void {
  multiplyAdd(shiftT, UPPER, work.local, parent * ORDER * LANES, work.local, child * ORDER * LANES, 1);
  work.live[child] = 1;
}

/** Σ_l a_l T_l(u) at the leaf's points, two points at a time. */
function localToPoints(work: Work, b: number): void {
  const { o, tree, rows, local } = work;
  const base = b * ORDER * LANES;
  const end = tree.end[b];
  for (let i = tree.start[b]; i < end; i += 2) {
    const j = Math.min(i + 1, end - 1); // an odd last point is taken twice and kept once
    let s0 = 0, s1 = 0, s2 = 0, s3 = 0, r0 = 0, r1 = 0, r2 = 0, r3 = 0;
    for (let l = 0; l < ORDER; l++) {
      const e = rows[i * ORDER + l];
      const f = rows[j * ORDER + l];
      const at = base + l * LANES;
      const c0 = local[at], c1 = local[at + 1], c2 = local[at + 2], c3 = local[at + 3];
      s0 += c0 * e;
      s1 += c1 * e;
      s2 += c2 * e;
      s3 += c3 * e;
      r0 += c0 * f;
      r1 += c1 * f;
      r2 += c2 * f;
      r3 += c3 * f;
    }
    addLanes(o, LANES * i, s0, s1, s2, s3);
    if (j > i) addLanes(o, LANES * j, r0, r1, r2, r3);
  }
}

// ——— the mutual walk ———

function walkSelf(work: Work, b: number): void {
  const t = work.tree;
  if (isLeaf(t, b)) {
    directSelf(work.xs, work.w, work.o, t.start[b], t.end[b]);
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
  if ((t.end[a] - t.start[a]) * (t.end[b] - t.start[b]) <= DIRECT_PAIRS) directPair(work.xs, work.w, work.o, t.start[a], t.end[a], t.start[b], t.end[b]);
  else if (separated(t, a, b)) interact(work, a, b);
  else if (leafA && leafB) directPair(work.xs, work.w, work.o, t.start[a], t.end[a], t.start[b], t.end[b]);
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
  const atA = a * ORDER * LANES;
  const atB = b * ORDER * LANES;
  multiplyAdd(m.forward, FULL, work.moments, atB, work.local, atA, scale);
  multiplyAdd(m.reverse, FULL, work.moments, atA, work.local, atB, -scale);
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
