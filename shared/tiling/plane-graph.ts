// Rotation systems (combinatorial embeddings) of plane graphs, the one implementation both
// engines use: validation with darts and faces (analysePlaneGraph, for outside input), and the
// fast operations on trusted graphs (faces, planar dual, face split, wheel) that the foundry's
// generation runs millions of times.
// Face tracing rule: the dart after (u -> v) is (v -> w), w = the neighbour after u in adj[v]
// (common practice for rotation systems; Mohar & Thomassen, "Graphs on Surfaces", 3.2).

import type { PlaneGraph } from './types';

export const MAX_GRAPH_VERTICES = 1000;
export const MAX_GRAPH_EDGES = 2994;

export interface Darts {
  /** dart d goes from tail[d] to head[d]; darts of vertex v are first[v] .. first[v+1]-1 in rotation order */
  tail: Int32Array;
  head: Int32Array;
  first: Int32Array;
  /** the reverse dart */
  rev: Int32Array;
  /** face id of each dart (the face on the dart's traced side) */
  face: Int32Array;
  /** the next dart around the same face, and one dart of each face */
  faceNext: Int32Array;
  faceFirst: Int32Array;
  faceCount: number;
  edgeCount: number;
}

export type GraphCheck = { ok: true; darts: Darts } | { ok: false; code: 'not-plane' | 'disconnected' | 'too-large'; message: string };

/**
 * The darts of a rotation system whose lists hold vertices 0..n-1: dart first[v] + i goes from
 * v (tail) to adj[v][i] (head); rev[d] is the reverse dart, -1 where adj[head] lacks the tail.
 */
export function dartArrays(g: PlaneGraph): { first: Int32Array; tail: Int32Array; head: Int32Array; rev: Int32Array } {
  const n = g.n;
  const first = new Int32Array(n + 1);
  for (let v = 0; v < n; v++) first[v + 1] = first[v]! + g.adj[v]!.length;
  const D = first[n]!;
  const tail = new Int32Array(D);
  const head = new Int32Array(D);
  for (let v = 0; v < n; v++) {
    const a = g.adj[v]!;
    for (let i = 0; i < a.length; i++) {
      tail[first[v]! + i] = v;
      head[first[v]! + i] = a[i]!;
    }
  }
  const rev = new Int32Array(D);
  for (let d = 0; d < D; d++) {
    const v = head[d]!;
    const j = g.adj[v]!.indexOf(tail[d]!);
    rev[d] = j < 0 ? -1 : first[v]! + j;
  }
  return { first, tail, head, rev };
}

/** Checks shape, symmetry, loops, parallel edges, connectivity and Euler's formula V - E + F = 2. */
export function analysePlaneGraph(g: PlaneGraph): GraphCheck {
  if (g === null || typeof g !== 'object' || !Array.isArray(g.adj)) {
    return { ok: false, code: 'not-plane', message: 'the graph must be an object { n, adj } with adj an array of neighbour lists' };
  }
  const n = g.n;
  if (!Number.isInteger(n) || n < 2) return { ok: false, code: 'not-plane', message: `n must be an integer >= 2 (got ${String(n)})` };
  if (n > MAX_GRAPH_VERTICES) return { ok: false, code: 'too-large', message: `the graph has ${n} vertices; at most ${MAX_GRAPH_VERTICES} are accepted` };
  if (g.adj.length !== n) return { ok: false, code: 'not-plane', message: `adj has ${g.adj.length} lists but n = ${n}` };
  let D = 0;
  for (let v = 0; v < n; v++) {
    const list = g.adj[v];
    if (!Array.isArray(list)) return { ok: false, code: 'not-plane', message: `adj[${v}] is not an array` };
    D += list.length;
  }
  if (D / 2 > MAX_GRAPH_EDGES) return { ok: false, code: 'too-large', message: `the graph has ${D / 2} edges; at most ${MAX_GRAPH_EDGES} are accepted` };
  const stamp = new Int32Array(n).fill(-1);
  for (let v = 0; v < n; v++) {
    const list = g.adj[v]!;
    for (let i = 0; i < list.length; i++) {
      const u = list[i];
      if (typeof u !== 'number' || !Number.isInteger(u) || u < 0 || u >= n) {
        return { ok: false, code: 'not-plane', message: `adj[${v}][${i}] = ${String(u)} is not a vertex (0..${n - 1})` };
      }
      if (u === v) return { ok: false, code: 'not-plane', message: `vertex ${v} has a loop (adj[${v}][${i}] = ${v})` };
      if (stamp[u] === v) return { ok: false, code: 'not-plane', message: `vertex ${v} lists neighbour ${u} twice; parallel edges are not accepted` };
      stamp[u] = v;
    }
  }
  const { first, tail, head, rev } = dartArrays(g);
  const oneWay = rev.indexOf(-1);
  if (oneWay >= 0) {
    const u = tail[oneWay]!;
    const v = head[oneWay]!;
    return { ok: false, code: 'not-plane', message: `edge ${u}-${v} appears in adj[${u}] but ${u} is missing from adj[${v}]` };
  }
  // connectivity
  const seenV = new Uint8Array(n);
  const stack = [0];
  seenV[0] = 1;
  let reached = 1;
  while (stack.length > 0) {
    const v = stack.pop()!;
    for (let d = first[v]!; d < first[v + 1]!; d++) {
      const u = head[d]!;
      if (!seenV[u]) {
        seenV[u] = 1;
        reached++;
        stack.push(u);
      }
    }
  }
  if (reached < n) {
    const missing = seenV.indexOf(0);
    return { ok: false, code: 'disconnected', message: `the graph is not connected: vertex ${missing} cannot be reached from vertex 0` };
  }
  // faces
  const face = new Int32Array(D).fill(-1);
  const faceNext = new Int32Array(D);
  const faceFirst = new Int32Array(D);
  let faceCount = 0;
  for (let d0 = 0; d0 < D; d0++) {
    if (face[d0] !== -1) continue;
    faceFirst[faceCount] = d0;
    let d = d0;
    while (face[d] === -1) {
      face[d] = faceCount;
      const r = rev[d]!; // dart v -> u at v
      const v = tail[r]!;
      const deg = first[v + 1]! - first[v]!;
      const nd = first[v]! + ((r - first[v]! + 1) % deg);
      faceNext[d] = nd;
      d = nd;
    }
    faceCount++;
  }
  const E = D / 2;
  if (n - E + faceCount !== 2) {
    return {
      ok: false,
      code: 'not-plane',
      message: `the rotation system is not a plane embedding: V - E + F = ${n} - ${E} + ${faceCount} = ${n - E + faceCount}, not 2 (check that every vertex lists its neighbours in the same cyclic sense)`,
    };
  }
  return { ok: true, darts: { tail, head, first, rev, face, faceNext, faceFirst: faceFirst.subarray(0, faceCount), faceCount, edgeCount: E } };
}

// ---- Operations on trusted rotation systems (no validation; callers pass plane graphs) ----

export function edgeCount(g: PlaneGraph): number {
  let s = 0;
  for (const a of g.adj) s += a.length;
  return s / 2;
}

/** Every undirected edge once, as [u, v] with u < v, in vertex order. */
export function edgesOf(g: PlaneGraph): [number, number][] {
  const out: [number, number][] = [];
  for (let u = 0; u < g.n; u++) for (const v of g.adj[u] ?? []) if (u < v) out.push([u, v]);
  return out;
}

/**
 * Traces every face once, starting each at its first dart in vertex order:
 * faces[f] = a_0, a_1, ... with darts a_t -> a_(t+1), and faceOfDart[u][i] = the face of the
 * dart u -> adj[u][i]. The face numbering is the one analysePlaneGraph gives.
 */
function traceFaces(g: PlaneGraph): { faces: number[][]; faceOfDart: Int32Array[] } {
  const faceOfDart = g.adj.map((a) => new Int32Array(a.length).fill(-1));
  const faces: number[][] = [];
  for (let u0 = 0; u0 < g.n; u0++) {
    for (let i0 = 0; i0 < g.adj[u0]!.length; i0++) {
      if (faceOfDart[u0]![i0] !== -1) continue;
      const f = faces.length;
      const face: number[] = [];
      let u = u0;
      let i = i0;
      while (faceOfDart[u]![i] === -1) {
        faceOfDart[u]![i] = f;
        face.push(u);
        const v = g.adj[u]![i]!;
        const av = g.adj[v]!;
        i = (av.indexOf(u) + 1) % av.length;
        u = v;
      }
      faces.push(face);
    }
  }
  return { faces, faceOfDart };
}

/** Faces as vertex cycles: face[i] = a_0, a_1, ... with darts a_t -> a_(t+1). */
export function facesOf(g: PlaneGraph): number[][] {
  return traceFaces(g).faces;
}

/**
 * The planar dual: one vertex per face (numbered as facesOf numbers them); the rotation of a
 * face lists the faces across its boundary darts in traversal order [common practice].
 */
export function dualOf(g: PlaneGraph): PlaneGraph {
  const { faces, faceOfDart } = traceFaces(g);
  const adj = faces.map((face) =>
    face.map((u, t) => {
      const v = face[(t + 1) % face.length]!;
      return faceOfDart[v]![g.adj[v]!.indexOf(u)]!;
    }),
  );
  return { n: adj.length, adj };
}

/**
 * Splits face `face` (as returned by facesOf) by a chord between its positions i and j
 * (non-consecutive). Returns a new graph; the input is not changed. In a 3-connected plane
 * graph such a chord is never a multiple edge (its ends would form a 2-cut) and the result is
 * 3-connected again.
 */
export function splitFace(g: PlaneGraph, face: readonly number[], i: number, j: number): PlaneGraph {
  const k = face.length;
  const a = face[i]!;
  const b = face[j]!;
  const aPrev = face[(i - 1 + k) % k]!;
  const bPrev = face[(j - 1 + k) % k]!;
  const adj = g.adj.map((r) => r.slice());
  const ra = adj[a]!;
  ra.splice(ra.indexOf(aPrev) + 1, 0, b);
  const rb = adj[b]!;
  rb.splice(rb.indexOf(bPrev) + 1, 0, a);
  return { n: g.n, adj };
}

/** The wheel W_k with k spokes: hub 0, rim 1..k, 2k edges; its faces are k triangles and the rim. */
export function wheel(k: number): PlaneGraph {
  if (!Number.isInteger(k) || k < 3) throw new RangeError(`wheel: k must be an integer >= 3, got ${k}`);
  const adj: number[][] = [Array.from({ length: k }, (_, i) => i + 1)];
  for (let i = 1; i <= k; i++) adj.push([0, i === 1 ? k : i - 1, i === k ? 1 : i + 1]);
  return { n: k + 1, adj };
}
