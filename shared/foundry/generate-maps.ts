// Every 3-connected plane graph (polyhedral map) with m edges, each exactly once, without
// storing any of them: generation by canonical construction path (B. D. McKay, "Isomorph-free
// exhaustive generation", J. Algorithms 26 (1998) 306-324), over Tutte's wheel theorem
// (W. T. Tutte, "A theory of 3-connected graphs", Indag. Math. 23 (1961) 441-455): every
// 3-connected graph other than a wheel has an edge whose deletion or contraction leaves a
// simple 3-connected graph. The inverse operations are a chord across a face (face split) and
// a vertex split, so every polyhedral map with m edges that is not a wheel is a child of one
// with m - 1 edges; wheels are the roots.
//
// Each map h has a canonical reduction: among its reductions (an edge whose deletion keeps h
// 3-connected, or one whose contraction does), the ones with the largest invariant (kind,
// end degrees, side face sizes), and among those the one whose end vertices get the
// smallest canonical numbers (orbits under the automorphism group). A child is kept only
// when the edge just added is its canonical reduction; then its parent is determined up to
// isomorphism, and the parent's own symmetries are divided out by trying one operation per
// orbit. So no two outputs are isomorphic and none is missed, without a table of seen maps:
// the search is a tree, and disjoint subtrees can run in separate threads (shards).
//
// 3-connectivity tests on a plane map: a 2-connected plane graph is 3-connected exactly when
// any two faces meet in nothing, one vertex or one edge (common practice; e.g. Mohar &
// Thomassen, "Graphs on Surfaces", 2.4). Deleting edge uv merges its two faces into one; the
// result stays 3-connected iff no other face meets the merged face in two vertices that are not
// the ends of a shared edge, or in three. Contraction is deletion in the dual.
import { wheel } from '../tiling/index';
import { MapCanonizer } from './map-canonical';
import { PlaneMap, faceSplitInto, mapFromPlaneGraph, vertexSplitInto, MAP_MAX_EDGES } from './plane-map';

const DEL = 1;
const CON = 0;

/** Scratch marks shared by the tests (stamped, never cleared). */
export class Marks {
  vert = new Int32Array(MAP_MAX_EDGES + 2);
  face = new Int32Array(2 * MAP_MAX_EDGES + 2);
  stamp = 0;
}

/** Deleting the edge of dart d keeps m simple and 3-connected. */
export function deletable(m: PlaneMap, d: number, mk: Marks): boolean {
  const { tail, head, next, rev, face, ffirst, deg } = m;
  const u = tail[d]!;
  const v = head[d]!;
  if (deg[u]! < 4 || deg[v]! < 4) return false;
  const f1 = face[d]!;
  const f2 = face[rev[d]!]!;
  const st = ++mk.stamp;
  const vm = mk.vert;
  let x = d;
  do {
    vm[tail[x]!] = st;
    x = next[rev[x]!]!;
  } while (x !== d);
  x = rev[d]!;
  do {
    vm[tail[x]!] = st;
    x = next[rev[x]!]!;
  } while (x !== rev[d]);
  for (let g = 0; g < m.F; g++) {
    if (g === f1 || g === f2) continue;
    let c = 0;
    let adjacent = false;
    const g0 = ffirst[g]!;
    x = g0;
    do {
      if (vm[tail[x]!] === st) c++;
      const o = face[rev[x]!]!;
      if (o === f1 || o === f2) adjacent = true;
      x = next[rev[x]!]!;
    } while (x !== g0);
    if (c >= 3 || (c === 2 && !adjacent)) return false;
  }
  return true;
}

/** Contracting the edge of dart d keeps m simple and 3-connected (deletion in the dual). */
export function contractible(m: PlaneMap, d: number, mk: Marks): boolean {
  const { tail, head, next, rev, face, fsize, first, deg } = m;
  const f1 = face[d]!;
  const f2 = face[rev[d]!]!;
  if (fsize[f1]! < 4 || fsize[f2]! < 4) return false;
  const u = tail[d]!;
  const v = head[d]!;
  const st = ++mk.stamp;
  const fm = mk.face;
  let x = first[u]!;
  for (let k = deg[u]!; k > 0; k--) {
    fm[face[x]!] = st;
    x = next[x]!;
  }
  x = first[v]!;
  for (let k = deg[v]!; k > 0; k--) {
    fm[face[x]!] = st;
    x = next[x]!;
  }
  for (let w = 0; w < m.n; w++) {
    if (w === u || w === v) continue;
    let c = 0;
    let adjacent = false;
    x = first[w]!;
    for (let k = deg[w]!; k > 0; k--) {
      if (fm[face[x]!] === st) c++;
      const h = head[x]!;
      if (h === u || h === v) adjacent = true;
      x = next[x]!;
    }
    if (c >= 3 || (c === 2 && !adjacent)) return false;
  }
  return true;
}

/** Invariant of reducing edge d by `kind`; -1 where the cheap necessary condition fails. */
function invariant(m: PlaneMap, d: number, kind: number): number {
  return invariantOf(kind, m.deg[m.tail[d]!]!, m.deg[m.head[d]!]!, m.fsize[m.face[d]!]!, m.fsize[m.face[m.rev[d]!]!]!);
}

/** The invariant from the end degrees du, dv and the side face sizes a, b. */
function invariantOf(kind: number, du: number, dv: number, a: number, b: number): number {
  const dMin = du < dv ? du : dv;
  const dMax = du < dv ? dv : du;
  const fMin = a < b ? a : b;
  const fMax = a < b ? b : a;
  if (kind === DEL) return dMin < 4 ? -1 : 2 ** 24 + ((dMin * 64 + dMax) * 64 + fMin) * 64 + fMax;
  return fMin < 4 ? -1 : ((fMin * 64 + fMax) * 64 + dMin) * 64 + dMax;
}

export interface MapVisitOptions {
  /** only the subtrees of part index of count (see forEachPlaneMap) */
  shard?: { index: number; count: number };
  /** polled between subtrees; true ends the walk */
  shouldStop?: () => boolean;
  /** after each subtree of the shard level: done of total subtrees in this shard */
  onProgress?: (done: number, total: number) => void;
}

/** The level at which a walk for m edges is split into shards (enough subtrees to spread). */
export function shardLevel(m: number): number {
  return m <= 12 ? m : Math.max(12, m - 4);
}

/**
 * Calls visit(h) for every 3-connected plane map with m edges (6 <= m <= 40), once per
 * isomorphism class (mirror images identified); h is scratch, valid during the call only
 * (faces computed). With a shard, only the maps below the shard's subtrees at
 * shardLevel(m) edges (taken round-robin in walk order) are visited; the shards partition
 * the maps. Returns false when stopped early.
 */
export function forEachPlaneMap(mEdges: number, visit: (h: PlaneMap) => void, opts: MapVisitOptions = {}): boolean {
  const walker = new MapWalker(mEdges, visit, opts);
  return walker.run();
}

class MapWalker {
  private readonly pool: PlaneMap[] = [];
  private readonly canon = new MapCanonizer();
  private readonly marks = new Marks();
  private readonly level: number;
  private readonly index: number;
  private readonly count: number;
  private seenAtLevel = 0;
  private counting = false;
  private total = 0;
  private done = 0;
  private stopped = false;
  private readonly tieKinds: number[] = [];
  private readonly dels: number[][] = [];
  private readonly tieDarts: number[] = [];

  constructor(
    private readonly m: number,
    private readonly visit: (h: PlaneMap) => void,
    private readonly opts: MapVisitOptions,
  ) {
    this.level = shardLevel(m);
    this.index = opts.shard?.index ?? 0;
    this.count = opts.shard?.count ?? 1;
    for (let i = 0; i <= m + 1; i++) this.pool.push(new PlaneMap());
  }

  run(): boolean {
    if (this.opts.onProgress || this.count > 1) {
      // first pass: count this shard's subtrees (the walk down to the shard level is cheap)
      this.counting = true;
      this.walkRoots();
      this.total = Math.floor(this.seenAtLevel / this.count) + (this.seenAtLevel % this.count > this.index ? 1 : 0);
      this.counting = false;
      this.seenAtLevel = 0;
    }
    this.walkRoots();
    return !this.stopped;
  }

  private walkRoots(): void {
    for (let k = 3; 2 * k <= this.m && !this.stopped; k++) {
      const root = mapFromPlaneGraph(wheel(k), this.pool[2 * k]!);
      // a wheel at or above the shard level is a subtree of its own (counted once, in its shard)
      this.enter(root, 2 * k, 2 * k >= this.level);
    }
  }

  /** h has e edges and is accepted; `subtree`: h is where the walk is split into shards. */
  private enter(h: PlaneMap, e: number, subtree = e === this.level): void {
    if (subtree) {
      const mine = this.seenAtLevel++ % this.count === this.index;
      if (this.counting || !mine) return;
      if (this.opts.shouldStop?.()) {
        this.stopped = true;
        return;
      }
    }
    if (e === this.m) {
      this.visit(h);
    } else {
      this.expand(h, e);
    }
    if (subtree) {
      this.done++;
      this.opts.onProgress?.(this.done, this.total);
    }
  }

  private expand(g: PlaneMap, e: number): void {
    if (this.stopped) return;
    const child = this.pool[e + 1]!;
    // automorphisms of g, to try one operation per orbit
    this.canon.run(g, true);
    const perms = this.canon.automorphisms > 1 ? this.permutations(g) : null;
    const { tail, head, next, prev, rev, face, fsize, first, deg } = g;
    // g's deletable edges stay deletable in every child (adding an edge or splitting a vertex
    // that is not an end keeps g - e 3-connected), with the same invariant where neither end
    // nor side face is touched: a child in which one of them outranks the new edge is
    // rejected before it is built.
    // one list per depth: the walk recurses into each accepted child
    const dels = (this.dels[e] ??= []);
    dels.length = 0;
    for (let d = 0; d < g.D; d++) {
      if (rev[d]! < d) continue;
      const i = invariant(g, d, DEL);
      if (i >= 0 && deletable(g, d, this.marks)) dels.push(d, i);
    }
    // face splits: chords between non-consecutive corners of a face of size >= 4
    for (let f = 0; f < g.F; f++) {
      const k = fsize[f]!;
      if (k < 4) continue;
      const darts = faceDarts(g, f);
      for (let i = 0; i < k; i++) {
        for (let j = i + 2; j < k; j++) {
          if (i === 0 && j === k - 1) continue;
          const da = darts[i]!;
          const db = darts[j]!;
          const a = tail[da]!;
          const b = tail[db]!;
          const x0 = invariantOf(DEL, deg[a]! + 1, deg[b]! + 1, j - i + 1, k - j + i + 1);
          let outranked = false;
          for (let t = 0; t < dels.length; t += 2) {
            const d = dels[t]!;
            if (dels[t + 1]! <= x0) continue;
            const u = tail[d]!;
            const v = head[d]!;
            if (u === a || u === b || v === a || v === b || face[d] === f || face[rev[d]!] === f) continue;
            outranked = true;
            break;
          }
          if (outranked) continue;
          if (perms && !this.firstInOrbitChord(perms, a, b)) continue;
          faceSplitInto(g, da, db, child);
          if (this.accepts(child, g.D, DEL)) {
            this.enter(child, e + 1);
            if (this.stopped) return;
          }
        }
      }
    }
    // vertex splits: two non-adjacent corners of a vertex of degree >= 4; a child of a vertex
    // split is canonical only without deletable edges, so v must meet every deletable edge of g
    for (let v = 0; v < g.n; v++) {
      const dv = deg[v]!;
      if (dv < 4) continue;
      let away = false;
      for (let t = 0; t < dels.length; t += 2) {
        const d = dels[t]!;
        if (tail[d] !== v && head[d] !== v) {
          away = true;
          break;
        }
      }
      if (away) continue;
      const darts: number[] = [];
      let d = first[v]!;
      for (let i = 0; i < dv; i++) {
        darts.push(d);
        d = next[d]!;
      }
      for (let i = 0; i < dv; i++) {
        for (let j = i + 2; j < dv; j++) {
          if (i === 0 && j === dv - 1) continue;
          const d1 = darts[i]!;
          const d2 = darts[j]!;
          if (perms && !this.firstInOrbitSplit(perms, v, head[prev[d1]!]!, head[d1]!, head[prev[d2]!]!, head[d2]!)) continue;
          vertexSplitInto(g, d1, d2, child);
          if (this.accepts(child, g.D, CON)) {
            this.enter(child, e + 1);
            if (this.stopped) return;
          }
        }
      }
    }
  }

  /** The automorphisms of the map last canonised, as vertex permutations (identity included). */
  private permutations(g: PlaneMap): Int32Array[] {
    const n = g.n;
    const c = this.canon;
    const base = c.labels[0]!;
    const inv = new Int32Array(n);
    for (let v = 0; v < n; v++) inv[base[v]!] = v;
    const out: Int32Array[] = [];
    for (let i = 0; i < c.automorphisms; i++) {
      const l = c.labels[i]!;
      const s = new Int32Array(n);
      for (let v = 0; v < n; v++) s[v] = inv[l[v]!]!;
      out.push(s);
    }
    return out;
  }

  private firstInOrbitChord(perms: Int32Array[], a: number, b: number): boolean {
    const code = a < b ? a * 64 + b : b * 64 + a;
    for (const s of perms) {
      const x = s[a]!;
      const y = s[b]!;
      const c = x < y ? x * 64 + y : y * 64 + x;
      if (c < code) return false;
    }
    return true;
  }

  /** A vertex split of v at the corners (a1, b1) and (a2, b2) (neighbour pairs). */
  private firstInOrbitSplit(perms: Int32Array[], v: number, a1: number, b1: number, a2: number, b2: number): boolean {
    const enc = (v0: number, p: number, q: number, r: number, s: number) => {
      const c1 = p < q ? p * 64 + q : q * 64 + p;
      const c2 = r < s ? r * 64 + s : s * 64 + r;
      return v0 * 4096 * 4096 + (c1 < c2 ? c1 * 4096 + c2 : c2 * 4096 + c1);
    };
    const code = enc(v, a1, b1, a2, b2);
    for (const s of perms) {
      if (enc(s[v]!, s[a1]!, s[b1]!, s[a2]!, s[b2]!) < code) return false;
    }
    return true;
  }

  /**
   * Whether the edge just added to h (darts newDart, newDart + 1) by an operation whose inverse
   * is `kind` is the canonical reduction of h.
   */
  private accepts(h: PlaneMap, newDart: number, kind: number): boolean {
    const x0 = invariant(h, newDart, kind);
    const mk = this.marks;
    const { rev } = h;
    const tk = this.tieKinds;
    const td = this.tieDarts;
    tk.length = 0;
    td.length = 0;
    for (let d = 0; d < h.D; d++) {
      if (rev[d]! < d) continue;
      if (d === newDart) {
        // its own deletion outranks any contraction
        if (kind === CON && invariant(h, d, DEL) >= 0 && deletable(h, d, mk)) return false;
        continue;
      }
      const idel = invariant(h, d, DEL);
      if (idel >= x0 && deletable(h, d, mk)) {
        if (idel > x0) return false;
        tk.push(DEL);
        td.push(d);
      }
      const icon = invariant(h, d, CON);
      if (icon >= x0 && contractible(h, d, mk)) {
        if (icon > x0) return false;
        tk.push(CON);
        td.push(d);
      }
    }
    if (td.length === 0) return true;
    // ties: compare orbits by the smallest canonical numbers of the ends
    this.canon.run(h, true);
    const c = this.canon;
    const edgeLabel = (d: number): number => {
      let best = Infinity;
      const u = h.tail[d]!;
      const v = h.head[d]!;
      for (let i = 0; i < c.automorphisms; i++) {
        const l = c.labels[i]!;
        const a = l[u]!;
        const b = l[v]!;
        const e = a < b ? a * 64 + b : b * 64 + a;
        if (e < best) best = e;
      }
      return best;
    };
    const mine = edgeLabel(newDart);
    for (let i = 0; i < td.length; i++) if (edgeLabel(td[i]!) < mine) return false;
    return true;
  }
}

/** The darts of face f in traversal order. */
function faceDarts(g: PlaneMap, f: number): number[] {
  const out: number[] = [];
  const d0 = g.ffirst[f]!;
  let d = d0;
  do {
    out.push(d);
    d = g.next[g.rev[d]!]!;
  } while (d !== d0);
  return out;
}

