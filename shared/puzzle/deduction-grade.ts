import { isSolvable } from './deduction-propagate';
import type { DeductionBoard, DeductionRun } from './deduction-propagate';

/** A locality level in JSON-able form: a chain length k >= 1, or 'closure' (k = Infinity). */
export type Level = number | 'closure';

/** 'closure' -> Infinity, k -> k */
export function levelValue(level: Level): number {
  return level === 'closure' ? Number.POSITIVE_INFINITY : level;
}

/** Infinity -> 'closure', k -> k */
export function levelName(k: number): Level {
  return Number.isFinite(k) ? k : 'closure';
}

export interface GradeFeatures {
  /** smallest locality level at which the puzzle solves ('closure': only the full closure; null: not even that) */
  levelNeeded: Level | null;
  steps: number;
  rounds: number;
  /** the smallest number of deductions available in any round (1 = a single way forward) */
  bottleneck: number;
  /** rounds in which exactly one deduction was available */
  singleRounds: number;
  givens: number;
  showFrame: boolean;
  maxTerms: number;
  meanTerms: number;
}

/** The smallest k at which the puzzle solves; 'closure' if only the full closure does; null if nothing does. */
export function levelNeeded(board: DeductionBoard, givens: readonly number[], showFrame: boolean): Level | null {
  if (!isSolvable(board, givens, { level: Number.POSITIVE_INFINITY, showFrame })) return null;
  const longest = board.layout.horizontal.length + board.layout.vertical.length;
  for (let k = 1; k <= longest; k++) if (isSolvable(board, givens, { level: k, showFrame })) return k;
  return 'closure';
}

export function gradeFeatures(run: DeductionRun, level: Level | null, givens: number, showFrame: boolean): GradeFeatures {
  const terms = run.steps.map((s) => s.terms.length);
  return {
    levelNeeded: level,
    steps: run.steps.length,
    rounds: run.available.length,
    bottleneck: run.available.length > 0 ? Math.min(...run.available) : 0,
    singleRounds: run.available.filter((a) => a === 1).length,
    givens,
    showFrame,
    maxTerms: terms.length > 0 ? Math.max(...terms) : 0,
    meanTerms: terms.length > 0 ? terms.reduce((a, b) => a + b, 0) / terms.length : 0,
  };
}

/**
 * Grade 1 (gentle) to 5 (fiendish) of a Deduction puzzle; see docs/decisions/020.
 *
 *   points = level points + round points + bottleneck points + frame points
 *   level points:      k <= 2: 0, k = 3: 1, k = 4: 2, k >= 5 or 'closure' (or unsolvable): 3
 *   round points:      rounds <= 5: 0, 6..9: 0.5, 10..13: 1, more: 1.5
 *   bottleneck points: 0.5 when three or more rounds offer a single deduction
 *   frame points:      0.5 when W and H are not printed
 *   grade = clamp(1 + floor(points), 1, 5)
 *
 * The level dominates (engine.md 8.3: level weight >> rounds > bottleneck). The weights are
 * our starting point (common practice for graded logic puzzles), to be calibrated by play tests.
 */
export function gradeFromFeatures(f: GradeFeatures): number {
  return Math.min(5, Math.max(1, 1 + Math.floor(gradePoints(f))));
}

/** The points of the formula above, before they are cut into grades (the grade calibration reads them). */
export function gradePoints(f: GradeFeatures): number {
  const k = f.levelNeeded === null ? Number.POSITIVE_INFINITY : levelValue(f.levelNeeded);
  const levelPoints = k <= 2 ? 0 : k === 3 ? 1 : k === 4 ? 2 : 3;
  const roundPoints = f.rounds <= 5 ? 0 : f.rounds <= 9 ? 0.5 : f.rounds <= 13 ? 1 : 1.5;
  const bottleneckPoints = f.singleRounds >= 3 ? 0.5 : 0;
  const framePoints = f.showFrame ? 0 : 0.5;
  return levelPoints + roundPoints + bottleneckPoints + framePoints;
}
