import { describe, expect, it } from 'vitest';
import { all, create } from 'mathjs';
import {
  bareissSolve,
  canonicalCode,
  checkKirchhoff,
  countSpanningTrees,
  edgesOf,
  mulberry32,
  parseTiling,
  randomCNet,
  smithDiagram,
  solvePlaneNetwork,
  verifyTiling,
  type PlaneGraph,
} from '../../../shared/tiling/index';
import { denseFloatSolve, EliminationPlan, exactSolve, floatSolve, type SparseSymmetric } from '../../../shared/tiling/sparse-elimination';
import { O21_112, O9_33x32, stackedTiling } from './helpers';

// mathjs in exact fraction mode, a general-purpose library used as an independent oracle
const math = create(all!, { number: 'Fraction' });

/** The reduced Laplacian of g - pq (row and column q deleted) as a sparse symmetric matrix and as dense rows. */
function reduced(g: PlaneGraph, p: number, q: number): { A: SparseSymmetric; L: number[][]; pos: Map<number, number> } {
  const keep = [...Array(g.n).keys()].filter((v) => v !== q);
  const pos = new Map(keep.map((v, i) => [v, i]));
  const k = keep.length;
  const L = keep.map(() => keep.map(() => 0));
  const offI: number[] = [];
  const offJ: number[] = [];
  for (const [u, v] of edgesOf(g)) {
    if ((u === p && v === q) || (u === q && v === p)) continue;
    const iu = pos.get(u);
    const iv = pos.get(v);
    if (iu !== undefined) L[iu]![iu]! += 1;
    if (iv !== undefined) L[iv]![iv]! += 1;
    if (iu !== undefined && iv !== undefined) {
      L[iu]![iv]! -= 1;
      L[iv]![iu]! -= 1;
      offI.push(iu);
      offJ.push(iv);
    }
  }
  const A: SparseSymmetric = { k, diag: Float64Array.from(L.map((r, i) => r[i]!)), offI: Int32Array.from(offI), offJ: Int32Array.from(offJ), offV: new Float64Array(offI.length).fill(-1), m: offI.length };
  return { A, L, pos };
}

describe('sparse elimination of reduced Laplacians', () => {
  it('exact det and det * A^-1 e_p (modular, CRT) equal mathjs fractions on seeded random c-nets of 10 to 30 edges', () => {
    const rng = mulberry32(1919);
    for (let i = 0; i < 12; i++) {
      const g = randomCNet(10 + Math.floor(rng() * 21), rng);
      const [p, q] = edgesOf(g)[Math.floor(rng() * edgesOf(g).length)]!;
      const { A, L, pos } = reduced(g, p, q);
      const ex = exactSolve(new EliminationPlan(A), A, pos.get(p)!, 64 + 2 * g.n);
      const M = math.matrix(L.map((r) => r.map((v) => math.fraction(v))));
      const det = math.det(M) as unknown as { n: bigint; s: bigint };
      expect(ex.det).toBe(BigInt(det.s) * BigInt(det.n));
      const x = (math.lusolve(M, L.map((_, r) => [math.fraction(r === pos.get(p) ? 1 : 0)])) as unknown as { toArray(): { s: bigint; n: bigint; d: bigint }[][] }).toArray();
      x.forEach(([f], r) => expect(ex.x[r]).toBe((ex.det * BigInt(f!.s) * BigInt(f!.n)) / BigInt(f!.d)));
      // the floating-point solves (sparse plan and dense) approximate the same solution
      const fs = floatSolve(new EliminationPlan(A), A, pos.get(p)!).y;
      const ds = denseFloatSolve(A, pos.get(p)!).y;
      x.forEach(([f], r) => {
        const want = Number(f!.s) * (Number(f!.n) / Number(f!.d));
        expect(Math.abs(fs[r]! - want)).toBeLessThan(1e-9);
        expect(Math.abs(ds[r]! - want)).toBeLessThan(1e-9);
      });
    }
  });

  it('past 2^53: the CRT solve of a 120-vertex c-net equals our BigInt Bareiss, and det equals the spanning trees of G - e', () => {
    const g = randomCNet(240, mulberry32(77));
    const [p, q] = edgesOf(g)[0]!;
    const { A, L, pos } = reduced(g, p, q);
    let bits = 0;
    for (const row of L) bits += Math.log2(row[L.indexOf(row)]! + 1);
    const ex = exactSolve(new EliminationPlan(A), A, pos.get(p)!, Math.ceil(bits) + 2);
    const bz = bareissSolve(L, L.map((_, r) => (r === pos.get(p) ? 1 : 0)));
    expect(ex.det).toBe(bz.det);
    expect(ex.x).toEqual(bz.x);
    expect(ex.det > 2n ** 53n).toBe(true);
    const rest = edgesOf(g).filter(([u, v]) => !((u === p && v === q) || (u === q && v === p)));
    expect(ex.det).toBe(countSpanningTrees(g.n, rest));
  });
});

describe('solvePlaneNetwork on large networks (the ceiling is 1,000 vertices)', () => {
  it('compound tilings of 72 and 168 squares (8 stacked copies of the 33 x 32 and of the 112 square) come back from their Smith diagrams', () => {
    const t = stackedTiling(parseTiling(O9_33x32), 8);
    const big = stackedTiling(parseTiling(O21_112), 8);
    for (const tt of [t, big]) {
      expect(verifyTiling(tt)).toEqual({ ok: true });
      const d = smithDiagram(tt);
      const r = solvePlaneNetwork(d.graph, { p: d.pole.from, q: d.pole.to });
      if (!r.ok) throw new Error(r.message);
      expect(canonicalCode(r.tiling)).toBe(canonicalCode(tt));
      expect(checkKirchhoff(r.tiling).ok).toBe(true);
    }
    expect(big.squares.length).toBe(168);
  });

  it('a network of 996 vertices (199 stacked copies of the 33 x 32, 1,791 squares) solves exactly; its full width is tau(G - e)', () => {
    const tt = stackedTiling(parseTiling(O9_33x32), 199);
    const d = smithDiagram(tt);
    expect(d.graph.n).toBe(996);
    const r = solvePlaneNetwork(d.graph, { p: d.pole.from, q: d.pole.to });
    if (!r.ok) throw new Error(r.message);
    expect(canonicalCode(r.tiling)).toBe(canonicalCode(tt));
    const rest = edgesOf(d.graph).filter(([u, v]) => !((u === d.pole.from && v === d.pole.to) || (u === d.pole.to && v === d.pole.from)));
    expect(r.fullWidth).toBe(countSpanningTrees(d.graph.n, rest));
    expect(r.fullWidth / r.gcd).toBe(33n);
  });

  it('random c-nets of 400 to 1,000 vertices either solve (tiling and Kirchhoff checked) or are refused as too large, never wrong', () => {
    const rng = mulberry32(404);
    for (const edges of [620, 1200, 1500]) {
      const g = randomCNet(edges, rng);
      const [p, q] = edgesOf(g)[0]!;
      const r = solvePlaneNetwork(g, { p, q });
      if (r.ok) {
        expect(verifyTiling(r.tiling)).toEqual({ ok: true });
        expect(checkKirchhoff(r.tiling).ok).toBe(true);
      } else expect(r.code === 'too-large' || r.code === 'zero-current').toBe(true);
    }
  });
});
