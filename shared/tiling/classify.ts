// Classification of a verified tiling. Compound = some proper sub-rectangle of two or more
// squares is an exact union of squares; decided geometrically, not from the network's
// 3-connectivity (engine.md sections 0 and 3): the rectangle spanned by the top-left corner of
// square i and the bottom-right corner of square j is a union of squares exactly when each of
// its four sides lies inside one maximal segment. The segments come from one skyline decode in
// tiling-core.ts (O(1) per pair). A tiling that does not tile its frame is refused.

import { core } from './tiling-core';
import { TilingInputError } from './errors';
import { verifyTiling } from './verify';
import type { Classification, Rect, Tiling } from './types';

export { MAX_LISTED_SUBRECTANGLES } from './tiling-core';

function gcdN(a: number, b: number): number {
  while (b !== 0) [a, b] = [b, a % b];
  return a;
}

/** Loads t into the core; throws TilingInputError when t does not tile its frame. */
export function loadVerified(t: Tiling): void {
  if (core.load(t)) return;
  const v = verifyTiling(t);
  throw new TilingInputError('invalid-tiling', v.ok ? 'the squares do not tile the rectangle' : v.message, v.ok || v.square === undefined ? undefined : { square: v.square + 1 });
}

/** True when no proper sub-rectangle of two or more squares is a union of squares. */
export function isSimple(t: Tiling): boolean {
  loadVerified(t);
  return core.isSimple();
}

/** The proper sub-rectangles of a tiling (two or more squares each), up to `limit`, in reading order of their corners. */
export function subRectangles(t: Tiling, limit = 1000): { rects: Rect[]; truncated: boolean } {
  loadVerified(t);
  const rects: Rect[] = [];
  let truncated = false;
  core.subRectangles((x, y, w, h) => {
    if (rects.length >= limit) {
      truncated = true;
      return false;
    }
    rects.push({ x, y, w, h });
    return true;
  });
  return { rects, truncated };
}

export function classifyTiling(t: Tiling): Classification {
  loadVerified(t);
  return core.classify();
}

/** The reduced ("prime") form: every size, position and side divided by the gcd of the sizes. */
export function reduceTiling(t: Tiling): Tiling {
  let g = 0;
  for (const q of t.squares) g = gcdN(g, q.s);
  if (g <= 1) return t;
  return { W: t.W / g, H: t.H / g, squares: t.squares.map((q) => ({ x: q.x / g, y: q.y / g, s: q.s / g })) };
}
