import { describe, expect, it } from 'vitest';
import { mulberry32, randomInt, shuffled } from '../../../shared/tiling/index';

/**
 * mulberry32 as its author wrote it in C (T. Ettinger, 2017): uint32 state += 0x6D2B79F5;
 * z = (z ^ z >> 15) * (z | 1); z ^= z + (z ^ z >> 7) * (z | 61); return z ^ z >> 14.
 * Recomputed here in BigInt with explicit arithmetic mod 2^32: an independent implementation.
 */
function referenceMulberry32(seed: number): () => number {
  const M = (1n << 32n) - 1n;
  let state = BigInt(seed >>> 0);
  return () => {
    state = (state + 0x6d2b79f5n) & M;
    let z = state;
    z = ((z ^ (z >> 15n)) * (z | 1n)) & M;
    z = (z ^ (z + (((z ^ (z >> 7n)) * (z | 61n)) & M))) & M;
    return Number(z ^ (z >> 14n)) / 2 ** 32;
  };
}

describe('seeded randomness', () => {
  it('mulberry32 equals the author’s algorithm recomputed in BigInt, for several seeds', () => {
    for (const seed of [0, 1, 7, 2026, 0xdeadbeef, -5]) {
      const ours = mulberry32(seed);
      const ref = referenceMulberry32(seed);
      for (let i = 0; i < 200; i++) expect(ours()).toBe(ref());
    }
  });

  it('mulberry32 is uniform enough: chi-square over 10 bins of 100,000 draws below the 0.1 % point (27.88, 9 degrees of freedom; standard tables)', () => {
    const r = mulberry32(42);
    const bins = Array.from<number>({ length: 10 }).fill(0);
    const N = 100_000;
    for (let i = 0; i < N; i++) {
      const x = r();
      expect(x >= 0 && x < 1).toBe(true);
      bins[Math.floor(x * 10)]!++;
    }
    const chi = bins.reduce((s, b) => s + (b - N / 10) ** 2 / (N / 10), 0);
    expect(chi).toBeLessThan(27.88);
  });

  it('randomInt stays in [0, n) and reaches every value', () => {
    const r = mulberry32(3);
    const seen = new Set<number>();
    for (let i = 0; i < 1000; i++) {
      const k = randomInt(r, 7);
      expect(Number.isInteger(k) && k >= 0 && k < 7).toBe(true);
      seen.add(k);
    }
    expect(seen.size).toBe(7);
  });

  it('shuffled returns a permutation of a copy, the same for the same seed, and each of the 6 orders of 3 items about equally often', () => {
    const items = [1, 2, 3, 4, 5, 6, 7, 8];
    const a = shuffled(items, mulberry32(9));
    expect(items).toEqual([1, 2, 3, 4, 5, 6, 7, 8]);
    expect([...a].sort((x, y) => x - y)).toEqual(items);
    expect(shuffled(items, mulberry32(9))).toEqual(a);
    // Fisher-Yates gives each permutation probability 1/n! (Knuth, TAOCP vol. 2, 3.4.2)
    const r = mulberry32(11);
    const counts = new Map<string, number>();
    for (let i = 0; i < 60_000; i++) {
      const k = shuffled(['a', 'b', 'c'], r).join('');
      counts.set(k, (counts.get(k) ?? 0) + 1);
    }
    expect(counts.size).toBe(6);
    // chi-square, 5 degrees of freedom, 0.1 % point 20.52 (standard tables)
    const chi = [...counts.values()].reduce((s, c) => s + (c - 10_000) ** 2 / 10_000, 0);
    expect(chi).toBeLessThan(20.52);
  });
});
