// Counting spanning trees exactly by the matrix-tree theorem (Kirchhoff 1847): tau(G) is any
// cofactor of the Laplacian; evaluated with Bareiss' fraction-free elimination in BigInt.

import { bareissDeterminant } from './bareiss';
import { sparseSymmetricDeterminant } from './modular-determinant';

/** Above this many rows the sparse modular determinant replaces dense Bareiss. */
export const DENSE_LIMIT = 60;
import { smithDiagram } from './smith-diagram';
import type { Tiling } from './types';

/** tau of a multigraph on vertices 0..n-1 (parallel edges count separately; loops ignored). */
export function countSpanningTrees(n: number, edges: readonly (readonly [number, number])[]): bigint {
  if (n <= 1) return 1n;
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
  const d = smithDiagram(t, 'horizontal');
  const edges: [number, number][] = d.edges.map((e) => [e.from, e.to]);
  edges.push([d.pole.from, d.pole.to]);
  return countSpanningTrees(d.nodes.length, edges);
}
