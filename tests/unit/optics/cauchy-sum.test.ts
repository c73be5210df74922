// The fast multipole Cauchy sums against the direct double sum over m ≠ n (written out here, the independent method), on
// the clustered Gauss–Legendre panel points the field chain produces and on random, uniform and awkward point sets.
// Every case asserts |fast − direct| ≤ 1e-9 · Σ_{m≠n} |w_m/(x_n − x_m)| at every point and for every weight vector; one
// or two vectors (two lanes) are checked the same way, and against the same vectors padded to four lanes with zeros.
import { describe, expect, it } from "vitest";
import { cauchySums } from "@/lib/optics/cauchy-sum";
import { gaussLegendre } from "@/lib/optics/quadrature";
import { seededRandom } from "@/lib/seeded-random";

const BOUND = 1e-9;
const GL = gaussLegendre(16);

function shuffle(x: Float64Array, random: () => number): Float64Array {
  for (let i = x.length - 1; i > 0; i--) {
    const j = Math.floor(random() * (i + 1));
    [x[i], x[j]] = [x[j], x[i]];
  }
  return x;
}

/** x = (c·ρ)² for ρ at the 16 Gauss–Legendre nodes of each of `panels` equal panels on [0, X], in shuffled order. */
function panelPoints(panels: number, xMax: number, c: number, random: () => number): Float64Array {
  const x = new Float64Array(16 * panels);
  const h = xMax / panels;
  for (let p = 0; p < panels; p++) {
    for (let j = 0; j < 16; j++) x[16 * p + j] = (c * ((p + 0.5) * h + 0.5 * h * GL.x[j])) ** 2;
  }
  return shuffle(x, random);
}

function randomWeights(count: number, n: number, random: () => number): Float64Array[] {
  return Array.from({ length: count }, () => Float64Array.from({ length: n }, () => 2 * random() - 1));
}

/** The direct sums and the sums of the magnitudes of their terms. */
function directSums(x: Float64Array, weights: Float64Array[]): { sums: Float64Array[]; magnitudes: Float64Array[] } {
  const n = x.length;
  const sums = weights.map(() => new Float64Array(n));
  const magnitudes = weights.map(() => new Float64Array(n));
  for (let k = 0; k < weights.length; k++) {
    const w = weights[k];
    for (let i = 0; i < n; i++) {
      let s = 0;
      let m = 0;
      for (let j = 0; j < n; j++) {
        if (j === i) continue;
        const term = w[j] / (x[i] - x[j]);
        s += term;
        m += Math.abs(term);
      }
      sums[k][i] = s;
      magnitudes[k][i] = m;
    }
  }
  return { sums, magnitudes };
}

/** The largest |fast − direct| / Σ|w_m/(x_n − x_m)| over every output (0 where both are exactly 0). */
function worstRatio(x: Float64Array, weights: Float64Array[]): number {
  const out = weights.map(() => new Float64Array(x.length).fill(Number.NaN));
  cauchySums(x, weights, out);
  const { sums, magnitudes } = directSums(x, weights);
  let worst = 0;
  for (let k = 0; k < weights.length; k++) {
    for (let i = 0; i < x.length; i++) {
      const error = Math.abs(out[k][i] - sums[k][i]);
      const ratio = error === 0 ? 0 : error / magnitudes[k][i];
      worst = Number.isNaN(ratio) || ratio > worst ? ratio : worst;
    }
  }
  return worst;
}

describe("cauchySums on Gauss–Legendre panel points x = (cρ)² (the field chain's nodes)", () => {
  for (const panels of [2, 30, 100, 400]) {
    it(`${16 * panels} points, four weight vectors: within 1e-9 of the magnitude sum`, () => {
      const random = seededRandom(panels);
      const x = panelPoints(panels, 1.5e-3, 2.1e3, random);
      expect(worstRatio(x, randomWeights(4, x.length, random))).toBeLessThan(BOUND);
    });
  }

  it("weights on a few points only, so the far pairs (the expansions) carry the sums", () => {
    const random = seededRandom(7);
    const x = panelPoints(100, 1, 1, random);
    const sparse = (every: number): Float64Array => Float64Array.from({ length: x.length }, (_, i) => (i % every === 3 ? 2 * random() - 1 : 0));
    const single = new Float64Array(x.length);
    single[11] = 1;
    expect(worstRatio(x, [sparse(37), sparse(211), sparse(997), single])).toBeLessThan(BOUND);
  });

  it("a zero weight vector among others gives exact zeros", () => {
    const random = seededRandom(8);
    const x = panelPoints(30, 1, 1, random);
    const weights = randomWeights(4, x.length, random);
    weights[2] = new Float64Array(x.length);
    const out = weights.map(() => new Float64Array(x.length).fill(1));
    cauchySums(x, weights, out);
    expect(out[2].every((v) => v === 0)).toBe(true);
    expect(worstRatio(x, weights)).toBeLessThan(BOUND);
  });
});

describe("cauchySums on other point sets", () => {
  it("random points in [−3, 7]", () => {
    const random = seededRandom(11);
    const x = Float64Array.from({ length: 3000 }, () => 10 * random() - 3);
    expect(worstRatio(x, randomWeights(4, x.length, random))).toBeLessThan(BOUND);
  });

  it("equally spaced points", () => {
    const random = seededRandom(12);
    const x = shuffle(Float64Array.from({ length: 2048 }, (_, i) => 5 + 0.01 * i), random);
    expect(worstRatio(x, randomWeights(4, x.length, random))).toBeLessThan(BOUND);
  });

  it("two far clusters (near −3 and near 10⁶, each 10⁻³ wide)", () => {
    const random = seededRandom(13);
    const x = Float64Array.from({ length: 2000 }, (_, i) => (i % 2 === 0 ? -3 : 1e6) + 1e-3 * random());
    expect(worstRatio(x, randomWeights(4, x.length, random))).toBeLessThan(BOUND);
  });

  it("repeated tiny gaps: pairs x and x·(1 + 10⁻⁹)", () => {
    const random = seededRandom(14);
    const x = shuffle(Float64Array.from({ length: 2000 }, (_, i) => (1 + Math.floor(i / 2)) * (i % 2 === 0 ? 1 : 1 + 1e-9)), random);
    expect(worstRatio(x, randomWeights(4, x.length, random))).toBeLessThan(BOUND);
  });

  it("one, two and five weight vectors (the vectors go in fours)", () => {
    const random = seededRandom(15);
    const x = panelPoints(40, 1, 1, random);
    for (const count of [1, 2, 5]) expect(worstRatio(x, randomWeights(count, x.length, random))).toBeLessThan(BOUND);
  });

  it("N = 1 gives zero, N = 2 the single terms", () => {
    const one = [new Float64Array([7])];
    cauchySums(new Float64Array([3]), [new Float64Array([2])], one);
    expect(one[0][0]).toBe(0);
    const two = [new Float64Array(2)];
    cauchySums(new Float64Array([0.5, 2]), [new Float64Array([3, -4])], two);
    expect(Math.abs(two[0][0] - -4 / (0.5 - 2))).toBeLessThanOrEqual(BOUND * Math.abs(-4 / (0.5 - 2)));
    expect(Math.abs(two[0][1] - 3 / (2 - 0.5))).toBeLessThanOrEqual(BOUND * Math.abs(3 / (2 - 0.5)));
  });
});

describe("cauchySums with one or two weight vectors (the two-lane inner loops)", () => {
  const pointSets: { name: string; points: (n: number, random: () => number) => Float64Array }[] = [
    { name: "Gauss–Legendre panel points", points: (n, random) => panelPoints(n / 16, 1.5e-3, 2.1e3, random) },
    { name: "random points in [−3, 7]", points: (n, random) => Float64Array.from({ length: n }, () => 10 * random() - 3) },
  ];
  for (const [s, { name, points }] of pointSets.entries()) {
    for (const n of [480, 1600]) {
      it(`${name}, N = ${n}: two vectors, and one, within 1e-9 of the magnitude sum`, () => {
        const random = seededRandom(31 + 10 * s + n);
        const x = points(n, random);
        const [a, b] = randomWeights(2, n, random);
        expect(worstRatio(x, [a, b])).toBeLessThan(BOUND);
        expect(worstRatio(x, [b])).toBeLessThan(BOUND);
      });
    }
  }

  it("two vectors with weights on a few points only (the expansions carry the sums)", () => {
    const random = seededRandom(41);
    const x = panelPoints(100, 1, 1, random);
    const sparse = (every: number): Float64Array => Float64Array.from({ length: x.length }, (_, i) => (i % every === 5 ? 2 * random() - 1 : 0));
    expect(worstRatio(x, [sparse(53), sparse(401)])).toBeLessThan(BOUND);
  });

  it("two vectors, and one, give what they give with zero vectors beside them (four lanes), to 1e-12 of the magnitude sum", () => {
    for (const n of [150, 480, 1600]) {
      const random = seededRandom(50 + n);
      const x = panelPoints(n / 16, 1.5e-3, 2.1e3, random);
      const [a, b] = randomWeights(2, n, random);
      const zero = new Float64Array(n);
      const sums = (weights: Float64Array[]): Float64Array[] => {
        const out = weights.map(() => new Float64Array(n));
        cauchySums(x, weights, out);
        return out;
      };
      const two = sums([a, b]);
      const one = sums([a]);
      const padded = sums([a, b, zero, zero]);
      const { magnitudes } = directSums(x, [a, b]);
      let worst = 0;
      for (let i = 0; i < n; i++) {
        worst = Math.max(worst, Math.abs(two[0][i] - padded[0][i]) / magnitudes[0][i], Math.abs(two[1][i] - padded[1][i]) / magnitudes[1][i]);
        worst = Math.max(worst, Math.abs(one[0][i] - padded[0][i]) / magnitudes[0][i]);
      }
      expect(worst).toBeLessThanOrEqual(1e-12);
    }
  });
});

describe("cauchySums contract", () => {
  it("is deterministic bit for bit, and out may be the weight vectors themselves", () => {
    const random = seededRandom(21);
    const x = panelPoints(60, 1, 1, random);
    const weights = randomWeights(4, x.length, random);
    const first = weights.map(() => new Float64Array(x.length));
    const second = weights.map(() => new Float64Array(x.length));
    cauchySums(x, weights, first);
    cauchySums(x, weights, second);
    const inPlace = weights.map((w) => w.slice());
    cauchySums(x, inPlace, inPlace);
    for (let k = 0; k < 4; k++) {
      expect(second[k]).toEqual(first[k]);
      expect(inPlace[k]).toEqual(first[k]);
    }
  });

  it("rejects non-finite points and mismatched vectors", () => {
    const w = [new Float64Array(3)];
    expect(() => cauchySums(new Float64Array([1, Number.NaN, 2]), w, [new Float64Array(3)])).toThrow(RangeError);
    expect(() => cauchySums(new Float64Array([1, 2, 3]), w, [new Float64Array(2)])).toThrow(RangeError);
    expect(() => cauchySums(new Float64Array([1, 2, 3]), w, [])).toThrow(RangeError);
  });
});
