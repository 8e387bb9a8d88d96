// Maximal segments of a tiling. A maximal horizontal segment is a connected union of square
// tops and bottoms on one line; intervals that merely touch (four squares meeting at a point,
// a "cross") belong to one segment (engine.md section 4).

import type { Tiling } from './types';
import { sortKeys } from './sort-keys';

export interface Segments {
  /** per segment: line coordinate (y for horizontal) and extent [start, end] along it */
  at: number[];
  start: number[];
  end: number[];
  /** per square: the segment containing its top (horizontal) / left (vertical) side */
  before: Int32Array;
  /** per square: the segment containing its bottom (horizontal) / right (vertical) side */
  after: Int32Array;
}

/** Horizontal segments (or vertical ones) of a tiling whose coordinates and sizes are integers. */
export function maximalSegments(t: Tiling, vertical = false): Segments {
  const sq = t.squares;
  const n = sq.length;
  // entry e: square e>>1, side e&1 (0 = top/left, 1 = bottom/right)
  const m = 2 * n;
  const line = new Float64Array(m);
  const lo = new Float64Array(m);
  for (let i = 0; i < n; i++) {
    const q = sq[i]!;
    const a = vertical ? q.x : q.y;
    const c = vertical ? q.y : q.x;
    line[2 * i] = a;
    line[2 * i + 1] = a + q.s;
    lo[2 * i] = c;
    lo[2 * i + 1] = c;
  }
  // sort entries by (line, lo): one packed numeric key per entry when it fits below 2^53
  // (a native numeric sort of a Float64Array is far faster than a comparator sort)
  const order = new Int32Array(m);
  let minLine = 0;
  let minLo = 0;
  let maxLine = 0;
  let maxLo = 0;
  for (let e = 0; e < m; e++) {
    if (line[e]! > maxLine) maxLine = line[e]!;
    if (lo[e]! > maxLo) maxLo = lo[e]!;
    if (line[e]! < minLine) minLine = line[e]!;
    if (lo[e]! < minLo) minLo = lo[e]!;
  }
  if ((maxLine - minLine + 1) * (maxLo - minLo + 1) * m < 2 ** 52) {
    const keys = new Float64Array(m);
    const span = maxLo - minLo + 1;
    for (let e = 0; e < m; e++) keys[e] = ((line[e]! - minLine) * span + lo[e]! - minLo) * m + e;
    sortKeys(keys);
    for (let r = 0; r < m; r++) order[r] = keys[r]! % m;
  } else {
    for (let e = 0; e < m; e++) order[e] = e;
    order.sort((a, b) => line[a]! - line[b]! || lo[a]! - lo[b]!);
  }
  const at: number[] = [];
  const start: number[] = [];
  const end: number[] = [];
  const before = new Int32Array(n);
  const after = new Int32Array(n);
  let cur = -1;
  for (let r = 0; r < m; r++) {
    const e = order[r]!;
    const i = e >> 1;
    const s = sq[i]!.s;
    const L = line[e]!;
    const a = lo[e]!;
    if (cur < 0 || at[cur] !== L || a > end[cur]!) {
      cur = at.length;
      at.push(L);
      start.push(a);
      end.push(a + s);
    } else if (a + s > end[cur]!) {
      end[cur] = a + s;
    }
    if (e & 1) after[i] = cur;
    else before[i] = cur;
  }
  return { at, start, end, before, after };
}
