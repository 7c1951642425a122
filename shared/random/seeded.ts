// Repeatable pseudo-random numbers for the demo data, the tests and the benchmark: the same seed
// gives the same sequence on every machine.

/** Uniform numbers in [0, 1) from mulberry32 (T. Ettinger's public-domain 32-bit generator). */
export function seededRandom(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Standard normal numbers by the Box–Muller transform over `seededRandom(seed)`. */
export function seededNormals(seed: number): () => number {
  const uniform = seededRandom(seed);
  return () => Math.sqrt(-2 * Math.log(1 - uniform())) * Math.cos(2 * Math.PI * uniform());
}
