import { describe, expect, it } from 'vitest';
import { canonicalForm, canonicalGraphKey, edgeOrbits } from '../../../shared/foundry/canonical-graph';
import { countPlaneGraphs, graphFromKey, planeGraphsWithEdges } from '../../../shared/foundry/generate-graphs';
import { forEachPlaneMap } from '../../../shared/foundry/generate-maps';
import { dualOf, edgeCount, facesOf, mulberry32, wheel, type PlaneGraph } from '../../../shared/tiling/index';
import { isThreeConnected } from '../tiling/helpers';
import { referenceGraphKeys } from './reference-generator';

// OEIS A002840: number of 3-connected planar (polyhedral) graphs with n edges, n = 6..22.
const A002840 = [1, 0, 1, 2, 2, 4, 12, 22, 58, 158, 448, 1342, 4199, 13384, 43708, 144810, 485704];

function relabel(g: PlaneGraph, seed: number, mirror: boolean): PlaneGraph {
  const rnd = mulberry32(seed);
  const perm = [...Array(g.n).keys()];
  for (let i = perm.length - 1; i > 0; i--) {
    const j = Math.floor(rnd() * (i + 1));
    [perm[i], perm[j]] = [perm[j]!, perm[i]!];
  }
  const adj: number[][] = Array.from({ length: g.n }, () => []);
  for (let v = 0; v < g.n; v++) {
    let row = g.adj[v]!.map((w) => perm[w]!);
    if (mirror) row = row.reverse();
    const r = Math.floor(rnd() * row.length);
    adj[perm[v]!] = [...row.slice(r), ...row.slice(0, r)];
  }
  return { n: g.n, adj };
}

describe('3-connected planar graph generation', () => {
  it('counts equal OEIS A002840 for m = 6..20 edges', () => {
    // Source: OEIS A002840 (polyhedral graphs with n edges).
    const counts = countPlaneGraphs(20);
    expect(counts.slice(6, 21)).toEqual(A002840.slice(0, 15));
  });

  it('gives exactly the graphs of the straightforward level-by-level generator (a table of every map seen), m = 6..17', () => {
    for (let m = 6; m <= 17; m++) {
      const keys = [...planeGraphsWithEdges(m)].map((g) => g.key);
      expect(new Set(keys).size).toBe(keys.length);
      expect(keys.sort()).toEqual([...referenceGraphKeys(m)].sort());
    }
  });

  it('splits into shards that are disjoint and together give every graph once (m = 15, 17)', () => {
    for (const [m, count] of [[15, 3], [17, 4]] as const) {
      const all = [...planeGraphsWithEdges(m)].map((g) => g.key).sort();
      const parts: string[] = [];
      for (let index = 0; index < count; index++) parts.push(...[...planeGraphsWithEdges(m, { shard: { index, count } })].map((g) => g.key));
      expect(parts.sort()).toEqual(all);
      // Source: OEIS A002840.
      expect(all.length).toBe(A002840[m - 6]);
    }
  });

  it('counts the same with progress reported and with shards, wheels included (m = 6..14)', () => {
    // Source: OEIS A002840. The progress pass once visited a wheel with exactly m edges twice.
    for (let m = 6; m <= 14; m++) {
      let withProgress = 0;
      forEachPlaneMap(m, () => withProgress++, { onProgress: () => undefined });
      let sharded = 0;
      for (let index = 0; index < 3; index++) forEachPlaneMap(m, () => sharded++, { shard: { index, count: 3 } });
      expect([m, withProgress, sharded]).toEqual([m, A002840[m - 6], A002840[m - 6]]);
    }
  });

  it('every generated graph up to 14 edges is 3-connected by brute force, satisfies Euler and has distinct codes', () => {
    for (let m = 6; m <= 14; m++) {
      const keys = new Set<string>();
      for (const { key, dualKey } of planeGraphsWithEdges(m)) {
        const g = graphFromKey(key);
        expect(edgeCount(g)).toBe(m);
        expect(isThreeConnected(g)).toBe(true);
        // Euler's formula for a connected plane graph: V - E + F = 2 (a valid rotation system of the sphere).
        expect(g.n - m + facesOf(g).length).toBe(2);
        expect(canonicalGraphKey(dualOf(g))).toBe(dualKey);
        keys.add(key);
      }
      expect(keys.size).toBe(A002840[m - 6]);
    }
  });

  it('yields graphs incrementally and stops when asked', () => {
    let seen = 0;
    for (const _ of planeGraphsWithEdges(16, { shouldStop: () => seen >= 5 })) seen++;
    expect(seen).toBe(5);
  });

  it('rejects an edge count outside the supported range with a precise error', () => {
    expect(() => [...planeGraphsWithEdges(5)]).toThrow(/m must be an integer in 6\.\.40, got 5/);
    expect(() => [...planeGraphsWithEdges(6.5)]).toThrow(/got 6\.5/);
  });
});

describe('canonical code of an embedding', () => {
  it('does not depend on the numbering, the starting dart of each rotation or the mirror image', () => {
    const keys = [...planeGraphsWithEdges(15)].map((x) => x.key);
    let seed = 1;
    for (const k of keys) {
      const g = graphFromKey(k);
      for (const mirror of [false, true]) expect(canonicalGraphKey(relabel(g, seed++, mirror))).toBe(k);
    }
  });

  it('finds the automorphism groups of K4 (24), the cube (48) and the wheels (2k)', () => {
    // Symmetry groups of the tetrahedron and cube, reflections included (order 24 and 48),
    // and the dihedral group of order 2k of the wheel W_k, k >= 4: handbook values (from memory).
    expect(canonicalForm(wheel(3)).automorphisms).toBe(24);
    expect(canonicalForm(dualOf(dualOf(wheel(3)))).automorphisms).toBe(24);
    const cube: PlaneGraph = {
      n: 8,
      // outer square 0-1-2-3, inner square 4-5-6-7, spokes i <-> i+4; one consistent sense
      adj: [[1, 4, 3], [2, 5, 0], [3, 6, 1], [0, 7, 2], [0, 5, 7], [1, 6, 4], [2, 7, 5], [3, 4, 6]],
    };
    expect(g3(cube)).toBe(2);
    expect(canonicalForm(cube).automorphisms).toBe(48);
    for (const k of [4, 5, 7]) expect(canonicalForm(wheel(k)).automorphisms).toBe(2 * k);
  });

  it('gives one edge orbit for K4 and the cube, two (spokes, rim) for a wheel', () => {
    expect(edgeOrbits(wheel(3)).map((o) => o.size)).toEqual([6]);
    const w6 = edgeOrbits(wheel(6)).map((o) => o.size).sort((a, b) => a - b);
    expect(w6).toEqual([6, 6]);
    const octahedron = dualOf({ n: 8, adj: [[1, 4, 3], [2, 5, 0], [3, 6, 1], [0, 7, 2], [0, 5, 7], [1, 6, 4], [2, 7, 5], [3, 4, 6]] });
    expect(edgeOrbits(octahedron).map((o) => o.size)).toEqual([12]);
  });

  it('edge orbits partition the edges for every graph with 16 edges', () => {
    for (const { key } of planeGraphsWithEdges(16)) {
      const orbits = edgeOrbits(graphFromKey(key));
      expect(orbits.reduce((s, o) => s + o.size, 0)).toBe(16);
    }
  });
});

/** Euler characteristic check helper for a hand-written embedding: V - E + F. */
function g3(g: PlaneGraph): number {
  return g.n - edgeCount(g) + facesOf(g).length;
}
