// The symmetries of a tiling and its canonical form: of all orientations with W >= H (4 for a
// rectangle, 8 for a square), the one whose table code (sizes in reading order) is
// lexicographically largest (squaring.net, "canonical Bouwkamp code is the highest code").

import type { Square, Tiling } from './types';
import { sortKeys } from './sort-keys';
import { core } from './tiling-core';
import { loadVerified } from './classify';

/** Indices of squares in Bouwkamp reading order (top y, then left x), for corners (xs[i], ys[i]). */
function readingIndices(xs: ArrayLike<number>, ys: ArrayLike<number>, W: number, H: number): Int32Array {
  const n = xs.length;
  const order = new Int32Array(n);
  // packed key (y * (W + 1) + x) * n + i when it fits below 2^53 (native numeric sort)
  if ((H + 1) * (W + 1) * n < 2 ** 52) {
    const keys = new Float64Array(n);
    for (let i = 0; i < n; i++) keys[i] = (ys[i]! * (W + 1) + xs[i]!) * n + i;
    sortKeys(keys);
    for (let i = 0; i < n; i++) order[i] = keys[i]! % n;
  } else {
    for (let i = 0; i < n; i++) order[i] = i;
    order.sort((a, b) => ys[a]! - ys[b]! || xs[a]! - xs[b]!);
  }
  return order;
}

/** Squares in Bouwkamp reading order: by top y, then left x. */
export function readingOrder(squares: readonly Square[]): Square[] {
  let W = 0;
  let H = 0;
  const xs = new Float64Array(squares.length);
  const ys = new Float64Array(squares.length);
  squares.forEach((q, i) => {
    xs[i] = q.x;
    ys[i] = q.y;
    if (q.x + q.s > W) W = q.x + q.s;
    if (q.y + q.s > H) H = q.y + q.s;
  });
  return Array.from(readingIndices(xs, ys, W, H), (i) => squares[i]!);
}

/** The 8 elements of the dihedral group acting on the frame, as (transpose, flipX, flipY). */
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

function coordinates(t: Tiling, transpose: boolean, flipX: boolean, flipY: boolean) {
  const W = transpose ? t.H : t.W;
  const H = transpose ? t.W : t.H;
  const n = t.squares.length;
  const xs = new Float64Array(n);
  const ys = new Float64Array(n);
  let corner = -1;
  for (let i = 0; i < n; i++) {
    const q = t.squares[i]!;
    let x = transpose ? q.y : q.x;
    let y = transpose ? q.x : q.y;
    if (flipX) x = W - x - q.s;
    if (flipY) y = H - y - q.s;
    xs[i] = x;
    ys[i] = y;
    if (x === 0 && y === 0) corner = i;
  }
  return { W, H, xs, ys, corner };
}

function transformed(t: Tiling, transpose: boolean, flipX: boolean, flipY: boolean) {
  const c = coordinates(t, transpose, flipX, flipY);
  return { ...c, order: readingIndices(c.xs, c.ys, c.W, c.H) };
}

function build(t: Tiling, o: ReturnType<typeof transformed>): Tiling {
  return { W: o.W, H: o.H, squares: Array.from(o.order, (i) => ({ x: o.xs[i]!, y: o.ys[i]!, s: t.squares[i]!.s })) };
}

/**
 * The orientations of a tiling with squares in reading order. By default those with W >= H
 * (4 for a rectangle, 8 for a square); with { all: true } all 8 images under the symmetries of
 * the rectangle's frame (for a non-square rectangle, 4 of them have W < H). Identity first
 * when W >= H. Images may coincide for symmetric tilings; they are not deduplicated.
 */
export function orientations(t: Tiling, opts?: { all?: boolean }): Tiling[] {
  const out: Tiling[] = [];
  for (const [tr, fx, fy] of GROUP) {
    const W = tr ? t.H : t.W;
    const H = tr ? t.W : t.H;
    if (opts?.all || W >= H) out.push(build(t, transformed(t, tr, fx, fy)));
  }
  return out;
}

/** The lexicographically largest orientation with W >= H (tiling-core.ts; one decode). */
export function canonicalTiling(t: Tiling): Tiling {
  return canonicalForm(t).tiling;
}

/** The canonical orientation with its code and stock key, from one canonicalisation. */
export interface CanonicalTilingForm {
  /** the canonical orientation (W >= H, squares in reading order) */
  tiling: Tiling;
  /** canonical Bouwkamp code with header, e.g. "9 33 32 (18,15)(7,8)(14,4)(10,1)(9)" */
  code: string;
  /** stock key, e.g. "33x32:18,15,7,8,14,4,10,1,9" */
  key: string;
}

/** The canonical orientation, code and key at the cost of one canonicalisation. */
export function canonicalForm(t: Tiling): CanonicalTilingForm {
  loadVerified(t);
  const c = core.canonical(true);
  return { tiling: c.tiling!, code: c.code, key: c.key };
}

/** Canonical Bouwkamp code with header, e.g. "9 33 32 (18,15)(7,8)(14,4)(10,1)(9)". */
export function canonicalCode(t: Tiling): string {
  loadVerified(t);
  return core.canonical(false).code;
}

/** Stock key, e.g. "33x32:18,15,7,8,14,4,10,1,9". */
export function canonicalKey(t: Tiling): string {
  loadVerified(t);
  return core.canonical(false).key;
}
