import { quantileSeq } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { mulberry32 } from '../../../shared/puzzle/index';
import { monotoneGradeFit, quartiles, spearman } from '../../../server/areas/reader/solve-math';

describe('solve-time quartiles', () => {
  it('agree with mathjs quantileSeq (linear interpolation, R type 7) on seeded samples', () => {
    const rand = mulberry32(11);
    for (let n = 1; n <= 40; n++) {
      const xs = Array.from({ length: n }, () => Math.round(30_000 + rand() * 900_000));
      const q = quartiles(xs)!;
      expect(q.q1).toBeCloseTo(Number(quantileSeq(xs, 0.25)), 6);
      expect(q.median).toBeCloseTo(Number(quantileSeq(xs, 0.5)), 6);
      expect(q.q3).toBeCloseTo(Number(quantileSeq(xs, 0.75)), 6);
    }
  });

  it('are null for no solves', () => {
    expect(quartiles([])).toBeNull();
  });
});

describe("Spearman's rank correlation", () => {
  it('gives -29/165 on the textbook example (IQ against hours of television, Wikipedia "Spearman\'s rank correlation coefficient")', () => {
    const iq = [106, 100, 86, 101, 99, 103, 97, 113, 112, 110];
    const tv = [7, 27, 2, 50, 28, 29, 20, 12, 6, 17];
    expect(spearman(iq, tv)).toBeCloseTo(-29 / 165, 12);
  });

  it('is 1 for any increasing relation, -1 for a decreasing one, and undefined below three points', () => {
    expect(spearman([1, 2, 3, 4], [10, 100, 1000, 10_000])).toBeCloseTo(1, 12);
    expect(spearman([1, 2, 3, 4], [4, 3, 2, 1])).toBeCloseTo(-1, 12);
    expect(spearman([1, 2], [1, 2])).toBeNull();
  });
});

describe('the monotone grade fit', () => {
  /** Every non-decreasing assignment of grades 1..5 to the distinct keys: the least total |grade - target| (exhaustive). */
  function bruteBest(items: { key: number; target: number }[]): number {
    const keys = [...new Set(items.map((i) => i.key))].sort((a, b) => a - b);
    let best = Infinity;
    const walk = (k: number, min: number, grades: number[]) => {
      if (k === keys.length) {
        const cost = items.reduce((s, it) => s + Math.abs(grades[keys.indexOf(it.key)]! - it.target), 0);
        best = Math.min(best, cost);
        return;
      }
      for (let g = min; g <= 5; g++) walk(k + 1, g, [...grades, g]);
    };
    walk(0, 1, []);
    return best;
  }

  it('finds the least total distance, as exhaustive search does, on seeded sets', () => {
    const rand = mulberry32(3);
    for (let trial = 0; trial < 150; trial++) {
      const n = 1 + Math.floor(rand() * 7);
      const items = Array.from({ length: n }, () => ({ key: Math.floor(rand() * 6), target: 1 + Math.floor(rand() * 5) }));
      const fit = monotoneGradeFit(items);
      const cost = items.reduce((s, it, i) => s + Math.abs(fit.grades[i]! - it.target), 0);
      expect(cost, JSON.stringify(items)).toBe(bruteBest(items));
      // monotone in the key, one grade per key
      for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) if (items[i]!.key <= items[j]!.key) expect(fit.grades[i]!).toBeLessThanOrEqual(fit.grades[j]!);
    }
  });

  it('puts each boundary between the last key below and the first key above it', () => {
    const fit = monotoneGradeFit([
      { key: 1, target: 1 },
      { key: 2, target: 1 },
      { key: 5, target: 2 },
      { key: 6, target: 3 },
      { key: 9, target: 3 },
    ]);
    expect(fit.grades).toEqual([1, 1, 2, 3, 3]);
    expect(fit.cuts).toEqual([{ below: 2, from: 5 }, { below: 5, from: 6 }, null, null]);
  });
});
