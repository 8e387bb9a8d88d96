import { bareissRank } from '../tiling/index';
import type { LayoutGraph } from './layout-graph';

/**
 * The Kirchhoff system of a Deduction puzzle, in the form the solver faces it: unknowns are
 * the x of every vertical segment but the left side (x = 0), the y of every horizontal
 * segment but the top side (y = 0), and every square's size. Each square gives
 * x(right) - x(left) = s and y(bottom) - y(top) = s (the voltage laws of both Smith
 * diagrams, BSST 1940; the current laws follow from them); each given gives s = value; a
 * printed frame gives x(right side) = W and y(bottom side) = H.
 */
export interface LinearSystem {
  /** variable names, e.g. "x3", "y2", "s5" */
  variables: string[];
  /** integer coefficient rows */
  rows: number[][];
  /** right-hand sides */
  rhs: number[];
}

export function kirchhoffSystem(layout: LayoutGraph, givens: readonly { square: number; size: number }[], showFrame: boolean): LinearSystem {
  const nx = layout.vertical.length;
  const ny = layout.horizontal.length;
  const n = layout.cells.length;
  const variables: string[] = [];
  const xv = new Int32Array(nx).fill(-1);
  const yv = new Int32Array(ny).fill(-1);
  for (let i = 1; i < nx; i++) { xv[i] = variables.length; variables.push(`x${i}`); }
  for (let i = 1; i < ny; i++) { yv[i] = variables.length; variables.push(`y${i}`); }
  const sv = new Int32Array(n);
  for (let i = 0; i < n; i++) { sv[i] = variables.length; variables.push(`s${i}`); }
  const m = variables.length;
  const rows: number[][] = [];
  const rhs: number[] = [];
  const row = () => Array.from({ length: m }, () => 0);
  layout.cells.forEach((c, i) => {
    const rx = row();
    if (xv[c.right]! >= 0) rx[xv[c.right]!]! += 1;
    if (xv[c.left]! >= 0) rx[xv[c.left]!]! -= 1;
    rx[sv[i]!] = -1;
    rows.push(rx); rhs.push(0);
    const ry = row();
    if (yv[c.bottom]! >= 0) ry[yv[c.bottom]!]! += 1;
    if (yv[c.top]! >= 0) ry[yv[c.top]!]! -= 1;
    ry[sv[i]!] = -1;
    rows.push(ry); rhs.push(0);
  });
  for (const g of givens) {
    const r = row();
    r[sv[g.square]!] = 1;
    rows.push(r); rhs.push(g.size);
  }
  if (showFrame) {
    const rw = row();
    rw[xv[nx - 1]!] = 1;
    rows.push(rw); rhs.push(layout.width);
    const rh = row();
    rh[yv[ny - 1]!] = 1;
    rows.push(rh); rhs.push(layout.height);
  }
  return { variables, rows, rhs };
}

export interface UniquenessProof {
  unique: boolean;
  rank: number;
  unknowns: number;
}

/** Uniqueness of the sizes, proved by rank: the system has one solution iff rank = unknowns. */
export function proveUniqueByRank(layout: LayoutGraph, givens: readonly { square: number; size: number }[], showFrame: boolean): UniquenessProof {
  const sys = kirchhoffSystem(layout, givens, showFrame);
  const rank = bareissRank(sys.rows);
  return { unique: rank === sys.variables.length, rank, unknowns: sys.variables.length };
}
