// The symmetries of a tiling and its canonical form: of all orientations with W >= H (4 for a
// rectangle, 8 for a square), the one whose table code (sizes in reading order) is
// lexicographically largest (squaring.net, "canonical Bouwkamp code is the highest code").

import type { Square, Tiling } from './types';
import { toBouwkamp } from './bouwkamp';

/** Sizes in Bouwkamp reading order: by top y, then left x. */
export function readingOrder(squares: readonly Square[]): Square[] {
  return squares.slice().sort((a, b) => a.y - b.y || a.x - b.x);
}

/** The 8 elements of the dihedral group acting on a W x H frame, as (flipX, flipY, transpose). */
function transform(t: Tiling, transpose: boolean, flipX: boolean, flipY: boolean): Tiling {
  const W = transpose ? t.H : t.W;
  const H = transpose ? t.W : t.H;
  const squares = t.squares.map((q) => {
    let x = transpose ? q.y : q.x;
    let y = transpose ? q.x : q.y;
    if (flipX) x = W - x - q.s;
    if (flipY) y = H - y - q.s;
    return { x, y, s: q.s };
  });
  return { W, H, squares: readingOrder(squares) };
}

const GROUP: [boolean, boolean, boolean][] = [
  [false, false, false],
  [false, true, false],
  [false, false, true],
  [false, true, true],
  [true, false, false],
  [true, true, false],
  [true, false, true],
  [true, true, true],
];

/**
 * The orientations of a tiling with squares in reading order. By default those with W >= H
 * (4 for a rectangle, 8 for a square); with { all: true } all 8 images under the symmetries of
 * the rectangle's frame (for a non-square rectangle, 4 of them have W < H). Identity first
 * when W >= H. Images may coincide for symmetric tilings; they are not deduplicated.
 */
export function orientations(t: Tiling, opts?: { all?: boolean }): Tiling[] {
  const out: Tiling[] = [];
  for (const [tr, fx, fy] of GROUP) {
    const o = transform(t, tr, fx, fy);
    if (opts?.all || o.W >= o.H) out.push(o);
  }
  return out;
}

function compareCodes(a: readonly Square[], b: readonly Square[]): number {
  const n = Math.min(a.length, b.length);
  for (let i = 0; i < n; i++) {
    const d = a[i]!.s - b[i]!.s;
    if (d !== 0) return d;
  }
  return a.length - b.length;
}

/** The lexicographically largest orientation with W >= H. */
export function canonicalTiling(t: Tiling): Tiling {
  let best: Tiling | null = null;
  for (const o of orientations(t)) if (best === null || compareCodes(o.squares, best.squares) > 0) best = o;
  return best!;
}

/** Canonical Bouwkamp code with header, e.g. "9 33 32 (18,15)(7,8)(14,4)(10,1)(9)". */
export function canonicalCode(t: Tiling): string {
  return toBouwkamp(canonicalTiling(t), { header: true });
}

/** Stock key, e.g. "33x32:18,15,7,8,14,4,10,1,9". */
export function canonicalKey(t: Tiling): string {
  const c = canonicalTiling(t);
  return `${c.W}x${c.H}:${c.squares.map((q) => q.s).join(',')}`;
}
