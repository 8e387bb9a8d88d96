import { describe, expect, it } from 'vitest';
import { all, create } from 'mathjs';
import {
  canonicalCode,
  checkKirchhoff,
  countSpanningTrees,
  dualOf,
  edgesOf,
  facesOf,
  mulberry32,
  parseTiling,
  randomCNet,
  smithDiagram,
  solvePlaneNetwork,
  tilingSpanningTrees,
  verifyTiling,
  wheel,
  type PlaneGraph,
} from '../../../shared/tiling/index';
import { O21_112, O9_33x32, O9_69x61, catalogue } from './helpers';

// mathjs in exact fraction mode, a general-purpose library used as an independent oracle
const math = create(all!, { number: 'Fraction' });

describe('solvePlaneNetwork: the worked example (Brooks, Smith, Stone & Tutte 1940; reference facts)', () => {
  const t = parseTiling(O9_33x32);
  const d = smithDiagram(t);
  const r = solvePlaneNetwork(d.graph, { p: d.pole.from, q: d.pole.to });

  it('full width tau(G - e) = 66, full height tau(G / e) = 64, tau(G) = 130, k = 2', () => {
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.fullWidth).toBe(66n);
    expect(r.fullHeight).toBe(64n);
    expect(r.spanningTrees).toBe(130n);
    expect(r.gcd).toBe(2n);
  });

  it('node potentials 64, 34, 28, 20, 18, 0 for the segments at y = 0, 15, 18, 22, 23, 32', () => {
    expect(d.nodes.map((n) => n.at)).toEqual([0, 15, 18, 22, 23, 32]);
    if (!r.ok) throw new Error(r.message);
    expect(r.potentials).toEqual([64n, 34n, 28n, 20n, 18n, 0n]);
  });

  it('gives back the 33 x 32 up to orientation', () => {
    if (!r.ok) throw new Error(r.message);
    expect(canonicalCode(r.tiling)).toBe(O9_33x32);
  });

  it('the 112 square: tau(G - e) = tau(G / e) = 37632, k = 336 (reference facts)', () => {
    const s = smithDiagram(parseTiling(O21_112));
    const q = solvePlaneNetwork(s.graph, { p: s.pole.from, q: s.pole.to });
    if (!q.ok) throw new Error(q.message);
    expect([q.fullWidth, q.fullHeight, q.gcd]).toEqual([37632n, 37632n, 336n]);
    expect(canonicalCode(q.tiling)).toBe(O21_112);
  });
});

describe('solvePlaneNetwork: every catalogue tiling comes back from its c-net', () => {
  it('horizontal and vertical Smith diagrams both solve to the same canonical code, W_full + H_full = tau(G)', () => {
    for (const { code } of [...catalogue(), { code: O9_69x61 }]) {
      const t = parseTiling(code);
      for (const dir of ['horizontal', 'vertical'] as const) {
        const d = smithDiagram(t, dir);
        const r = solvePlaneNetwork(d.graph, { p: d.pole.from, q: d.pole.to });
        if (!r.ok) throw new Error(`${code} ${dir}: ${r.message}`);
        expect(canonicalCode(r.tiling)).toBe(code.split('*')[0]!.trim());
        if (dir === 'horizontal') expect(r.spanningTrees).toBe(tilingSpanningTrees(t));
      }
    }
  });
});

function reducedLaplacian(g: PlaneGraph, p: number, q: number) {
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
  return { L, pos };
}

/**
 * `count` seeded random c-nets of minEdges to minEdges + span - 1 edges, each with its edges
 * and a random pole edge drawn from the same PRNG when asked for.
 */
function* seededNets(seed: number, count: number, minEdges: number, span: number) {
  const rng = mulberry32(seed);
  for (let i = 0; i < count; i++) {
    const g = randomCNet(minEdges + Math.floor(rng() * span), rng);
    const es = edgesOf(g);
    yield { g, es, randomPole: () => es[Math.floor(rng() * es.length)]! };
  }
}

describe('solvePlaneNetwork against mathjs (exact fractions) on seeded random networks', () => {
  it('potentials = det(L) * L^-1 e_p and widths = det(L) for 60 random c-nets of 10 to 40 edges', () => {
    let solved = 0;
    for (const { g, randomPole } of seededNets(2026, 60, 10, 31)) {
      const [p, q] = randomPole();
      const r = solvePlaneNetwork(g, { p, q });
      const { L, pos } = reducedLaplacian(g, p, q);
      const A = math.matrix(L.map((row) => row.map((v) => math.fraction(v))));
      const det = math.det(A) as unknown as { n: bigint; d: bigint; s: bigint };
      const b = L.map((_, i2) => [math.fraction(i2 === pos.get(p) ? 1 : 0)]);
      const x = (math.lusolve(A, b) as unknown as { toArray(): { s: bigint; n: bigint; d: bigint }[][] }).toArray();
      const D = BigInt(det.s) * BigInt(det.n);
      if (!r.ok) {
        expect(r.code).toBe('zero-current');
        continue;
      }
      solved++;
      expect(r.fullWidth).toBe(D);
      for (let v = 0; v < g.n; v++) {
        const iv = pos.get(v);
        const want = iv === undefined ? 0n : (D * BigInt(x[iv]![0]!.s) * BigInt(x[iv]![0]!.n)) / BigInt(x[iv]![0]!.d);
        expect(r.potentials[v]).toBe(want);
      }
      expect(verifyTiling(r.tiling)).toEqual({ ok: true });
      expect(checkKirchhoff(r.tiling).ok).toBe(true);
    }
    expect(solved).toBeGreaterThan(40);
  });
});

describe('deletion-contraction: tau(G) = tau(G - e) + tau(G / e) (engine.md test plan 5; matrix-tree theorem)', () => {
  it('holds for every pole edge of 20 seeded random c-nets', () => {
    let checked = 0;
    for (const { g, es } of seededNets(88, 20, 8, 20)) {
      const tau = countSpanningTrees(g.n, es);
      for (const [p, q] of es) {
        const r = solvePlaneNetwork(g, { p, q });
        if (!r.ok) continue;
        expect(r.fullWidth + r.fullHeight).toBe(tau);
        checked++;
      }
    }
    expect(checked).toBeGreaterThan(100);
  });
});

describe('duality: (G, e) and (G*, e*) give the same rectangle turned 90 degrees (BSST 1940)', () => {
  it('holds for 40 seeded random c-nets and pole edges', () => {
    let checked = 0;
    for (const { g, randomPole } of seededNets(606, 40, 9, 20)) {
      const [p, q] = randomPole();
      const r = solvePlaneNetwork(g, { p, q });
      if (!r.ok) continue;
      const fs = facesOf(g);
      const faceOf = (u: number, v: number) => fs.findIndex((f) => f.some((a, i) => a === u && f[(i + 1) % f.length] === v));
      const d = solvePlaneNetwork(dualOf(g), { p: faceOf(p, q), q: faceOf(q, p) });
      if (!d.ok) throw new Error(d.message);
      expect(canonicalCode(d.tiling)).toBe(canonicalCode(r.tiling));
      expect([d.tiling.W, d.tiling.H]).toEqual([r.tiling.H, r.tiling.W]);
      checked++;
    }
    expect(checked).toBeGreaterThan(25);
  });
});

describe('solvePlaneNetwork: rejections', () => {
  it('K4 with any pole edge balances a bridge: zero current', () => {
    const r = solvePlaneNetwork(wheel(3), { p: 0, q: 1 });
    expect(r).toMatchObject({ ok: false, code: 'zero-current' });
    if (!r.ok) expect(r.message).toMatch(/carries no current/);
  });

  it('bad poles', () => {
    const g = wheel(4);
    expect(solvePlaneNetwork(g, { p: 0, q: 0 })).toMatchObject({ ok: false, code: 'bad-pole' });
    expect(solvePlaneNetwork(g, { p: 0, q: 9 })).toMatchObject({ ok: false, code: 'bad-pole' });
    // rim vertices 1 and 3 of W_4 (hub 0) face each other across the hub
    expect(solvePlaneNetwork(g, { p: 1, q: 3 })).toMatchObject({ ok: false, code: 'bad-pole', message: 'there is no edge between the poles 1 and 3' });
  });

  it('a pole edge that is a bridge leaves G - e disconnected', () => {
    // a triangle 0-1-2 with a pendant vertex 3 on 0
    const g: PlaneGraph = { n: 4, adj: [[1, 3, 2], [2, 0], [0, 1], [0]] };
    expect(solvePlaneNetwork(g, { p: 0, q: 3 })).toMatchObject({ ok: false, code: 'disconnected' });
    expect(solvePlaneNetwork({ n: 4, adj: [[1], [0], [3], [2]] }, { p: 0, q: 1 })).toMatchObject({ ok: false, code: 'disconnected' });
  });

  it('non-plane rotation systems and malformed graphs', () => {
    // K5 is not planar: no rotation system satisfies Euler's formula
    const k5: PlaneGraph = { n: 5, adj: [0, 1, 2, 3, 4].map((v) => [0, 1, 2, 3, 4].filter((u) => u !== v)) };
    expect(solvePlaneNetwork(k5, { p: 0, q: 1 })).toMatchObject({ ok: false, code: 'not-plane' });
    // the wheel with one rim vertex (hub 0, rim 1..5) turned the other way round
    const w = wheel(5);
    w.adj[1]!.reverse();
    expect(solvePlaneNetwork(w, { p: 0, q: 1 })).toMatchObject({ ok: false, code: 'not-plane' });
    expect(solvePlaneNetwork({ n: 2, adj: [[1], []] }, { p: 0, q: 1 })).toMatchObject({ ok: false, code: 'not-plane' });
    expect(solvePlaneNetwork({ n: 2, adj: [[1, 1], [0, 0]] }, { p: 0, q: 1 })).toMatchObject({ ok: false, code: 'not-plane' });
    expect(solvePlaneNetwork({ n: 2, adj: [[0], [1]] }, { p: 0, q: 1 })).toMatchObject({ ok: false, code: 'not-plane' });
    expect(solvePlaneNetwork({ n: 1, adj: [[]] }, { p: 0, q: 0 })).toMatchObject({ ok: false, code: 'not-plane' });
    expect(solvePlaneNetwork({ n: 3, adj: [[1], [0]] }, { p: 0, q: 1 })).toMatchObject({ ok: false, code: 'not-plane' });
    expect(solvePlaneNetwork({ n: 2, adj: [[7], [0]] }, { p: 0, q: 1 })).toMatchObject({ ok: false, code: 'not-plane' });
    expect(solvePlaneNetwork(null as never, { p: 0, q: 1 })).toMatchObject({ ok: false, code: 'not-plane' });
  });

  it('too large graphs are refused before any work', () => {
    // a wheel with 1,000 rim vertices has 1,001 vertices, over the limit of 1,000
    expect(solvePlaneNetwork(wheel(1000), { p: 0, q: 1 })).toMatchObject({ ok: false, code: 'too-large', message: 'the graph has 1001 vertices; at most 1000 are accepted' });
    // 4 vertices listing 2 x 2,995 darts: 2,995 edges, over the limit of 2,994 (= 3 x 1,000 - 6, Euler's bound for a simple plane graph)
    const heavy: PlaneGraph = { n: 4, adj: [Array.from({ length: 2995 }, () => 1), Array.from({ length: 2995 }, () => 0), [], []] };
    expect(solvePlaneNetwork(heavy, { p: 0, q: 1 })).toMatchObject({ ok: false, code: 'too-large' });
  });

  it('networks of 40 edges leave the Number fast path (entries past 2^26.5) and still solve exactly, matching mathjs', () => {
    const rng = mulberry32(9);
    let solved = 0;
    for (let i = 0; i < 5; i++) {
      const g = randomCNet(40, rng);
      const [p, q] = edgesOf(g)[0]!;
      const r = solvePlaneNetwork(g, { p, q });
      if (!r.ok) continue;
      const { L } = reducedLaplacian(g, p, q);
      const det = math.det(math.matrix(L.map((row) => row.map((v) => math.fraction(v))))) as unknown as { n: bigint };
      expect(r.fullWidth).toBe(BigInt(det.n));
      expect(r.fullWidth > 95_000_000n).toBe(true);
      expect(verifyTiling(r.tiling)).toEqual({ ok: true });
      solved++;
    }
    expect(solved).toBeGreaterThan(2);
  });

  it('a reduced rectangle beyond 2^31 per side is refused as too large', () => {
    const g = randomCNet(56, mulberry32(9));
    const [p, q] = edgesOf(g)[0]!;
    expect(solvePlaneNetwork(g, { p, q })).toMatchObject({ ok: false, code: 'too-large' });
  });
});
