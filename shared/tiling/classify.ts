// Classification of a verified tiling. Compound = some proper sub-rectangle of two or more
// squares is an exact union of squares; decided geometrically, not from the network's
// 3-connectivity (engine.md sections 0 and 3). A candidate has the top-left corner of square i
// and the bottom-right corner of square j; it is a union of squares exactly when no square
// crosses its boundary, i.e. each of its four sides lies inside one maximal segment. With the
// segments precomputed, each candidate costs O(1), so the whole test is O(n^2).

import { maximalSegments } from './segments';
import type { Classification, Rect, Tiling } from './types';

export const MAX_LISTED_SUBRECTANGLES = 1000;

function gcdN(a: number, b: number): number {
  while (b !== 0) [a, b] = [b, a % b];
  return a;
}

/** Visits proper sub-rectangles of >= 2 squares; stop early when visit returns false. */
function forEachSubRectangle(t: Tiling, visit: (r: Rect) => boolean): void {
  const sq = t.squares;
  const n = sq.length;
  if (n < 2) return;
  const h = maximalSegments(t, false);
  const v = maximalSegments(t, true);
  for (let i = 0; i < n; i++) {
    const a = sq[i]!;
    const x1 = a.x;
    const y1 = a.y;
    const topEnd = h.end[h.before[i]!]!; // the top side must run inside the segment through a's top
    const leftEnd = v.end[v.before[i]!]!; // the left side inside the segment through a's left side
    for (let j = 0; j < n; j++) {
      if (j === i) continue;
      const b = sq[j]!;
      const x2 = b.x + b.s;
      const y2 = b.y + b.s;
      if (x2 <= x1 || y2 <= y1 || x2 > topEnd || y2 > leftEnd) continue;
      if (x1 === 0 && y1 === 0 && x2 === t.W && y2 === t.H) continue;
      if (h.start[h.after[j]!]! > x1 || v.start[v.after[j]!]! > y1) continue;
      if (!visit({ x: x1, y: y1, w: x2 - x1, h: y2 - y1 })) return;
    }
  }
}

/** True when no proper sub-rectangle of two or more squares is a union of squares. */
export function isSimple(t: Tiling): boolean {
  let simple = true;
  forEachSubRectangle(t, () => {
    simple = false;
    return false;
  });
  return simple;
}

/** The proper sub-rectangles of a tiling (two or more squares each), up to `limit`. */
export function subRectangles(t: Tiling, limit = MAX_LISTED_SUBRECTANGLES): { rects: Rect[]; truncated: boolean } {
  const rects: Rect[] = [];
  let truncated = false;
  forEachSubRectangle(t, (r) => {
    if (rects.length >= limit) {
      truncated = true;
      return false;
    }
    rects.push(r);
    return true;
  });
  return { rects, truncated };
}

export function classifyTiling(t: Tiling): Classification {
  const sq = t.squares;
  let g = 0;
  let minSize = Infinity;
  let maxSize = 0;
  const seen = new Set<number>();
  let perfect = true;
  let trivialCompound = false;
  for (const q of sq) {
    g = gcdN(g, q.s);
    if (q.s < minSize) minSize = q.s;
    if (q.s > maxSize) maxSize = q.s;
    if (seen.has(q.s)) perfect = false;
    seen.add(q.s);
    if (sq.length > 1 && (q.s === t.W || q.s === t.H)) trivialCompound = true;
  }
  const { rects, truncated } = subRectangles(t);
  return {
    order: sq.length,
    width: t.W,
    height: t.H,
    square: t.W === t.H,
    perfect,
    simple: rects.length === 0,
    trivialCompound,
    subRectangles: rects,
    subRectanglesTruncated: truncated,
    gcd: g,
    minSize: sq.length > 0 ? minSize : 0,
    maxSize,
  };
}

/** The reduced ("prime") form: every size, position and side divided by the gcd of the sizes. */
export function reduceTiling(t: Tiling): Tiling {
  let g = 0;
  for (const q of t.squares) g = gcdN(g, q.s);
  if (g <= 1) return t;
  return { W: t.W / g, H: t.H / g, squares: t.squares.map((q) => ({ x: q.x / g, y: q.y / g, s: q.s / g })) };
}
