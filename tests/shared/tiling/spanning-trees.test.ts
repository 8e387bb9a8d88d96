import { describe, expect, it } from 'vitest';
import { countSpanningTrees, parseTiling, tilingSpanningTrees } from '../../../shared/tiling/index';
import { O21_112, O9_33x32, O9_69x61 } from './helpers';

const complete = (n: number) => {
  const e: [number, number][] = [];
  for (let i = 0; i < n; i++) for (let j = i + 1; j < n; j++) e.push([i, j]);
  return e;
};

describe('spanning trees by the matrix-tree theorem (Kirchhoff 1847)', () => {
  it("Cayley's formula: tau(K_n) = n^(n-2) (OEIS A000272)", () => {
    for (let n = 2; n <= 12; n++) expect(countSpanningTrees(n, complete(n))).toBe(BigInt(n) ** BigInt(n - 2));
  });

  it('a cycle C_n has n spanning trees; parallel edges count separately', () => {
    const cycle = (n: number) => Array.from({ length: n }, (_, i) => [i, (i + 1) % n] as [number, number]);
    expect(countSpanningTrees(7, cycle(7))).toBe(7n);
    expect(countSpanningTrees(2, [[0, 1], [0, 1], [0, 1]])).toBe(3n);
    expect(countSpanningTrees(1, [])).toBe(1n);
    expect(countSpanningTrees(3, [[0, 1]])).toBe(0n);
  });

  it('K_30 has 30^28 spanning trees, exactly (BigInt beyond 2^53)', () => {
    expect(countSpanningTrees(30, complete(30))).toBe(30n ** 28n);
  });

  it('the c-net of the 33 x 32 and of the 69 x 61 has tau = 130; of the 112 square 75264 (reference facts)', () => {
    expect(tilingSpanningTrees(parseTiling(O9_33x32))).toBe(130n);
    // 69 x 61: W_full + H_full = 69 + 61 = 130 with gcd 1
    expect(tilingSpanningTrees(parseTiling(O9_69x61))).toBe(130n);
    expect(tilingSpanningTrees(parseTiling(O21_112))).toBe(2n * 37632n);
  });
});
