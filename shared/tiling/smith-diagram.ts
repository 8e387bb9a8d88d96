// The Smith diagram of a tiling (Brooks, Smith, Stone & Tutte, Duke Math. J. 7 (1940)): a node
// per maximal horizontal segment, a unit-resistance edge per square from the segment through
// its top to the segment through its bottom, current = side, potential = height above the
// bottom. The vertical diagram does the same with vertical segments. Touching collinear
// pieces (a cross) are one segment. The pole edge (battery) joins the top and bottom sides.

import { maximalSegments } from './segments';
import type { Direction, SmithDiagram, SmithEdge, SmithNode, Tiling } from './types';

export function smithDiagram(t: Tiling, direction: Direction = 'horizontal'): SmithDiagram {
  const vertical = direction === 'vertical';
  const seg = maximalSegments(t, vertical);
  const far = vertical ? t.W : t.H;
  const count = seg.at.length;
  const nodes: SmithNode[] = [];
  let positive = -1;
  let negative = -1;
  for (let v = 0; v < count; v++) {
    const at = seg.at[v]!;
    const start = seg.start[v]!;
    const end = seg.end[v]!;
    const node: SmithNode = {
      id: v,
      at,
      start,
      end,
      potential: far - at,
      line: vertical ? { x1: at, y1: start, x2: at, y2: end } : { x1: start, y1: at, x2: end, y2: at },
    };
    if (at === 0 && positive < 0) {
      node.pole = 'positive';
      positive = v;
    } else if (at === far && negative < 0) {
      node.pole = 'negative';
      negative = v;
    }
    nodes.push(node);
  }
  const edges: SmithEdge[] = t.squares.map((q, i) => {
    const from = seg.before[i]!;
    const to = seg.after[i]!;
    const line = vertical
      ? { x1: q.x, y1: q.y + q.s / 2, x2: q.x + q.s, y2: q.y + q.s / 2 }
      : { x1: q.x + q.s / 2, y1: q.y, x2: q.x + q.s / 2, y2: q.y + q.s };
    return { square: i, from, to, current: q.s, line };
  });
  // rotation system: around each segment, the squares on its near side in increasing
  // position, then those on its far side in decreasing position; the pole edge leaves the
  // positive pole's end and arrives at the negative pole's end (an arc around the outside).
  const above: { pos: number; v: number }[][] = [];
  const below: { pos: number; v: number }[][] = [];
  for (let v = 0; v < count; v++) {
    above.push([]);
    below.push([]);
  }
  t.squares.forEach((q, i) => {
    const pos = vertical ? q.y : q.x;
    above[seg.after[i]!]!.push({ pos, v: seg.before[i]! });
    below[seg.before[i]!]!.push({ pos, v: seg.after[i]! });
  });
  const adj: number[][] = [];
  for (let v = 0; v < count; v++) {
    const a = above[v]!.sort((p, q) => p.pos - q.pos).map((e) => e.v);
    const b = below[v]!.sort((p, q) => q.pos - p.pos).map((e) => e.v);
    if (v === positive) adj.push([negative, ...b]);
    else if (v === negative) adj.push([...a, positive]);
    else adj.push([...a, ...b]);
  }
  return {
    direction,
    width: t.W,
    height: t.H,
    nodes,
    edges,
    pole: { from: positive, to: negative, current: vertical ? t.H : t.W, path: polePath(t, vertical) },
    graph: { n: count, adj },
  };
}

/** A polyline around the outside from the positive side's far end to the negative side's. */
function polePath(t: Tiling, vertical: boolean): { x: number; y: number }[] {
  const m = Math.max(1, Math.round(Math.min(t.W, t.H) / 8));
  return vertical
    ? [{ x: 0, y: t.H }, { x: 0, y: t.H + m }, { x: t.W, y: t.H + m }, { x: t.W, y: t.H }]
    : [{ x: t.W, y: 0 }, { x: t.W + m, y: 0 }, { x: t.W + m, y: t.H }, { x: t.W, y: t.H }];
}
