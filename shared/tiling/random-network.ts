// Seeded random plane c-nets for tests and benchmarks: a wheel (3-connected, Tutte) grown by
// face splits (a chord across a face keeps a plane graph 3-connected) and planar duals
// (engine.md section 6). `rng` returns uniform numbers in [0, 1), e.g. mulberry32(seed).

import { analysePlaneGraph } from './plane-graph';
import type { PlaneGraph } from './types';

/** mulberry32, a small seeded PRNG (common practice; public-domain by T. Ettinger). */
export function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** The wheel W_k: hub k, rim 0..k-1, as a rotation system. */
export function wheel(k: number): PlaneGraph {
  const adj: number[][] = [];
  for (let i = 0; i < k; i++) adj.push([(i + 1) % k, k, (i + k - 1) % k]);
  const hub: number[] = [];
  for (let i = 0; i < k; i++) hub.push(i);
  adj.push(hub);
  return { n: k + 1, adj };
}

/** Faces of a valid rotation system as lists of darts [tail, head]. */
export function faces(g: PlaneGraph): [number, number][][] {
  const a = analysePlaneGraph(g);
  if (!a.ok) throw new Error(a.message);
  const { tail, head, face, faceCount, first, rev } = a.darts;
  const out: [number, number][][] = Array.from({ length: faceCount }, () => []);
  const done = new Uint8Array(tail.length);
  for (let d0 = 0; d0 < tail.length; d0++) {
    if (done[d0]) continue;
    let d = d0;
    while (!done[d]) {
      done[d] = 1;
      out[face[d]!]!.push([tail[d]!, head[d]!]);
      const r = rev[d]!;
      const v = tail[r]!;
      const deg = first[v + 1]! - first[v]!;
      d = first[v]! + ((r - first[v]! + 1) % deg);
    }
  }
  return out;
}

/** The planar dual: a vertex per face; around a face, the faces across its darts in order. */
export function dual(g: PlaneGraph): PlaneGraph {
  const a = analysePlaneGraph(g);
  if (!a.ok) throw new Error(a.message);
  const fs = faces(g);
  const faceOf = new Map<string, number>();
  fs.forEach((f, i) => f.forEach(([u, v]) => faceOf.set(`${u},${v}`, i)));
  return { n: fs.length, adj: fs.map((f) => f.map(([u, v]) => faceOf.get(`${v},${u}`)!)) };
}

/** Adds a chord across a random face between two non-adjacent corners; false when none exists. */
export function splitRandomFace(g: PlaneGraph, rng: () => number): boolean {
  const fs = faces(g).filter((f) => f.length >= 4);
  if (fs.length === 0) return false;
  for (let attempt = 0; attempt < 8; attempt++) {
    const f = fs[Math.floor(rng() * fs.length)]!;
    const L = f.length;
    const i = Math.floor(rng() * L);
    const j = (i + 2 + Math.floor(rng() * (L - 3))) % L;
    // corner i sits at head of dart f[i], between tail(f[i]) and head(f[i+1])
    const [pa, a] = f[i]!;
    const [pb, b] = f[j]!;
    if (a === b || g.adj[a]!.includes(b)) continue;
    const ia = g.adj[a]!.indexOf(pa);
    g.adj[a]!.splice(ia + 1, 0, b);
    const ib = g.adj[b]!.indexOf(pb);
    g.adj[b]!.splice(ib + 1, 0, a);
    return true;
  }
  return false;
}

/**
 * A random 3-connected plane graph with `edges` edges (6 or at least 8; none has 7), grown from
 * a wheel W_k with k >= 4 (K4 = W_3 is a dead end for face splits: all its faces are triangles
 * and it is self-dual).
 */
export function randomCNet(edges: number, rng: () => number): PlaneGraph {
  if (!Number.isInteger(edges) || edges < 6 || edges === 7) throw new RangeError(`no 3-connected plane graph has ${edges} edges`);
  if (edges === 6) return wheel(3);
  const k = Math.min(Math.floor(edges / 2), Math.max(4, Math.floor(edges / 4) + Math.floor(rng() * 2)));
  let g = wheel(k);
  let m = 2 * k;
  while (m < edges) {
    if (rng() < 0.5) g = dual(g);
    if (splitRandomFace(g, rng)) m++;
    else g = dual(g);
  }
  if (rng() < 0.5) g = dual(g);
  return g;
}

/** Every edge of a simple rotation system once, as [u, v] with u < v. */
export function edgeList(g: PlaneGraph): [number, number][] {
  const out: [number, number][] = [];
  g.adj.forEach((list, u) => list.forEach((v) => u < v && out.push([u, v])));
  return out;
}
