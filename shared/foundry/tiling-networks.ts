// The c-nets of a squared rectangle. Its horizontal Smith diagram plus the pole edge is its
// c-net (Brooks, Smith, Stone & Tutte, Duke Math. J. 7 (1940)), except where four squares meet
// at an inner point (a cross): there the horizontal segment through the point may be taken
// as one node or as two (its left and right halves), and both networks give the same tiling.
// A tiling with k crosses has up to 2^k c-nets; the foundry meets such a tiling once per
// 3-connected one, so a run (or a shard of it) reports it only from its owner: the c-net
// whose solved representative has the smallest canonical code.
import type { PlaneGraph, Tiling } from '../tiling/index';

interface Piece {
  y: number;
  lo: number;
  hi: number;
}

/** Inner cross points of a tiling as [x, y] (four squares meeting at a point not on the frame). */
export function crossPoints(t: Tiling): [number, number][] {
  const corners = new Map<number, number>();
  const W1 = t.W + 1;
  for (const q of t.squares) {
    for (const [x, y] of [[q.x, q.y], [q.x + q.s, q.y], [q.x, q.y + q.s], [q.x + q.s, q.y + q.s]] as const) {
      if (x === 0 || y === 0 || x === t.W || y === t.H) continue;
      const k = y * W1 + x;
      corners.set(k, (corners.get(k) ?? 0) + 1);
    }
  }
  const out: [number, number][] = [];
  for (const [k, c] of corners) if (c === 4) out.push([k % W1, Math.floor(k / W1)]);
  return out.sort((a, b) => a[1] - b[1] || a[0] - b[0]);
}

/**
 * The c-net of the tiling with the crosses in `split` cut into left and right halves (the
 * others one node each), as a rotation system in the sense smithDiagram uses, with its poles.
 */
export function cNetOf(t: Tiling, split: readonly (readonly [number, number])[]): { graph: PlaneGraph; p: number; q: number } {
  // horizontal intervals per line: square tops (the square below the line) and bottoms (above)
  const lines = new Map<number, { lo: number; hi: number }[]>();
  const add = (y: number, lo: number, hi: number) => {
    const l = lines.get(y);
    if (l) l.push({ lo, hi });
    else lines.set(y, [{ lo, hi }]);
  };
  for (const q of t.squares) {
    add(q.y, q.x, q.x + q.s);
    add(q.y + q.s, q.x, q.x + q.s);
  }
  const cuts = new Set(split.map(([x, y]) => `${x},${y}`));
  const pieces: Piece[] = [];
  const byLine = new Map<number, number[]>();
  for (const y of [...lines.keys()].sort((a, b) => a - b)) {
    const iv = lines.get(y)!.sort((a, b) => a.lo - b.lo);
    const ids: number[] = [];
    let cur: Piece | null = null;
    for (const { lo, hi } of iv) {
      if (cur && (lo < cur.hi || (lo === cur.hi && !cuts.has(`${lo},${y}`)))) {
        if (hi > cur.hi) cur.hi = hi;
        continue;
      }
      cur = { y, lo, hi };
      ids.push(pieces.length);
      pieces.push(cur);
    }
    byLine.set(y, ids);
  }
  const pieceAt = (y: number, x: number): number => {
    for (const id of byLine.get(y)!) {
      const p = pieces[id]!;
      if (p.lo <= x && x < p.hi) return id;
    }
    throw new Error(`cNetOf: no segment at (${x}, ${y})`);
  };
  const n = pieces.length;
  const above: { pos: number; v: number }[][] = Array.from({ length: n }, () => []);
  const below: { pos: number; v: number }[][] = Array.from({ length: n }, () => []);
  for (const q of t.squares) {
    const top = pieceAt(q.y, q.x);
    const bottom = pieceAt(q.y + q.s, q.x);
    above[bottom]!.push({ pos: q.x, v: top });
    below[top]!.push({ pos: q.x, v: bottom });
  }
  const p = pieceAt(0, 0);
  const q = pieceAt(t.H, 0);
  const adj: number[][] = [];
  for (let v = 0; v < n; v++) {
    const a = above[v]!.sort((x, y) => x.pos - y.pos).map((e) => e.v);
    const b = below[v]!.sort((x, y) => y.pos - x.pos).map((e) => e.v);
    if (v === p) adj.push([q, ...b]);
    else if (v === q) adj.push([...a, p]);
    else adj.push([...a, ...b]);
  }
  return { graph: { n, adj }, p, q };
}

/** True for a simple graph (no loops or parallel edges) that stays connected after removing any two vertices. */
export function isThreeConnected(g: PlaneGraph): boolean {
  const n = g.n;
  if (n < 4) return false;
  for (let v = 0; v < n; v++) {
    const a = g.adj[v]!;
    if (a.length < 3 || new Set(a).size !== a.length || a.includes(v)) return false;
  }
  const seen = new Int32Array(n);
  let stamp = 0;
  const stack: number[] = [];
  for (let x = 0; x < n; x++) {
    for (let y = x + 1; y < n; y++) {
      stamp++;
      seen[x] = stamp;
      seen[y] = stamp;
      const s = x === 0 ? (y === 1 ? 2 : 1) : 0;
      seen[s] = stamp;
      stack.length = 0;
      stack.push(s);
      let reached = 1;
      while (stack.length > 0) {
        const v = stack.pop()!;
        for (const w of g.adj[v]!) {
          if (seen[w] !== stamp) {
            seen[w] = stamp;
            reached++;
            stack.push(w);
          }
        }
      }
      if (reached !== n - 2) return false;
    }
  }
  return true;
}

/** Every 3-connected c-net of the tiling (at most 2^12 tried; more crosses than that throw). */
export function cNetsOf(t: Tiling): PlaneGraph[] {
  const cross = crossPoints(t);
  if (cross.length > 12) throw new RangeError(`cNetsOf: ${cross.length} crosses; at most 12 are handled`);
  const out: PlaneGraph[] = [];
  for (let mask = 0; mask < 1 << cross.length; mask++) {
    const { graph } = cNetOf(t, cross.filter((_, i) => (mask >> i) & 1));
    if (isThreeConnected(graph)) out.push(graph);
  }
  return out;
}
