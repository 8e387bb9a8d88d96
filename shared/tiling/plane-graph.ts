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

/**
 * Dart and face arrays that one validation fills (analyseInto), reusable from call to call:
 * the arrays grow to the largest graph seen and only their first n + 1 (first), D (the dart
 * arrays) or faceCount (faceFirst) entries are meaningful. The solver keeps one set at module
 * level, so validating a small c-net allocates nothing.
 */
export class DartBuffers {
  n = 0;
  /** number of darts (twice the edges) */
  D = 0;
  faceCount = 0;
  first = new Int32Array(0);
  tail = new Int32Array(0);
  head = new Int32Array(0);
  rev = new Int32Array(0);
  face = new Int32Array(0);
  faceNext = new Int32Array(0);
  faceFirst = new Int32Array(0);
  /** scratch of n entries: the neighbour stamps, then the connectivity stack */
  stamp = new Int32Array(0);
  seen = new Uint8Array(0);

  /** Room for n vertices and D darts (exactly that much when the arrays must grow). */
  ensure(n: number, D: number): void {
    if (this.first.length < n + 1) {
      this.first = new Int32Array(n + 1);
      this.stamp = new Int32Array(n);
      this.seen = new Uint8Array(n);
    }
    if (this.tail.length < D) {
      this.tail = new Int32Array(D);
      this.head = new Int32Array(D);
      this.rev = new Int32Array(D);
      this.face = new Int32Array(D);
      this.faceNext = new Int32Array(D);
      this.faceFirst = new Int32Array(D);
    }
  }
}

type GraphFailure = Extract<GraphCheck, { ok: false }>;

/**
 * Checks shape, symmetry, loops, parallel edges, connectivity and Euler's formula V - E + F = 2,
 * filling b with the darts and faces; null when every check passes.
 */
export function analyseInto(g: PlaneGraph, b: DartBuffers): GraphFailure | null {
  if (g === null || typeof g !== 'object' || !Array.isArray(g.adj)) {
    return { ok: false, code: 'not-plane', message: 'the graph must be an object { n, adj } with adj an array of neighbour lists' };
  }
  const n = g.n;
  const adj = g.adj;
  if (!Number.isInteger(n) || n < 2) return { ok: false, code: 'not-plane', message: `n must be an integer >= 2 (got ${String(n)})` };
  if (n > MAX_GRAPH_VERTICES) return { ok: false, code: 'too-large', message: `the graph has ${n} vertices; at most ${MAX_GRAPH_VERTICES} are accepted` };
  if (adj.length !== n) return { ok: false, code: 'not-plane', message: `adj has ${adj.length} lists but n = ${n}` };
  let D = 0;
  for (let v = 0; v < n; v++) {
    const list = adj[v];
    if (!Array.isArray(list)) return { ok: false, code: 'not-plane', message: `adj[${v}] is not an array` };
    D += list.length;
  }
  if (D / 2 > MAX_GRAPH_EDGES) return { ok: false, code: 'too-large', message: `the graph has ${D / 2} edges; at most ${MAX_GRAPH_EDGES} are accepted` };
  b.ensure(n, D);
  b.n = n;
  b.D = D;
  b.faceCount = 0;
  const { first, tail, head, rev, stamp, seen: seenV } = b;
  stamp.fill(-1, 0, n);
  first[0] = 0;
  for (let v = 0, d = 0; v < n; v++) {
    const list = adj[v]!;
    for (let i = 0; i < list.length; i++, d++) {
      const u = list[i];
      if (typeof u !== 'number' || !Number.isInteger(u) || u < 0 || u >= n) {
        return { ok: false, code: 'not-plane', message: `adj[${v}][${i}] = ${String(u)} is not a vertex (0..${n - 1})` };
      }
      if (u === v) return { ok: false, code: 'not-plane', message: `vertex ${v} has a loop (adj[${v}][${i}] = ${v})` };
      if (stamp[u] === v) return { ok: false, code: 'not-plane', message: `vertex ${v} lists neighbour ${u} twice; parallel edges are not accepted` };
      stamp[u] = v;
      tail[d] = v;
      head[d] = u;
    }
    first[v + 1] = d;
  }
  // reverse darts, each pair found once from its first dart (no parallel edges: the pair is
  // unique); the first dart without a reverse is the first one left unpaired
  rev.fill(-1, 0, D);
  for (let d = 0; d < D; d++) {
    if (rev[d] !== -1) continue;
    const v = head[d]!;
    const u = tail[d]!;
    const end = first[v + 1]!;
    let r = first[v]!;
    while (r < end && head[r] !== u) r++;
    if (r === end) return { ok: false, code: 'not-plane', message: `edge ${u}-${v} appears in adj[${u}] but ${u} is missing from adj[${v}]` };
    rev[d] = r;
    rev[r] = d;
  }
  // connectivity (depth first; stamp is free again and serves as the stack)
  seenV.fill(0, 0, n);
  const stack = stamp;
  let top = 0;
  stack[top++] = 0;
  seenV[0] = 1;
  let reached = 1;
  while (top > 0) {
    const v = stack[--top]!;
    for (let d = first[v]!; d < first[v + 1]!; d++) {
      const u = head[d]!;
      if (!seenV[u]) {
        seenV[u] = 1;
        reached++;
        stack[top++] = u;
      }
    }
  }
  if (reached < n) {
    const missing = seenV.subarray(0, n).indexOf(0);
    return { ok: false, code: 'disconnected', message: `the graph is not connected: vertex ${missing} cannot be reached from vertex 0` };
  }
  // faces
  const { face, faceNext, faceFirst } = b;
  face.fill(-1, 0, D);
  let faceCount = 0;
  for (let d0 = 0; d0 < D; d0++) {
    if (face[d0] !== -1) continue;
    faceFirst[faceCount] = d0;
    let d = d0;
    while (face[d] === -1) {
      face[d] = faceCount;
      const r = rev[d]!; // dart v -> u at v
      const v = tail[r]!;
      const f0 = first[v]!;
      const nd = r + 1 === first[v + 1]! ? f0 : r + 1;
      faceNext[d] = nd;
      d = nd;
    }
    faceCount++;
  }
  b.faceCount = faceCount;
  const E = D / 2;
  if (n - E + faceCount !== 2) {
    return {
      ok: false,
      code: 'not-plane',
      message: `the rotation system is not a plane embedding: V - E + F = ${n} - ${E} + ${faceCount} = ${n - E + faceCount}, not 2 (check that every vertex lists its neighbours in the same cyclic sense)`,
    };
  }
  return null;
}

/** Checks shape, symmetry, loops, parallel edges, connectivity and Euler's formula V - E + F = 2. */
export function analysePlaneGraph(g: PlaneGraph): GraphCheck {
  const b = new DartBuffers();
  const fail = analyseInto(g, b);
  if (fail) return fail;
  const { tail, head, first, rev, face, faceNext, faceFirst, faceCount, D } = b;
  return { ok: true, darts: { tail, head, first, rev, face, faceNext, faceFirst: faceFirst.subarray(0, faceCount), faceCount, edgeCount: D / 2 } };
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
