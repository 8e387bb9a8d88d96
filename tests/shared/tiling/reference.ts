// The straightforward implementations the engine's fast paths (tiling-core.ts, read-fast.ts)
// are checked against: a sub-rectangle test by maximal segments computed by sorting
// (segments.ts; the engine's previous classification), a brute-force union-of-squares test,
// and the canonical orientation as the largest table code of all orientations with W >= H.
import { maximalSegments } from '../../../shared/tiling/segments';
import { orientations, toBouwkamp, type Classification, type Rect, type Tiling } from '../../../shared/tiling/index';

function gcd(a: number, b: number): number {
  while (b !== 0) [a, b] = [b, a % b];
  return a;
}

/** Proper sub-rectangles of >= 2 squares, by maximal segments (i in the given order, j over all squares). */
export function referenceSubRectangles(t: Tiling): Rect[] {
  const sq = t.squares;
  const n = sq.length;
  const out: Rect[] = [];
  if (n < 2) return out;
  const h = maximalSegments(t, false);
  const v = maximalSegments(t, true);
  for (let i = 0; i < n; i++) {
    const a = sq[i]!;
    const topEnd = h.end[h.before[i]!]!;
    const leftEnd = v.end[v.before[i]!]!;
    for (let j = 0; j < n; j++) {
      if (j === i) continue;
      const b = sq[j]!;
      const x2 = b.x + b.s;
      const y2 = b.y + b.s;
      if (x2 <= a.x || y2 <= a.y || x2 > topEnd || y2 > leftEnd) continue;
      if (a.x === 0 && a.y === 0 && x2 === t.W && y2 === t.H) continue;
      if (h.start[h.after[j]!]! > a.x || v.start[v.after[j]!]! > a.y) continue;
      out.push({ x: a.x, y: a.y, w: x2 - a.x, h: y2 - a.y });
    }
  }
  return out;
}

/** Brute force: every rectangle spanned by two square corners whose squares exactly fill it (O(n^3)). */
export function bruteForceSubRectangles(t: Tiling): Rect[] {
  const out: Rect[] = [];
  const sq = t.squares;
  for (const a of sq) {
    for (const b of sq) {
      const x1 = a.x;
      const y1 = a.y;
      const x2 = b.x + b.s;
      const y2 = b.y + b.s;
      if (x2 <= x1 || y2 <= y1 || (x1 === 0 && y1 === 0 && x2 === t.W && y2 === t.H)) continue;
      let area = 0;
      let inside = 0;
      let cut = false;
      for (const q of sq) {
        const ix = Math.min(q.x + q.s, x2) - Math.max(q.x, x1);
        const iy = Math.min(q.y + q.s, y2) - Math.max(q.y, y1);
        if (ix <= 0 || iy <= 0) continue;
        if (ix !== q.s || iy !== q.s) cut = true;
        area += ix * iy;
        inside++;
      }
      if (!cut && inside >= 2 && area === (x2 - x1) * (y2 - y1)) out.push({ x: x1, y: y1, w: x2 - x1, h: y2 - y1 });
    }
  }
  return out;
}

export function referenceClassification(t: Tiling): Omit<Classification, 'subRectangles' | 'subRectanglesTruncated'> & { subRectangles: Rect[] } {
  const sq = t.squares;
  const sizes = sq.map((q) => q.s);
  const rects = referenceSubRectangles(t);
  return {
    order: sq.length,
    width: t.W,
    height: t.H,
    square: t.W === t.H,
    perfect: new Set(sizes).size === sizes.length,
    simple: rects.length === 0,
    trivialCompound: sq.length > 1 && sq.some((q) => q.s === t.W || q.s === t.H),
    subRectangles: rects,
    gcd: sizes.reduce((g, s) => gcd(s, g), 0),
    minSize: Math.min(...sizes),
    maxSize: Math.max(...sizes),
  };
}

/** The orientation with W >= H whose sizes in reading order are lexicographically largest. */
export function referenceCanonical(t: Tiling): { tiling: Tiling; code: string; key: string } {
  let best: Tiling | null = null;
  for (const o of orientations(t)) {
    if (best === null) {
      best = o;
      continue;
    }
    for (let i = 0; i < o.squares.length; i++) {
      const d = o.squares[i]!.s - best.squares[i]!.s;
      if (d > 0) best = o;
      if (d !== 0) break;
    }
  }
  const c = best!;
  return { tiling: c, code: toBouwkamp(c, { header: true }), key: `${c.W}x${c.H}:${c.squares.map((q) => q.s).join(',')}` };
}
