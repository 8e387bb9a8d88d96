// Canonical code of a 3-connected plane graph (Weinberg-type; Weinberg, IEEE Trans. Circuit
// Theory 13 (1966) for the principle, our breadth-first variant): for every start dart (u -> v)
// and both senses of rotation, number the vertices in breadth-first order, listing each
// vertex's rotation from the dart it was reached by; the code is, per vertex in that order,
// its degree followed by its neighbours' numbers. The canonical code is the lexicographic
// minimum over the starts whose (deg u, deg v) is largest (an isomorphism invariant), with an
// early abort as soon as a prefix exceeds the best. A 3-connected planar graph has a unique
// embedding up to mirror image (Whitney), so this is a canonical code of the graph itself.
// The starts that attain the minimum are exactly the automorphisms (reflections included).
import { dartArrays, edgesOf, type PlaneGraph } from '../tiling/index';

export interface CanonicalForm {
  /** [deg_0, nbrs_0..., deg_1, nbrs_1..., ...] in canonical numbering. */
  code: Uint8Array;
  /** Number of automorphisms of the map, reflections included. */
  automorphisms: number;
  /** Each automorphism as a vertex permutation sigma[v] (of the input numbering). */
  maps: Int32Array[];
  /** Canonical number of each input vertex (for the first minimal start). */
  labels: Int32Array;
}

// Scratch buffers reused between calls (the engine is single-threaded per worker).
let bufSize = 0;
let label = new Int32Array(0);
let queue = new Int32Array(0);
let entry = new Int32Array(0);
let cur = new Uint8Array(0);
let best = new Uint8Array(0);
function ensure(n: number, len: number): void {
  if (n > bufSize || len > best.length) {
    bufSize = Math.max(n, bufSize) * 2;
    label = new Int32Array(bufSize);
    queue = new Int32Array(bufSize);
    entry = new Int32Array(bufSize);
    const L = Math.max(len, best.length) * 2;
    cur = new Uint8Array(L);
    best = new Uint8Array(L);
  }
}

/** Canonical form; set `withMaps` to collect the automorphisms as permutations. */
export function canonicalForm(g: PlaneGraph, withMaps = false): CanonicalForm {
  const n = g.n;
  const { first: off, head, rev, tail } = dartArrays(g);
  const D = head.length;
  const len = n + D;
  if (n > 255) throw new RangeError(`canonicalForm: at most 255 vertices, got ${n}`);
  ensure(n, len);
  const deg = new Int32Array(n);
  for (let v = 0; v < n; v++) deg[v] = off[v + 1]! - off[v]!;
  // Starts: darts maximising (deg tail, deg head).
  let bestKey = -1;
  for (let x = 0; x < D; x++) {
    const k = deg[tail[x]!]! * 256 + deg[head[x]!]!;
    if (k > bestKey) bestKey = k;
  }
  let haveBest = false;
  let count = 0;
  const maps: Int32Array[] = [];
  let labels = new Int32Array(n);
  for (let s0 = 0; s0 < D; s0++) {
    if (deg[tail[s0]!]! * 256 + deg[head[s0]!]! !== bestKey) continue;
    for (let sense = 1; sense >= -1; sense -= 2) {
      // cmp: 0 = equal so far, -1 = already smaller
      let cmp = haveBest ? 0 : -1;
      label.fill(-1, 0, n);
      const u0 = tail[s0]!;
      label[u0] = 0;
      queue[0] = u0;
      entry[u0] = s0;
      let nLab = 1;
      let pos = 0;
      let aborted = false;
      for (let qi = 0; qi < n && !aborted; qi++) {
        const x = queue[qi]!;
        const dx = deg[x]!;
        const ox = off[x]!;
        // emit degree
        if (cmp === 0) {
          const b = best[pos]!;
          if (dx > b) { aborted = true; break; }
          if (dx < b) cmp = -1;
        }
        cur[pos++] = dx;
        let dart = entry[x]!;
        for (let k = 0; k < dx; k++) {
          const w = head[dart]!;
          let lw = label[w]!;
          if (lw < 0) {
            lw = nLab++;
            label[w] = lw;
            queue[lw] = w;
            entry[w] = rev[dart]!;
          }
          if (cmp === 0) {
            const b = best[pos]!;
            if (lw > b) { aborted = true; break; }
            if (lw < b) cmp = -1;
          }
          cur[pos++] = lw;
          // next dart around x in this sense
          let i = dart - ox + sense;
          if (i === dx) i = 0;
          else if (i < 0) i = dx - 1;
          dart = ox + i;
        }
      }
      if (aborted) continue;
      if (cmp < 0) {
        best.set(cur.subarray(0, len));
        haveBest = true;
        count = 1;
        labels = label.slice(0, n);
        if (withMaps) maps.length = 0;
        if (withMaps) maps.push(labels);
      } else {
        count++;
        if (withMaps) maps.push(label.slice(0, n));
      }
    }
  }
  // maps[i] sends input vertex v to its number under start i; the automorphism is
  // sigma = labels^-1 o maps[i].
  const inv = new Int32Array(n);
  for (let v = 0; v < n; v++) inv[labels[v]!] = v;
  const autos = withMaps ? maps.map((m) => {
    const sigma = new Int32Array(n);
    for (let v = 0; v < n; v++) sigma[v] = inv[m[v]!]!;
    return sigma;
  }) : [];
  return { code: best.slice(0, len), automorphisms: count, maps: autos, labels };
}

/** The graph in canonical numbering, decoded from its code (vertex 0 dart 0 is the canonical start). */
export function graphFromCode(code: ArrayLike<number>): PlaneGraph {
  const adj: number[][] = [];
  let p = 0;
  while (p < code.length) {
    const dg = code[p++]!;
    const row: number[] = [];
    for (let k = 0; k < dg; k++) row.push(code[p++]!);
    adj.push(row);
  }
  return { n: adj.length, adj };
}

export function codeKey(code: Uint8Array): string {
  let s = '';
  for (let i = 0; i < code.length; i++) s += String.fromCharCode(code[i]!);
  return s;
}

export function keyCode(key: string): Uint8Array {
  const c = new Uint8Array(key.length);
  for (let i = 0; i < key.length; i++) c[i] = key.charCodeAt(i);
  return c;
}

/** Canonical key string of a plane graph (equal iff isomorphic as maps up to mirror). */
export function canonicalGraphKey(g: PlaneGraph): string {
  return codeKey(canonicalForm(g).code);
}

/**
 * Edge orbits under the automorphism group: one representative [u, v] (u < v) per orbit,
 * with the orbit size. Pole choices up to symmetry.
 */
export function edgeOrbits(g: PlaneGraph): { edge: [number, number]; size: number }[] {
  const cf = canonicalForm(g, true);
  const n = g.n;
  const edges = edgesOf(g);
  const id = new Map<number, number>();
  edges.forEach(([u, v], e) => id.set(u * n + v, e));
  const parent = edges.map((_, i) => i);
  const find = (x: number): number => {
    while (parent[x] !== x) { parent[x] = parent[parent[x]!]!; x = parent[x]!; }
    return x;
  };
  for (const s of cf.maps) {
    for (let e = 0; e < edges.length; e++) {
      const [u, v] = edges[e]!;
      const a = s[u]!, b = s[v]!;
      const f = id.get(Math.min(a, b) * n + Math.max(a, b));
      if (f === undefined) throw new Error('edgeOrbits: a map is not an automorphism');
      const ra = find(e), rb = find(f);
      if (ra !== rb) parent[ra] = rb;
    }
  }
  const size = new Map<number, number>();
  for (let e = 0; e < edges.length; e++) size.set(find(e), (size.get(find(e)) ?? 0) + 1);
  const out: { edge: [number, number]; size: number }[] = [];
  for (let e = 0; e < edges.length; e++) if (find(e) === e) out.push({ edge: edges[e]!, size: size.get(e)! });
  return out;
}
