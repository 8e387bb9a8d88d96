import type { Tiling } from '../tiling/index';
import { layoutGraph, tilingLayout } from './layout-graph';
import type { LayoutGraph, LayoutRect } from './layout-graph';

/** A not-to-scale drawing of a tiling: the same cells as rectangles, sizes hidden. */
export interface NotToScaleDrawing {
  width: number;
  height: number;
  /** cell i draws square i of the tiling */
  rects: LayoutRect[];
}

/** The drawing box: `width` and `height`, or else `step` units per grid step (default 10). */
export interface NotToScaleBox {
  width?: number;
  height?: number;
  step?: number;
}

/**
 * Remap the distinct x and the distinct y coordinates of the tiling monotonically onto an
 * even grid (the j-th distinct x goes to j * width / (count - 1)): the order of every
 * coordinate is kept, so every adjacency (and every cross) survives, but the lengths no
 * longer give the sizes away. `width` and `height` set the drawing box (default: `step`
 * units per grid step, 10 unless given).
 */
export function notToScaleLayout(t: Tiling, box: NotToScaleBox = {}): NotToScaleDrawing {
  const xs = [...new Set(t.squares.flatMap((q) => [q.x, q.x + q.s]).concat([0, t.W]))].sort((a, b) => a - b);
  const ys = [...new Set(t.squares.flatMap((q) => [q.y, q.y + q.s]).concat([0, t.H]))].sort((a, b) => a - b);
  const step = box.step ?? 10;
  const width = box.width ?? step * (xs.length - 1);
  const height = box.height ?? step * (ys.length - 1);
  const mx = new Map(xs.map((x, j) => [x, (j * width) / (xs.length - 1)]));
  const my = new Map(ys.map((y, j) => [y, (j * height) / (ys.length - 1)]));
  const rects = t.squares.map((q) => {
    const x = mx.get(q.x)!;
    const y = my.get(q.y)!;
    return { x, y, w: mx.get(q.x + q.s)! - x, h: my.get(q.y + q.s)! - y };
  });
  return { width, height, rects };
}

/** The same drawing in the shape print reads (edition PDFs, puzzle images): box W x H and the cells. */
export interface NotToScaleRects {
  W: number;
  H: number;
  /** cell i draws square i of the tiling */
  rects: LayoutRect[];
}

/** notToScaleLayout in print's shape { W, H, rects }. */
export function notToScaleRects(t: Tiling, box: NotToScaleBox = {}): NotToScaleRects {
  const d = notToScaleLayout(t, box);
  return { W: d.width, H: d.height, rects: d.rects };
}

function describeDifference(a: LayoutGraph, b: LayoutGraph): string | null {
  if (a.horizontal.length !== b.horizontal.length) return `horizontal segments: ${a.horizontal.length} in the tiling, ${b.horizontal.length} in the drawing`;
  if (a.vertical.length !== b.vertical.length) return `vertical segments: ${a.vertical.length} in the tiling, ${b.vertical.length} in the drawing`;
  if (a.cells.length !== b.cells.length) return `cells: ${a.cells.length} in the tiling, ${b.cells.length} in the drawing`;
  for (let i = 0; i < a.cells.length; i++) {
    const p = a.cells[i]!;
    const q = b.cells[i]!;
    if (p.top !== q.top || p.bottom !== q.bottom) return `square ${i + 1} hangs between other horizontal segments in the drawing`;
    if (p.left !== q.left || p.right !== q.right) return `square ${i + 1} stands between other vertical segments in the drawing`;
  }
  return null;
}

/**
 * Does the drawing have the same Smith diagram as the tiling, in both directions? Same
 * maximal segments (nodes) in the same order and every square between the same pair of
 * segments (edges), horizontally and vertically. The drawing must also fill its box
 * without overlaps (checked by area and pairwise disjointness).
 */
export function sameSmithDiagram(t: Tiling, drawing: NotToScaleDrawing): { same: true } | { same: false; message: string } {
  if (drawing.rects.length !== t.squares.length) return { same: false, message: `the drawing has ${drawing.rects.length} cells, the tiling ${t.squares.length} squares` };
  let area = 0;
  for (const r of drawing.rects) {
    if (!(r.w > 0 && r.h > 0)) return { same: false, message: 'the drawing has an empty cell' };
    area += r.w * r.h;
  }
  const box = drawing.width * drawing.height;
  if (Math.abs(area - box) > 1e-9 * box) return { same: false, message: 'the drawing does not fill its box' };
  for (let i = 0; i < drawing.rects.length; i++) for (let j = i + 1; j < drawing.rects.length; j++) {
    const a = drawing.rects[i]!;
    const b = drawing.rects[j]!;
    if (a.x < b.x + b.w && b.x < a.x + a.w && a.y < b.y + b.h && b.y < a.y + a.h) return { same: false, message: `cells ${i + 1} and ${j + 1} overlap in the drawing` };
  }
  const diff = describeDifference(tilingLayout(t), layoutGraph(drawing.width, drawing.height, drawing.rects));
  return diff === null ? { same: true } : { same: false, message: diff };
}
