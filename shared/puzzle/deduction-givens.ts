import { isSolvable } from './deduction-propagate';
import type { DeductionBoard, DeductionRules } from './deduction-propagate';
import { mulberry32, shuffled } from '../tiling/index';

export interface GivensOptions {
  /** seed of the PRNG for the restarts (default 1) */
  seed?: number;
  /** greedy restarts (default 16) */
  restarts?: number;
  /** the exact search tries every subset of a size only when there are at most this many (default 2 500) */
  exactLimit?: number;
}

export interface GivensChoice {
  /** square indexes, ascending */
  givens: number[];
  /**
   * 'proved': no smaller set works at this level (every smaller subset was tried);
   * 'inclusion': no given can be removed, smaller sets were not all tried
   */
  minimal: 'proved' | 'inclusion';
  /** solvability checks made */
  checks: number;
}

function binomial(n: number, k: number): number {
  let r = 1;
  for (let i = 1; i <= k; i++) r = (r * (n - k + i)) / i;
  return Math.round(r);
}

/**
 * Choose as few givens as possible so that the puzzle solves at the requested level.
 * Greedy removal with seeded restarts gives inclusion-minimal sets (engine.md 8.2); then
 * every subset one smaller than the best is tried while there are few enough of them
 * (minimum forcing sets are hard in general, so the exact part is bounded).
 */
export function chooseGivens(board: DeductionBoard, rules: DeductionRules, options: GivensOptions = {}): GivensChoice {
  const n = board.layout.cells.length;
  const random = mulberry32(options.seed ?? 1);
  const restarts = options.restarts ?? 16;
  const exactLimit = options.exactLimit ?? 2_500;
  let checks = 0;
  const solvable = (g: readonly number[]) => { checks++; return isSolvable(board, g, rules); };
  const all = Array.from({ length: n }, (_, i) => i);
  let best = all;
  for (let r = 0; r < restarts; r++) {
    const current = new Set(all);
    for (const i of shuffled(all, random)) {
      current.delete(i);
      if (!solvable([...current])) current.add(i);
    }
    if (current.size < best.length) best = [...current].sort((a, b) => a - b);
  }
  // exact search below the greedy best. Solvability is monotone (more givens, more
  // knowledge), so if no set of size m works, no smaller set does: it is enough to try
  // size best - 1, and to go on downwards only while that succeeds.
  for (;;) {
    const size = best.length - 1;
    if (size < 0) return { givens: best, minimal: 'proved', checks };
    if (binomial(n, size) > exactLimit) return { givens: best, minimal: 'inclusion', checks };
    const found = firstSolvableSubset(n, size, solvable);
    if (!found) return { givens: best, minimal: 'proved', checks };
    best = found;
  }
}

function firstSolvableSubset(n: number, size: number, solvable: (g: readonly number[]) => boolean): number[] | null {
  const idx = Array.from({ length: size }, (_, i) => i);
  for (;;) {
    if (solvable(idx)) return idx.slice();
    let j = size - 1;
    while (j >= 0 && idx[j] === n - size + j) j--;
    if (j < 0) return null;
    idx[j]!++;
    for (let t = j + 1; t < size; t++) idx[t] = idx[t - 1]! + 1;
  }
}
