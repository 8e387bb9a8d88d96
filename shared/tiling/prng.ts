// Seeded randomness for every engine (the foundry's random runs, the puzzle engine's givens,
// the tests' and benchmarks' random inputs): same seed, same sequence.

/**
 * mulberry32 (T. Ettinger, 2017, public domain; common practice): a 32-bit Weyl sequence
 * mixed by multiply-xorshift; returns floats in [0, 1).
 */
export function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** An integer in [0, n) from a PRNG returning floats in [0, 1). */
export function randomInt(random: () => number, n: number): number {
  return Math.floor(random() * n);
}

/** Fisher-Yates shuffle of a copy (Knuth, TAOCP vol. 2, 3.4.2, Algorithm P), driven by the given PRNG. */
export function shuffled<T>(items: readonly T[], random: () => number): T[] {
  const a = items.slice();
  for (let i = a.length - 1; i > 0; i--) {
    const j = randomInt(random, i + 1);
    const t = a[i]!;
    a[i] = a[j]!;
    a[j] = t;
  }
  return a;
}
