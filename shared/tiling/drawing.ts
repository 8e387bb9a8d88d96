// A plane network drawn with straight edges (for example on the intake canvas): check that no
// two edges cross or overlap and no edge runs through a node, then read the rotation system
// off the drawing by sorting each node's neighbours by angle (common practice).

import { TilingInputError } from './errors';
import { MAX_GRAPH_EDGES, MAX_GRAPH_VERTICES } from './plane-graph';
import type { PlaneGraph } from './types';

type P = { x: number; y: number };

function orient(a: P, b: P, c: P): number {
  const v = (b.x - a.x) * (c.y - a.y) - (b.y - a.y) * (c.x - a.x);
  return v > 0 ? 1 : v < 0 ? -1 : 0;
}

function onSegment(a: P, b: P, c: P): boolean {
  return Math.min(a.x, b.x) <= c.x && c.x <= Math.max(a.x, b.x) && Math.min(a.y, b.y) <= c.y && c.y <= Math.max(a.y, b.y);
}

/**
 * Returns the rotation system of a straight-line drawing, or a TilingInputError (returned, not
 * thrown) naming the problem: code 'crossing' with where.edges = the two edge indices,
 * 'node-on-edge', 'bad-drawing' for malformed input.
 */
export function planeGraphFromDrawing(nodes: { x: number; y: number }[], edges: [number, number][]): PlaneGraph | TilingInputError {
  if (!Array.isArray(nodes) || !Array.isArray(edges)) return new TilingInputError('bad-drawing', 'expected an array of nodes { x, y } and an array of edges [a, b]');
  const n = nodes.length;
  if (n < 2) return new TilingInputError('bad-drawing', `a network needs at least 2 nodes (got ${n})`);
  if (n > MAX_GRAPH_VERTICES) return new TilingInputError('too-large', `the drawing has ${n} nodes; at most ${MAX_GRAPH_VERTICES} are accepted`);
  if (edges.length > MAX_GRAPH_EDGES) return new TilingInputError('too-large', `the drawing has ${edges.length} edges; at most ${MAX_GRAPH_EDGES} are accepted`);
  for (let i = 0; i < n; i++) {
    const p = nodes[i];
    if (!p || typeof p.x !== 'number' || typeof p.y !== 'number' || !Number.isFinite(p.x) || !Number.isFinite(p.y)) {
      return new TilingInputError('bad-drawing', `node ${i} must have finite numeric x and y`);
    }
    for (let j = 0; j < i; j++) {
      const q = nodes[j]!;
      if (q.x === p.x && q.y === p.y) return new TilingInputError('bad-drawing', `nodes ${j} and ${i} sit at the same point (${p.x}, ${p.y})`);
    }
  }
  const seen = new Set<string>();
  for (let i = 0; i < edges.length; i++) {
    const e = edges[i];
    if (!Array.isArray(e) || e.length !== 2) return new TilingInputError('bad-drawing', `edge ${i} must be a pair [a, b] of node numbers`);
    const [a, b] = e;
    if (!Number.isInteger(a) || !Number.isInteger(b) || a < 0 || b < 0 || a >= n || b >= n) {
      return new TilingInputError('bad-drawing', `edge ${i} = [${String(a)}, ${String(b)}] names a node outside 0..${n - 1}`);
    }
    if (a === b) return new TilingInputError('bad-drawing', `edge ${i} joins node ${a} to itself`);
    const key = a < b ? `${a},${b}` : `${b},${a}`;
    if (seen.has(key)) return new TilingInputError('bad-drawing', `edge ${i} joins nodes ${a} and ${b} a second time`);
    seen.add(key);
  }
  // a node inside an edge
  for (let i = 0; i < edges.length; i++) {
    const [a, b] = edges[i]!;
    const A = nodes[a]!;
    const B = nodes[b]!;
    for (let v = 0; v < n; v++) {
      if (v === a || v === b) continue;
      const C = nodes[v]!;
      if (orient(A, B, C) === 0 && onSegment(A, B, C)) {
        return new TilingInputError('node-on-edge', `node ${v} lies on edge ${i} (${a}-${b})`, { edges: [i, i] });
      }
    }
  }
  // crossings: edges without a common end must not meet; edges with one must not overlap
  for (let i = 0; i < edges.length; i++) {
    const [a, b] = edges[i]!;
    const A = nodes[a]!;
    const B = nodes[b]!;
    for (let j = i + 1; j < edges.length; j++) {
      const [c, d] = edges[j]!;
      if (a === c || a === d || b === c || b === d) continue; // shared ends: overlap is caught as node-on-edge
      const C = nodes[c]!;
      const D = nodes[d]!;
      const o1 = orient(A, B, C);
      const o2 = orient(A, B, D);
      const o3 = orient(C, D, A);
      const o4 = orient(C, D, B);
      const cross =
        (o1 !== o2 && o3 !== o4) ||
        (o1 === 0 && onSegment(A, B, C)) ||
        (o2 === 0 && onSegment(A, B, D)) ||
        (o3 === 0 && onSegment(C, D, A)) ||
        (o4 === 0 && onSegment(C, D, B));
      if (cross) return new TilingInputError('crossing', `edges ${i} (${a}-${b}) and ${j} (${c}-${d}) cross`, { edges: [i, j] });
    }
  }
  const nb: { u: number; angle: number }[][] = Array.from({ length: n }, () => []);
  for (const [a, b] of edges) {
    const A = nodes[a]!;
    const B = nodes[b]!;
    nb[a]!.push({ u: b, angle: Math.atan2(B.y - A.y, B.x - A.x) });
    nb[b]!.push({ u: a, angle: Math.atan2(A.y - B.y, A.x - B.x) });
  }
  return { n, adj: nb.map((list) => list.sort((p, q) => p.angle - q.angle).map((e) => e.u)) };
}
