/**
 * The combinatorial layout of a dissection of a W x H frame into axis-parallel rectangles
 * (a tiling's squares, or the rectangles of a not-to-scale drawing): the maximal
 * horizontal segments (nodes of the horizontal Smith diagram, BSST 1940) and maximal
 * vertical segments (nodes of the vertical one), and for every cell the segments on its
 * four sides. Collinear pieces that touch or overlap form one segment (a cross point
 * joins them), as in engine.md 4.
 */
export interface LayoutRect {
  x: number;
  y: number;
  w: number;
  h: number;
}

/** A maximal segment: `at` is its y (horizontal) or x (vertical); [start, end] its extent. */
export interface LayoutSegment {
  at: number;
  start: number;
  end: number;
}

export interface LayoutGraph {
  width: number;
  height: number;
  /** horizontal segments sorted by (y, start); 0 is the top side, the last the bottom side */
  horizontal: LayoutSegment[];
  /** vertical segments sorted by (x, start); 0 is the left side, the last the right side */
  vertical: LayoutSegment[];
  /** per cell: ids of its top and bottom (horizontal) and left and right (vertical) segments */
  cells: { top: number; bottom: number; left: number; right: number }[];
}

function segmentsOf(lines: Map<number, [number, number][]>): LayoutSegment[] {
  const out: LayoutSegment[] = [];
  for (const at of [...lines.keys()].sort((a, b) => a - b)) {
    const iv = lines.get(at)!.sort((a, b) => a[0] - b[0] || a[1] - b[1]);
    let cur: LayoutSegment | null = null;
    for (const [s, e] of iv) {
      if (cur && s <= cur.end) cur.end = Math.max(cur.end, e);
      else { cur = { at, start: s, end: e }; out.push(cur); }
    }
  }
  return out;
}

function find(segs: LayoutSegment[], at: number, start: number, end: number): number {
  for (let i = 0; i < segs.length; i++) {
    const g = segs[i]!;
    if (g.at === at && g.start <= start && end <= g.end) return i;
  }
  throw new Error(`layout: no segment at ${at} over [${start}, ${end}]`);
}

export function layoutGraph(width: number, height: number, rects: readonly LayoutRect[]): LayoutGraph {
  const hl = new Map<number, [number, number][]>();
  const vl = new Map<number, [number, number][]>();
  const add = (m: Map<number, [number, number][]>, at: number, s: number, e: number) => {
    const l = m.get(at);
    if (l) l.push([s, e]);
    else m.set(at, [[s, e]]);
  };
  for (const r of rects) {
    add(hl, r.y, r.x, r.x + r.w);
    add(hl, r.y + r.h, r.x, r.x + r.w);
    add(vl, r.x, r.y, r.y + r.h);
    add(vl, r.x + r.w, r.y, r.y + r.h);
  }
  const horizontal = segmentsOf(hl);
  const vertical = segmentsOf(vl);
  const cells = rects.map((r) => ({
    top: find(horizontal, r.y, r.x, r.x + r.w),
    bottom: find(horizontal, r.y + r.h, r.x, r.x + r.w),
    left: find(vertical, r.x, r.y, r.y + r.h),
    right: find(vertical, r.x + r.w, r.y, r.y + r.h),
  }));
  return { width, height, horizontal, vertical, cells };
}

/** The layout of a tiling's squares (cell i = square i). */
export function tilingLayout(t: { W: number; H: number; squares: readonly { x: number; y: number; s: number }[] }): LayoutGraph {
  return layoutGraph(t.W, t.H, t.squares.map((q) => ({ x: q.x, y: q.y, w: q.s, h: q.s })));
}
