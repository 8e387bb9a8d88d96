import { describe, expect, it } from 'vitest';
import { bareissDeterminant, countSpanningTrees, edgesOf, mulberry32, parseTiling, randomCNet, solvePlaneNetwork, sparseSymmetricDeterminant, tilingSpanningTrees, type Tiling } from '../../../shared/tiling/index';
import { maximalSegments } from '../../../shared/tiling/segments';
import { greedyTiling, O21_112, O9_33x32, O9_69x61, stackedTiling } from './helpers';

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

describe('large c-nets: sparse elimination modulo primes + Chinese remainder theorem', () => {
  it("agrees with Cayley's formula past the dense limit: tau(K_70) = 70^68, tau(K_90) = 90^88 (OEIS A000272)", () => {
    expect(countSpanningTrees(70, complete(70))).toBe(70n ** 68n);
    expect(countSpanningTrees(90, complete(90))).toBe(90n ** 88n);
  });

  it('the small-graph path (determinant modulo two primes, CRT) agrees with dense BigInt Bareiss on seeded random c-nets of 6 to 60 edges', () => {
    const rng = mulberry32(2019);
    for (let i = 0; i < 80; i++) {
      const g = randomCNet(i % 2 === 0 ? 6 + (i % 30) : 8 + Math.floor(rng() * 53), rng);
      const es = edgesOf(g);
      const L = Array.from({ length: g.n - 1 }, () => Array.from({ length: g.n - 1 }, () => 0));
      for (const [u, v] of es) {
        if (u < g.n - 1) L[u]![u]! += 1;
        if (v < g.n - 1) L[v]![v]! += 1;
        if (u < g.n - 1 && v < g.n - 1) {
          L[u]![v]! -= 1;
          L[v]![u]! -= 1;
        }
      }
      expect(countSpanningTrees(g.n, es)).toBe(bareissDeterminant(L));
    }
  });

  it('agrees with dense Bareiss on seeded random c-nets of 60 to 260 edges', () => {
    const rng = mulberry32(31);
    for (let i = 0; i < 8; i++) {
      const g = randomCNet(60 + Math.floor(rng() * 200), rng);
      const edges = edgesOf(g);
      const diag = Array.from({ length: g.n - 1 }, () => 0);
      const L = Array.from({ length: g.n - 1 }, () => Array.from({ length: g.n - 1 }, () => 0));
      const off: [number, number, number][] = [];
      for (const [u, v] of edges) {
        for (const w of [u, v]) if (w < g.n - 1) diag[w]! += 1;
        if (u < g.n - 1 && v < g.n - 1) off.push([u, v, -1]);
      }
      diag.forEach((d, r) => (L[r]![r] = d));
      for (const [a, b] of off) L[a]![b] = L[b]![a] = -1;
      expect(sparseSymmetricDeterminant(diag, off)).toBe(bareissDeterminant(L));
      expect(countSpanningTrees(g.n, edges)).toBe(bareissDeterminant(L));
    }
  });

  it('signs and small cases: det [[2,-3],[-3,1]] = -7, the empty matrix has det 1', () => {
    expect(sparseSymmetricDeterminant([2, 1], [[0, 1, -3]])).toBe(-7n);
    expect(sparseSymmetricDeterminant([], [])).toBe(1n);
  });

  it('counts the c-net of a 1,800-square compound tiling (200 copies of the 33 x 32) without dense elimination', () => {
    const base = parseTiling(O9_33x32);
    const squares = [];
    for (let r = 0; r < 10; r++) for (let c = 0; c < 20; c++) for (const q of base.squares) squares.push({ x: q.x + 33 * c, y: q.y + 32 * r, s: q.s });
    const tau = tilingSpanningTrees({ W: 660, H: 320, squares });
    expect(tau > 10n ** 300n).toBe(true);
  });
});

describe("the tiling's tree count from the decode (fast path) against the straightforward one", () => {
  /** Straightforward: maximal segments by the sweep over the sides, the dense Laplacian, BigInt Bareiss. */
  function straightforward(t: Tiling): bigint {
    const seg = maximalSegments(t, false);
    const k = seg.at.length;
    const top = seg.at.findIndex((a) => a === 0);
    const bottom = seg.at.findIndex((a) => a === t.H);
    const L = Array.from({ length: k - 1 }, () => Array.from({ length: k - 1 }, () => 0));
    const edges: [number, number][] = t.squares.map((_, i) => [seg.before[i]!, seg.after[i]!]);
    edges.push([top, bottom]);
    for (const [u, v] of edges) {
      if (u < k - 1) L[u]![u]! += 1;
      if (v < k - 1) L[v]![v]! += 1;
      if (u < k - 1 && v < k - 1) {
        L[u]![v]! -= 1;
        L[v]![u]! -= 1;
      }
    }
    return bareissDeterminant(L);
  }

  it('agrees on seeded random tilings: simple ones from random c-nets, compound ones with crosses (greedy fills, stacks)', () => {
    const rng = mulberry32(4242);
    const tilings: Tiling[] = [];
    for (let i = 0; tilings.length < 60 && i < 400; i++) {
      const g = randomCNet(8 + Math.floor(rng() * 30), rng);
      const es = edgesOf(g);
      const [p, q] = es[Math.floor(rng() * es.length)]!;
      const r = solvePlaneNetwork(g, { p, q });
      if (r.ok) tilings.push(r.tiling);
    }
    for (let i = 0; i < 40; i++) {
      const W = 5 + Math.floor(rng() * 40);
      const H = 5 + Math.floor(rng() * 40);
      tilings.push(greedyTiling(W, H, Array.from({ length: 7 }, () => 1 + Math.floor(rng() * 12))));
    }
    tilings.push(stackedTiling(tilings[0]!, 3), stackedTiling(parseTiling(O9_33x32), 4));
    let crosses = 0;
    for (const t of tilings) {
      const fast = tilingSpanningTrees(t);
      expect(fast).toBe(straightforward(t));
      // a cross: four squares meeting at one point (the segment through it is one vertex)
      const corners = new Map<string, number>();
      for (const s of t.squares) for (const c of [`${s.x},${s.y}`, `${s.x + s.s},${s.y}`, `${s.x},${s.y + s.s}`, `${s.x + s.s},${s.y + s.s}`]) corners.set(c, (corners.get(c) ?? 0) + 1);
      if ([...corners.values()].some((v) => v === 4)) crosses++;
    }
    expect(crosses).toBeGreaterThan(5);
  });
});
