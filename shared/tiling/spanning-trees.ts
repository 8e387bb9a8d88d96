// Counting spanning trees exactly by the matrix-tree theorem (Kirchhoff 1847): tau(G) is any
// cofactor of the Laplacian. When the product of the degrees (a proven bound on tau: each
// spanning tree picks at most one edge per vertex but the root) is below two primes just
// under 2^26, the determinant is taken modulo those primes in Numbers (every product below
// 2^52) and put together by the Chinese remainder theorem; otherwise Bareiss' fraction-free
// elimination in BigInt, or the sparse modular determinant for large graphs.

import { bareissDeterminant } from './bareiss';
import { sparseSymmetricDeterminant } from './modular-determinant';
import { invmod, prime } from './sparse-elimination';

/** Above this many rows the sparse modular determinant replaces dense Bareiss. */
export const DENSE_LIMIT = 60;
import { maximalSegments } from './segments';
import { core } from './tiling-core';
import type { Tiling } from './types';

/** det of the k x k integer matrix m (row-major) modulo the prime p < 2^26, by elimination with row swaps. */
function detMod(m: Float64Array, k: number, p: number, inPlace: boolean): number {
  // entries are Laplacian entries, |x| < p: one conditional add brings them into [0, p)
  const a = inPlace ? m : new Float64Array(k * k);
  for (let i = 0; i < k * k; i++) {
    const x = m[i]!;
    a[i] = x < 0 ? x + p : x;
  }
  // products below 2^52 are exact in doubles; x mod p as x - floor(x / p) * p with 1 / p
  // precomputed (the quotient is off by at most one, mended by one add or subtract): a
  // floating-point remainder (%) costs several times more
  const pinv = 1 / p;
  let det = 1;
  for (let c = 0; c < k; c++) {
    let r = c;
    while (r < k && a[r * k + c] === 0) r++;
    if (r === k) return 0;
    if (r !== c) {
      for (let j = c; j < k; j++) {
        const t = a[r * k + j]!;
        a[r * k + j] = a[c * k + j]!;
        a[c * k + j] = t;
      }
      det = p - det;
    }
    const pv = a[c * k + c]!;
    det = reduce(det * pv, p, pinv);
    const inv = invmod(pv, p);
    for (let i = c + 1; i < k; i++) {
      const f = reduce(a[i * k + c]! * inv, p, pinv);
      if (f === 0) continue;
      const g = p - f; // a_ij - f a_cj = a_ij + (p - f) a_cj (mod p), all terms >= 0
      for (let j = c + 1; j < k; j++) a[i * k + j] = reduce(a[i * k + j]! + g * a[c * k + j]!, p, pinv);
    }
  }
  return det;
}

/** x mod p for 0 <= x < 2^52 (exact: see detMod). */
function reduce(x: number, p: number, pinv: number): number {
  const r = x - Math.floor(x * pinv) * p;
  return r < 0 ? r + p : r >= p ? r - p : r;
}

/** tau by two primes when the degree product proves it below their product, else null. m is the reduced Laplacian (k x k), deg the degrees of rows 0..k-1. */
function smallTauOf(m: Float64Array, k: number, deg: Float64Array): bigint | null {
  let bound = 1;
  for (let v = 0; v < k; v++) bound *= deg[v]!;
  const p1 = prime(0);
  const p2 = prime(1);
  if (bound < p1) return BigInt(detMod(m, k, p1, true));
  if (bound >= p1 * p2) return null;
  // Garner: x = r1 + p1 * ((r2 - r1) / p1 mod p2), below p1 * p2 < 2^52
  const r1 = detMod(m, k, p1, false);
  const r2 = detMod(m, k, p2, true);
  const t = ((((r2 - r1) % p2) + p2) % p2) * invmod(p1 % p2, p2) % p2;
  return BigInt(r1 + p1 * t);
}

/** tau by two primes when the degree product proves it below their product, else null. */
function smallTau(n: number, edges: readonly (readonly [number, number])[]): bigint | null {
  const k = n - 1;
  const m = new Float64Array(k * k);
  const deg = new Float64Array(n);
  for (const [u, v] of edges) if (u !== v) addEdge(m, deg, k, u, v);
  return smallTauOf(m, k, deg);
}

/** Add edge u-v to the Laplacian whose first k rows and columns are m (k x k, row-major), and to the degrees. */
function addEdge(m: Float64Array, deg: Float64Array, k: number, u: number, v: number): void {
  deg[u]! += 1;
  deg[v]! += 1;
  if (u < k) m[u * k + u]! += 1;
  if (v < k) m[v * k + v]! += 1;
  if (u < k && v < k) {
    m[u * k + v]! -= 1;
    m[v * k + u]! -= 1;
  }
}

/** tau of a multigraph on vertices 0..n-1 (parallel edges count separately; loops ignored). */
export function countSpanningTrees(n: number, edges: readonly (readonly [number, number])[]): bigint {
  if (n <= 1) return 1n;
  if (n - 1 <= DENSE_LIMIT) {
    const small = smallTau(n, edges);
    if (small !== null) return small;
  }
  if (n - 1 > DENSE_LIMIT) {
    const diag: number[] = Array.from({ length: n - 1 }, () => 0);
    const pairs = new Map<number, number>();
    for (const [u, v] of edges) {
      if (u === v) continue;
      if (u < n - 1) diag[u]! += 1;
      if (v < n - 1) diag[v]! += 1;
      if (u < n - 1 && v < n - 1) {
        const key = Math.min(u, v) * n + Math.max(u, v);
        pairs.set(key, (pairs.get(key) ?? 0) - 1);
      }
    }
    const off: [number, number, number][] = [...pairs].map(([key, val]) => [Math.floor(key / n), key % n, val]);
    return sparseSymmetricDeterminant(diag, off);
  }
  const L: number[][] = Array.from({ length: n - 1 }, () => Array.from({ length: n - 1 }, () => 0));
  for (const [u, v] of edges) {
    if (u === v) continue;
    if (u < n - 1) L[u]![u]! += 1;
    if (v < n - 1) L[v]![v]! += 1;
    if (u < n - 1 && v < n - 1) {
      L[u]![v]! -= 1;
      L[v]![u]! -= 1;
    }
  }
  return bareissDeterminant(L);
}

/** tau of the tiling's c-net: the horizontal Smith diagram plus the pole edge. */
export function tilingSpanningTrees(t: Tiling): bigint {
  // the decode gives every square's top and bottom segment at once; a list of squares that
  // does not tile its frame falls back to the sweep over the sides
  if (t.squares.length > 0 && core.load(t)) return decodedSpanningTrees();
  const seg = maximalSegments(t, false);
  const count = seg.at.length;
  let top = -1;
  let bottom = -1;
  for (let v = 0; v < count; v++) {
    const at = seg.at[v]!;
    if (at === 0 && top < 0) top = v;
    else if (at === t.H && bottom < 0) bottom = v;
  }
  const edges: [number, number][] = t.squares.map((_, i) => [seg.before[i]!, seg.after[i]!]);
  edges.push([top, bottom]);
  return countSpanningTrees(count, edges);
}

let lap = new Float64Array(0);
let lapDeg = new Float64Array(0);

/** tau of the c-net of the tiling the shared decoder holds (its last decode). */
function decodedSpanningTrees(): bigint {
  const { n, topSeg, botSeg, segCount } = core;
  const top = 0;
  const bottom = segCount - 1;
  // the last row and column (the bottom edge) are dropped: any cofactor is tau
  const k = segCount - 1;
  if (k <= DENSE_LIMIT) {
    if (lap.length < k * k) lap = new Float64Array(Math.max(k * k, 2 * lap.length));
    if (lapDeg.length < segCount) lapDeg = new Float64Array(Math.max(segCount, 2 * lapDeg.length));
    const m = lap;
    const deg = lapDeg;
    m.fill(0, 0, k * k);
    deg.fill(0, 0, segCount);
    // each square joins the segment through its top to the one through its bottom
    for (let i = 0; i < n; i++) addEdge(m, deg, k, topSeg[i]!, botSeg[i]!);
    addEdge(m, deg, k, top, bottom);
    const small = smallTauOf(m.subarray(0, k * k), k, deg);
    if (small !== null) return small;
  }
  const edges: [number, number][] = [];
  for (let i = 0; i < n; i++) edges.push([topSeg[i]!, botSeg[i]!]);
  edges.push([top, bottom]);
  return countSpanningTrees(segCount, edges);
}
