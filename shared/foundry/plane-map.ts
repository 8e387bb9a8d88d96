// Plane maps in flat typed arrays, for the foundry's inner loops: a rotation system of a
// connected plane graph by its darts. Dart d runs from tail[d] to head[d]; rev[d] is the same
// edge the other way; next[d] / prev[d] are the darts after / before d around tail[d]. The
// face to one side of d continues with next[rev[d]] (the face tracing rule of the tiling
// engine's plane-graph.ts; Mohar & Thomassen, "Graphs on Surfaces", 3.2).
// Face splits (a chord across a face) and vertex splits (a vertex pulled into two joined by a
// new edge, the dual operation) build the children of a map in place, without allocation.
import type { PlaneGraph } from '../tiling/index';

/** The largest maps held: 40 edges (the generator's MAX_EDGES). */
export const MAP_MAX_EDGES = 40;
const CAP_D = 2 * MAP_MAX_EDGES + 2;
const CAP_N = MAP_MAX_EDGES + 2;

export class PlaneMap {
  /** vertices, darts (2 x edges), faces */
  n = 0;
  D = 0;
  F = 0;
  /** every array below is a view of this one buffer (one copy copies a map) */
  private readonly buf = new Int32Array(8 * CAP_D + 2 * CAP_N);
  readonly tail = this.buf.subarray(0, CAP_D);
  readonly head = this.buf.subarray(CAP_D, 2 * CAP_D);
  readonly next = this.buf.subarray(2 * CAP_D, 3 * CAP_D);
  readonly prev = this.buf.subarray(3 * CAP_D, 4 * CAP_D);
  readonly rev = this.buf.subarray(4 * CAP_D, 5 * CAP_D);
  /** per dart: its face; per face: size and one dart */
  readonly face = this.buf.subarray(5 * CAP_D, 6 * CAP_D);
  readonly fsize = this.buf.subarray(6 * CAP_D, 7 * CAP_D);
  readonly ffirst = this.buf.subarray(7 * CAP_D, 8 * CAP_D);
  /** per vertex: degree and one dart leaving it */
  readonly deg = this.buf.subarray(8 * CAP_D, 8 * CAP_D + CAP_N);
  readonly first = this.buf.subarray(8 * CAP_D + CAP_N, 8 * CAP_D + 2 * CAP_N);

  copyFrom(o: PlaneMap): void {
    this.n = o.n;
    this.D = o.D;
    this.F = o.F;
    this.buf.set(o.buf);
  }

  /** Numbers the faces (face, fsize, ffirst, F) from the rotation system. */
  computeFaces(): void {
    const { D, face, fsize, ffirst, next, rev } = this;
    face.fill(-1, 0, D);
    let F = 0;
    for (let d0 = 0; d0 < D; d0++) {
      if (face[d0] !== -1) continue;
      ffirst[F] = d0;
      let size = 0;
      let d = d0;
      do {
        face[d] = F;
        size++;
        d = next[rev[d]!]!;
      } while (d !== d0);
      fsize[F] = size;
      F++;
    }
    this.F = F;
  }

  /** The planar dual into `out` (vertex f = face f; dart d of the dual crosses dart d). Faces must be computed. */
  dualInto(out: PlaneMap): void {
    const { D, F, face, next, prev, rev, fsize, ffirst } = this;
    out.n = F;
    out.D = D;
    for (let d = 0; d < D; d++) {
      out.tail[d] = face[d]!;
      out.head[d] = face[rev[d]!]!;
      out.rev[d] = rev[d]!;
      out.next[d] = next[rev[d]!]!;
      out.prev[d] = rev[prev[d]!]!;
    }
    for (let f = 0; f < F; f++) {
      out.deg[f] = fsize[f]!;
      out.first[f] = ffirst[f]!;
    }
    out.computeFaces();
  }

  /** As a rotation system (adj[v] in the order of next around v). */
  toPlaneGraph(): PlaneGraph {
    const adj: number[][] = [];
    for (let v = 0; v < this.n; v++) {
      const row: number[] = [];
      const d0 = this.first[v]!;
      let d = d0;
      do {
        row.push(this.head[d]!);
        d = this.next[d]!;
      } while (d !== d0);
      adj.push(row);
    }
    return { n: this.n, adj };
  }

  /** The edges as [u, v] per dart pair (the dart with the smaller number), in dart order. */
  edgeCount(): number {
    return this.D / 2;
  }
}

/** A map from a rotation system (trusted: a simple connected plane graph). */
export function mapFromPlaneGraph(g: PlaneGraph, out = new PlaneMap()): PlaneMap {
  const n = g.n;
  let D = 0;
  const start: number[] = [];
  for (let v = 0; v < n; v++) {
    start.push(D);
    D += g.adj[v]!.length;
  }
  if (D > CAP_D || n > CAP_N) throw new RangeError(`mapFromPlaneGraph: at most ${MAP_MAX_EDGES} edges`);
  out.n = n;
  out.D = D;
  for (let v = 0; v < n; v++) {
    const a = g.adj[v]!;
    const s = start[v]!;
    out.deg[v] = a.length;
    out.first[v] = s;
    for (let i = 0; i < a.length; i++) {
      const d = s + i;
      out.tail[d] = v;
      out.head[d] = a[i]!;
      out.next[d] = s + ((i + 1) % a.length);
      out.prev[d] = s + ((i - 1 + a.length) % a.length);
    }
  }
  for (let d = 0; d < D; d++) {
    const w = out.head[d]!;
    const j = g.adj[w]!.indexOf(out.tail[d]!);
    out.rev[d] = start[w]! + j;
  }
  out.computeFaces();
  return out;
}

/**
 * Child of `src` by a chord across a face: a new edge from tail[da] to tail[db], where da and
 * db are darts of the same face whose tails are not consecutive on it. The new dart from
 * tail[da] is src.D, its reverse src.D + 1. Faces are recomputed.
 */
export function faceSplitInto(src: PlaneMap, da: number, db: number, out: PlaneMap): void {
  out.copyFrom(src);
  const x = src.D;
  const y = x + 1;
  const a = src.tail[da]!;
  const b = src.tail[db]!;
  // at a the face arrives by the dart before da on the face: rev of it is prev[da] around a
  const pa = src.prev[da]!;
  const pb = src.prev[db]!;
  out.D = src.D + 2;
  out.tail[x] = a;
  out.head[x] = b;
  out.tail[y] = b;
  out.head[y] = a;
  out.rev[x] = y;
  out.rev[y] = x;
  // insert x between pa and da around a, y between pb and db around b
  out.next[pa] = x;
  out.prev[x] = pa;
  out.next[x] = da;
  out.prev[da] = x;
  out.next[pb] = y;
  out.prev[y] = pb;
  out.next[y] = db;
  out.prev[db] = y;
  out.deg[a] = src.deg[a]! + 1;
  out.deg[b] = src.deg[b]! + 1;
  out.computeFaces();
}

/**
 * Child of `src` by a vertex split: vertex v = tail[d1] = tail[d2] keeps the darts from d1 up
 * to (not including) d2 in rotation order, a new vertex src.n takes the rest, and a new edge
 * joins them (dart src.D from v, src.D + 1 back). Each side keeps at least two darts.
 */
export function vertexSplitInto(src: PlaneMap, d1: number, d2: number, out: PlaneMap): void {
  out.copyFrom(src);
  const v = src.tail[d1]!;
  const w = src.n;
  const x = src.D;
  const y = x + 1;
  out.n = src.n + 1;
  out.D = src.D + 2;
  // darts d2 .. prev(d1) move to w
  let moved = 0;
  for (let d = d2; d !== d1; d = src.next[d]!) {
    out.tail[d] = w;
    out.head[src.rev[d]!] = w;
    moved++;
  }
  const last1 = src.prev[d2]!; // last dart staying at v
  const last2 = src.prev[d1]!; // last dart moving to w
  out.tail[x] = v;
  out.head[x] = w;
  out.tail[y] = w;
  out.head[y] = v;
  out.rev[x] = y;
  out.rev[y] = x;
  // around v: d1 .. last1, x ; around w: d2 .. last2, y
  out.next[last1] = x;
  out.prev[x] = last1;
  out.next[x] = d1;
  out.prev[d1] = x;
  out.next[last2] = y;
  out.prev[y] = last2;
  out.next[y] = d2;
  out.prev[d2] = y;
  out.deg[v] = src.deg[v]! - moved + 1;
  out.deg[w] = moved + 1;
  out.first[v] = d1;
  out.first[w] = d2;
  out.computeFaces();
}
