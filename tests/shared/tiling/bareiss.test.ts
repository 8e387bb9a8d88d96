import { describe, expect, it } from 'vitest';
import { all, create } from 'mathjs';
import { bareissDeterminant, bareissRank, bareissSolve, mulberry32 } from '../../../shared/tiling/index';
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

const fractionDet = (rows: number[][]) => Number(math.det(math.matrix(rows.map((r) => r.map((v) => math.fraction(v))))).valueOf());

function rankByMinors(rows: number[][]): number {
  // brute force: the largest r with a non-zero r x r minor (mathjs det), for small matrices
  const m = rows.length;
  const n = rows[0]!.length;
  const subsets = (k: number, size: number): number[][] => {
    if (size === 0) return [[]];
    const out: number[][] = [];
    for (let i = 0; i < k; i++) for (const rest of subsets(i, size - 1)) out.push([...rest, i]);
    return out;
  };
  for (let r = Math.min(m, n); r > 0; r--) {
    for (const rs of subsets(m, r)) for (const cs of subsets(n, r)) {
      if (fractionDet(rs.map((i) => cs.map((j) => rows[i]![j]!))) !== 0) return r;
    }
  }
  return 0;
}

describe('exact rank (Bareiss elimination, a column without a pivot skipped)', () => {
  it('equals the brute-force rank by minors (mathjs fractions) on seeded small integer matrices', () => {
    const rnd = mulberry32(7);
    for (let t = 0; t < 60; t++) {
      const m = 2 + Math.floor(rnd() * 3);
      const n = 2 + Math.floor(rnd() * 3);
      const base = Array.from({ length: m }, () => Array.from({ length: n }, () => Math.floor(rnd() * 5) - 2));
      // make some rows dependent on purpose
      if (m > 2 && rnd() < 0.5) base[m - 1] = base[0]!.map((v, j) => 2 * v - base[1]![j]!);
      expect(bareissRank(base)).toBe(rankByMinors(base));
    }
  });

  it('leaves its input as it was, and a zero or empty matrix has rank 0', () => {
    const a = [[0, 2, 1], [0, 1, 1], [3, 0, 0]];
    expect(bareissRank(a)).toBe(3);
    expect(a).toEqual([[0, 2, 1], [0, 1, 1], [3, 0, 0]]);
    expect(bareissRank([[0, 0], [0, 0]])).toBe(0);
    expect(bareissRank([])).toBe(0);
  });
});
