// Exact verification of a tiling: every square inside the frame, pairwise disjoint, and the
// areas add up. Inside + disjoint + total area W*H is sufficient for an exact cover
// (common practice; engine.md section 3).

import type { Tiling, VerifyResult } from './types';
import { sortKeys } from './sort-keys';

export const MAX_SIDE = 2 ** 31;
export const MAX_SQUARES = 2000;

const fail = (message: string, square?: number): VerifyResult =>
  square === undefined ? { ok: false, message } : { ok: false, message, square };

export function verifyTiling(t: Tiling): VerifyResult {
  if (t === null || typeof t !== 'object' || !Array.isArray(t.squares)) return fail('a tiling must be an object { W, H, squares: [] }');
  const { W, H, squares } = t;
  if (!Number.isInteger(W) || W <= 0 || W > MAX_SIDE) return fail(`width ${String(W)} must be an integer from 1 to 2^31`);
  if (!Number.isInteger(H) || H <= 0 || H > MAX_SIDE) return fail(`height ${String(H)} must be an integer from 1 to 2^31`);
  const n = squares.length;
  if (n === 0) return fail('a tiling needs at least one square');
  if (n > MAX_SQUARES) return fail(`${n} squares; at most ${MAX_SQUARES} are accepted`);
  let area = 0;
  let big = false;
  for (let i = 0; i < n; i++) {
    const q = squares[i];
    if (q === null || typeof q !== 'object') return fail(`square ${i + 1} is not an object { x, y, s }`, i);
    const { x, y, s } = q;
    if (!Number.isInteger(x) || !Number.isInteger(y) || !Number.isInteger(s)) return fail(`square ${i + 1} has a non-integer position or size (${String(x)}, ${String(y)}, ${String(s)})`, i);
    if (s <= 0) return fail(`square ${i + 1} has size ${s}; sizes must be positive`, i);
    if (x < 0 || y < 0 || x + s > W || y + s > H) return fail(`square ${i + 1} (size ${s} at x=${x}, y=${y}) lies outside the ${W} x ${H} frame`, i);
    if (s > 67_108_864) big = true;
    area += s * s;
  }
  if (big || W * H > Number.MAX_SAFE_INTEGER) {
    let a = 0n;
    for (const q of squares) a += BigInt(q.s) * BigInt(q.s);
    if (a !== BigInt(W) * BigInt(H)) return fail(`the squares cover an area of ${a}, the frame ${W} x ${H} = ${BigInt(W) * BigInt(H)}`);
  } else if (area !== W * H) {
    return fail(`the squares cover an area of ${area}, the frame ${W} x ${H} = ${W * H}`);
  }
  // disjointness: sweep over x
  // indices sorted by x: packed keys x * n + i (below 2^53 since x <= 2^31, n <= 2000)
  const keys = new Float64Array(n);
  for (let i = 0; i < n; i++) keys[i] = squares[i]!.x * n + i;
  sortKeys(keys);
  const order = new Int32Array(n);
  for (let i = 0; i < n; i++) order[i] = keys[i]! % n;
  for (let a = 0; a < n; a++) {
    const i = order[a]!;
    const p = squares[i]!;
    const right = p.x + p.s;
    for (let b = a + 1; b < n; b++) {
      const j = order[b]!;
      const q = squares[j]!;
      if (q.x >= right) break;
      if (q.y < p.y + p.s && p.y < q.y + q.s) {
        const [u, v] = i < j ? [i, j] : [j, i];
        const su = squares[u]!;
        const sv = squares[v]!;
        return fail(`square ${u + 1} (size ${su.s} at x=${su.x}, y=${su.y}) overlaps square ${v + 1} (size ${sv.s} at x=${sv.x}, y=${sv.y})`, v);
      }
    }
  }
  return { ok: true };
}
