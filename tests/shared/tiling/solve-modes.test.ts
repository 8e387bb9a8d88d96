import { describe, expect, it } from 'vitest';
import { all, create } from 'mathjs';
import { analysePlaneGraph } from '../../../shared/tiling/plane-graph';
import { solveWith, type SolveMode } from '../../../shared/tiling/solve-network';
import { edgesOf, mulberry32, parseTiling, randomCNet, smithDiagram, solvePlaneNetwork, verifyTiling, type PlaneGraph, type SolveResult } from '../../../shared/tiling/index';
import { stackedTiling } from './helpers';

// The small-network fast path of solvePlaneNetwork (dense floating-point guess, reused working
// memory) against the general ones: the sparse elimination plan's guess and the exact solve
// modulo primes with no guess at all, and mathjs fractions as an independent oracle, on
// seeded random c-nets and random pole edges (some of which carry zero current).

const math = create(all!, { number: 'Fraction' });

/** Everything a result says, read out (the exact facts are computed when first read). */
function facts(r: SolveResult) {
  if (!r.ok) return { ok: false, code: r.code, message: r.message };
  return { ok: true, tiling: r.tiling, fullWidth: r.fullWidth, fullHeight: r.fullHeight, gcd: r.gcd, spanningTrees: r.spanningTrees, potentials: r.potentials };
}

function* nets(seed: number, count: number, minEdges: number, span: number) {
  const rng = mulberry32(seed);
  for (let i = 0; i < count; i++) {
    const e = minEdges + Math.floor(rng() * span);
    const g = randomCNet(e === 7 ? 8 : e, rng); // no c-net has 7 edges
    const es = edgesOf(g);
    const [p, q] = es[Math.floor(rng() * es.length)]!;
    yield { g, p, q };
  }
}

/** det(L) and det(L) L^-1 e_p for the reduced Laplacian of G - pq without q, by mathjs fractions. */
function mathjsSolve(g: PlaneGraph, p: number, q: number): { det: bigint; x: bigint[] } {
  const keep = [...Array(g.n).keys()].filter((v) => v !== q);
  const pos = new Map(keep.map((v, i) => [v, i]));
  const L = keep.map(() => keep.map(() => 0));
  for (const [u, v] of edgesOf(g)) {
    if ((u === p && v === q) || (u === q && v === p)) continue;
    for (const [a, b] of [[u, v], [v, u]] as const) {
      const ia = pos.get(a);
      if (ia === undefined) continue;
      L[ia]![ia]! += 1;
      const ib = pos.get(b);
      if (ib !== undefined) L[ia]![ib]! -= 1;
    }
  }
  const A = math.matrix(L.map((row) => row.map((v) => math.fraction(v))));
  const det = math.det(A) as unknown as { s: bigint; n: bigint };
  const D = BigInt(det.s) * BigInt(det.n);
  const b = keep.map((v) => [math.fraction(v === p ? 1 : 0)]);
  const y = (math.lusolve(A, b) as unknown as { toArray(): { s: bigint; n: bigint; d: bigint }[][] }).toArray();
  return { det: D, x: Array.from({ length: g.n }, (_, v) => (v === q ? 0n : (D * BigInt(y[pos.get(v)!]![0]!.s) * BigInt(y[pos.get(v)!]![0]!.n)) / BigInt(y[pos.get(v)!]![0]!.d))) };
}

const MODES: SolveMode[] = ['dense', 'sparse', 'exact'];

describe('solvePlaneNetwork: the fast path agrees with the general paths', () => {
  it('auto = dense = sparse = exact on 300 random c-nets of 6 to 60 edges with random pole edges', () => {
    let solved = 0;
    let failed = 0;
    for (const { g, p, q } of nets(4242, 300, 6, 55)) {
      const want = facts(solveWith(g, { p, q }, 'exact'));
      expect(facts(solvePlaneNetwork(g, { p, q }))).toEqual(want);
      for (const mode of MODES) expect(facts(solveWith(g, { p, q }, mode))).toEqual(want);
      if (want.ok) solved++;
      else failed++;
    }
    expect(solved).toBeGreaterThan(200);
    expect(failed).toBeGreaterThan(5);
  });

  it('the fast path against mathjs fractions: full width = det(L), potentials = det(L) L^-1 e_p (80 c-nets of 6 to 41 edges)', () => {
    let solved = 0;
    for (const { g, p, q } of nets(777, 80, 6, 36)) {
      const r = solvePlaneNetwork(g, { p, q });
      if (!r.ok) {
        expect(r.code).toBe('zero-current');
        continue;
      }
      solved++;
      const ref = mathjsSolve(g, p, q);
      expect(r.fullWidth).toBe(ref.det);
      expect(r.potentials).toEqual(ref.x);
      expect(verifyTiling(r.tiling)).toEqual({ ok: true });
    }
    expect(solved).toBeGreaterThan(50);
  });

  it('larger networks (dense forced past its usual size, sparse at its usual size) agree too', () => {
    for (const { g, p, q } of nets(99, 12, 80, 120)) {
      const want = facts(solveWith(g, { p, q }, 'exact'));
      for (const mode of ['auto', 'dense', 'sparse'] as const) expect(facts(solveWith(g, { p, q }, mode))).toEqual(want);
    }
    const big = smithDiagram(stackedTiling(parseTiling('9 33 32 (18,15)(7,8)(14,4)(10,1)(9)'), 6));
    const pole = { p: big.pole.from, q: big.pole.to };
    const want = facts(solveWith(big.graph, pole, 'exact'));
    expect(want.ok).toBe(true);
    for (const mode of ['auto', 'dense', 'sparse'] as const) expect(facts(solveWith(big.graph, pole, mode))).toEqual(want);
  });
});

describe('solvePlaneNetwork: the reused working memory leaks nothing from call to call', () => {
  it('results read after later solves (of larger, smaller and malformed graphs) are those of a fresh solve', () => {
    const list = [...nets(31, 40, 6, 90)];
    const results = list.map(({ g, p, q }, i) => {
      const r = solvePlaneNetwork(g, { p, q });
      // interleave malformed input that fails at different stages of the validation
      if (i % 3 === 0) solvePlaneNetwork({ n: 4, adj: [[1, 2], [0], [0, 3], [2]] }, { p: 0, q: 1 });
      if (i % 5 === 0) solvePlaneNetwork({ n: 3, adj: [[1, 2], [0], [1]] }, { p: 0, q: 1 });
      return r;
    });
    list.forEach(({ g, p, q }, i) => expect(facts(results[i]!)).toEqual(facts(solveWith(g, { p, q }, 'exact'))));
  });

  it('graph validation with reused arrays gives the same verdicts and messages as a fresh analysis', () => {
    const bad: PlaneGraph[] = [
      { n: 3, adj: [[1, 2], [0], [1]] },
      { n: 2, adj: [[1, 1], [0, 0]] },
      { n: 4, adj: [[1], [0], [3], [2]] },
      { n: 2, adj: [[1], 'x' as never] },
      { n: 4, adj: [[1, 2, 3], [0, 2, 3], [0, 1, 3], [0, 1, 2]] }, // K4 with an inconsistent rotation
      { n: 3, adj: [[1, 5], [0], [0]] },
      { n: 3, adj: [[1, 0], [0], [0]] },
    ];
    for (const g of [...bad, randomCNet(30, mulberry32(5)), ...bad]) {
      const a = analysePlaneGraph(g);
      const r = solvePlaneNetwork(g, { p: 0, q: g.adj[0]![0] as number });
      if (!a.ok) expect(r).toEqual(a);
      else expect(r.ok || r.code !== 'not-plane').toBe(true);
    }
  });
});
