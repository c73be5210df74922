// A small deterministic random generator (mulberry32, a public-domain 32-bit generator): the same seed gives the same
// numbers on every machine, for demo data, scale seeds and test fixtures that must repeat. Not for anything secret.

/** Uniform numbers in [0, 1) from a 32-bit seed. */
export function seededRandom(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (s + 0x6d2b79f5) >>> 0;
    let t = s;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}
