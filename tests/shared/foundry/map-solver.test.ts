import { describe, expect, it } from 'vitest';
import { canonicalKey, mulberry32, parseTiling, randomCNet, smithDiagram, solvePlaneNetwork, verifyTiling } from '../../../shared/tiling/index';
import { MapSolver } from '../../../shared/foundry/map-solver';
import { faceSplitInto, mapFromPlaneGraph, PlaneMap, vertexSplitInto } from '../../../shared/foundry/plane-map';
import { MapCanonizer } from '../../../shared/foundry/map-canonical';
import { canonicalGraphKey } from '../../../shared/foundry/canonical-graph';
import { dualOf, facesOf, splitFace } from '../../../shared/tiling/index';
import { isThreeConnected } from '../tiling/helpers';

// The tiling engine's solvePlaneNetwork (one Bareiss solve per pole, re-verified) is the
// straightforward reference for the foundry's one-adjugate-per-graph solver.
describe('one adjugate per c-net gives every pole choice', () => {
  it('agrees with solvePlaneNetwork on every edge of seeded random c-nets (7 to 30 edges)', () => {
    const rng = mulberry32(19);
    const solver = new MapSolver();
    let compared = 0;
    for (let i = 0; i < 80; i++) {
      const g = randomCNet(8 + Math.floor(rng() * 23), rng);
      const m = mapFromPlaneGraph(g);
      expect(solver.adjugate(m)).toBe(true);
      for (let d = 0; d < m.D; d++) {
        const p = m.tail[d]!;
        const q = m.head[d]!;
        const r = solvePlaneNetwork(g, { p, q });
        const t = solver.tiling(m, d);
        if (!r.ok) {
          expect(r.code).toBe('zero-current');
          expect(t).toBeNull();
          continue;
        }
        // matrix-tree theorem: tau(G) = tau(G - e) + tau(G / e), the unreduced width and height
        expect(BigInt(solver.tau)).toBe(r.spanningTrees);
        expect(BigInt(solver.height(p, q, m.n))).toBe(r.fullHeight);
        expect(t).not.toBeNull();
        expect(verifyTiling(t!)).toEqual({ ok: true });
        expect([t!.W, t!.H]).toEqual([r.tiling.W, r.tiling.H]);
        expect(canonicalKey(t!)).toBe(canonicalKey(r.tiling));
        compared++;
      }
    }
    expect(compared).toBeGreaterThan(1000);
  });

  it('solves the c-net of the 112 x 112 square (OEIS A014530) to that square, tau(G - e) = tau(G / e) = 37632 (facts.md)', () => {
    const t = parseTiling('21 112 112 (50,35,27)(8,19)(15,17,11)(6,24)(29,25,9,2)(7,18)(16)(42)(4,37)(33)');
    const d = smithDiagram(t, 'horizontal');
    const m = mapFromPlaneGraph(d.graph);
    const solver = new MapSolver();
    expect(solver.adjugate(m)).toBe(true);
    const pd = [...Array(m.D).keys()].find((x) => m.tail[x] === d.pole.from && m.head[x] === d.pole.to)!;
    expect(solver.height(d.pole.from, d.pole.to, m.n)).toBe(37632);
    expect(solver.tau).toBe(2 * 37632);
    expect(canonicalKey(solver.tiling(m, pd)!)).toBe(canonicalKey(t));
  });
});

describe('plane maps', () => {
  it('a face split is the splitFace of the tiling engine, a vertex split is 3-connected and contracts back, and codes equal canonical-graph.ts', () => {
    const rng = mulberry32(5);
    const canon = new MapCanonizer();
    const out = new PlaneMap();
    const dual = new PlaneMap();
    for (let i = 0; i < 60; i++) {
      const g = randomCNet(8 + Math.floor(rng() * 16), rng);
      const m = mapFromPlaneGraph(g);
      canon.run(m, false);
      expect(canon.key()).toBe(canonicalGraphKey(g));
      m.dualInto(dual);
      canon.run(dual, false);
      expect(canon.key()).toBe(canonicalGraphKey(dualOf(g)));
      // a face split: the same map as the tiling engine's splitFace (faces numbered alike)
      for (let f = 0; f < m.F; f++) {
        if (m.fsize[f]! < 4) continue;
        const d0 = m.ffirst[f]!;
        const d2 = m.next[m.rev[m.next[m.rev[d0]!]!]!]!;
        faceSplitInto(m, d0, d2, out);
        expect(out.n - out.D / 2 + out.F).toBe(2); // Euler
        canon.run(out, false);
        expect(canon.key()).toBe(canonicalGraphKey(splitFace(g, facesOf(g)[f]!, 0, 2)));
        expect(isThreeConnected(out.toPlaneGraph())).toBe(true);
        break;
      }
      // a vertex split: 3-connected, and contracting the new edge gives the map back
      for (let v = 0; v < m.n; v++) {
        if (m.deg[v]! < 4) continue;
        const d1 = m.first[v]!;
        vertexSplitInto(m, d1, m.next[m.next[d1]!]!, out);
        expect(out.n - out.D / 2 + out.F).toBe(2);
        const split = out.toPlaneGraph();
        expect(isThreeConnected(split)).toBe(true);
        const w = m.n;
        const merged = split.adj.slice(0, w).map((row) => row.map((u) => (u === w ? v : u)));
        merged[v] = [...split.adj[v]!.filter((u) => u !== w), ...split.adj[w]!.filter((u) => u !== v)];
        expect(canonicalGraphKey({ n: w, adj: merged })).toBe(canonicalGraphKey(g));
        break;
      }
    }
  });
});
