import { describe, expect, it } from 'vitest';
import { all, create } from 'mathjs';
import { bareissDeterminant, bareissSolve, mulberry32 } from '../../../shared/tiling/index';
import { bareissSolveNumber } from '../../../shared/tiling/bareiss';

// mathjs (exact BigNumber / Fraction arithmetic) as an independent oracle
const math = create(all!, { number: 'Fraction' });

function randomMatrix(k: number, span: number, rng: () => number) {
  return Array.from({ length: k }, () => Array.from({ length: k }, () => Math.floor(rng() * (2 * span + 1)) - span));
}

describe('Bareiss fraction-free elimination (Bareiss, Math. Comp. 22 (1968))', () => {
  it('determinants of seeded random integer matrices agree with mathjs', () => {
    const rng = mulberry32(17);
    for (let t = 0; t < 40; t++) {
      const k = 1 + Math.floor(rng() * 12);
      const a = randomMatrix(k, t < 20 ? 3 : 1000, rng);
      const want = math.det(math.matrix(a.map((r) => r.map((v) => math.fraction(v))))) as unknown as { s: bigint; n: bigint };
      expect(bareissDeterminant(a)).toBe(BigInt(want.s) * BigInt(want.n));
    }
  });

  it('handles zero pivots by swapping rows, and singular matrices', () => {
    expect(bareissDeterminant([[0, 1], [1, 0]])).toBe(-1n);
    expect(bareissDeterminant([[0, 2, 1], [0, 1, 1], [3, 0, 0]])).toBe(3n);
    expect(bareissDeterminant([[1, 2], [2, 4]])).toBe(0n);
    expect(bareissDeterminant([])).toBe(1n);
    expect(bareissSolve([[1, 2], [2, 4]], [1, 0])).toEqual({ det: 0n, x: [0n, 0n] });
  });

  it('solve gives det * A^-1 b, agreeing with mathjs lusolve', () => {
    const rng = mulberry32(23);
    for (let t = 0; t < 30; t++) {
      const k = 1 + Math.floor(rng() * 10);
      const a = randomMatrix(k, 50, rng);
      const b = Array.from({ length: k }, () => Math.floor(rng() * 21) - 10);
      const r = bareissSolve(a, b);
      const A = math.matrix(a.map((row) => row.map((v) => math.fraction(v))));
      const det = math.det(A) as unknown as { s: bigint; n: bigint };
      const D = BigInt(det.s) * BigInt(det.n);
      expect(r.det).toBe(D);
      if (D === 0n) continue;
      const x = (math.lusolve(A, b.map((v) => [math.fraction(v)])) as unknown as { toArray(): { s: bigint; n: bigint; d: bigint }[][] }).toArray();
      x.forEach(([f], i) => expect(r.x[i]).toBe((D * BigInt(f!.s) * BigInt(f!.n)) / BigInt(f!.d)));
      const fast = bareissSolveNumber(a, b);
      if (fast) {
        expect(BigInt(fast.det)).toBe(D);
        expect(fast.x.map((v) => BigInt(v))).toEqual(r.x);
      }
    }
  });

  it('the Number path declines when products could pass 2^53', () => {
    expect(bareissSolveNumber([[2 ** 27, 1], [1, 2 ** 27]], [1, 1])).toBeNull();
    expect(bareissSolveNumber([[0, 1], [1, 0]], [1, 1])).toBeNull();
  });
});
