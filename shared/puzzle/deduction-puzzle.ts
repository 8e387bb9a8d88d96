import { verifyTiling } from '../tiling/index';
import type { Tiling } from '../tiling/index';
import { PuzzleInputError } from './errors';
import { chooseGivens } from './deduction-givens';
import type { GivensOptions } from './deduction-givens';
import { gradeFeatures, gradeFromFeatures, levelName, levelNeeded, levelValue } from './deduction-grade';
import type { GradeFeatures, Level } from './deduction-grade';
import { explainDeduction } from './deduction-propagate';
import type { DeductionBoard, DeductionStep } from './deduction-propagate';
import { proveUniqueByRank } from './deduction-rank';
import type { UniquenessProof } from './deduction-rank';
import { tilingLayout } from './layout-graph';

export interface DeductionGiven {
  square: number;
  x: number;
  y: number;
  size: number;
}

export interface DeductionPuzzle {
  /** the level the givens were chosen for ('closure' = the full closure) */
  level: Level;
  showFrame: boolean;
  givens: DeductionGiven[];
  minimal: 'proved' | 'inclusion' | 'not-checked';
  steps: DeductionStep[];
  /** propagation at the level reaches every size */
  solved: boolean;
  /** the independent proof: rank of the Kirchhoff system with the givens fixed */
  proof: UniquenessProof;
  features: GradeFeatures;
  grade: number;
}

export interface DeductionRequest extends GivensOptions {
  /** locality level k, or 'closure' (default; Infinity means the same) */
  level?: Level;
  /** print the frame's W and H (default false) */
  showFrame?: boolean;
}

export function deductionBoard(tiling: Tiling): DeductionBoard {
  const v = verifyTiling(tiling);
  if (!v.ok) throw new PuzzleInputError('bad-tiling', `the tiling does not verify: ${v.message}`, { field: 'tiling' });
  return { layout: tilingLayout(tiling), sizes: tiling.squares.map((q) => q.s) };
}

/** The level as a number (Infinity for the closure), after checking it. */
function checkLevel(raw: Level | undefined): number {
  const level = levelValue(raw ?? 'closure');
  if (level !== Number.POSITIVE_INFINITY && !(Number.isSafeInteger(level) && level >= 1)) {
    throw new PuzzleInputError('bad-level', `level must be a whole number >= 1 or 'closure', got ${String(raw)}`, { field: 'level' });
  }
  return level;
}

/**
 * Evaluate a Deduction puzzle with the given squares' sizes printed: the step list, the
 * rank proof, the level needed and the grade.
 */
export function evaluateDeduction(tiling: Tiling, givenSquares: readonly number[], opts: { level?: Level; showFrame?: boolean } = {}): Omit<DeductionPuzzle, 'minimal'> {
  const level = checkLevel(opts.level);
  const showFrame = opts.showFrame ?? false;
  const board = deductionBoard(tiling);
  givenSquares.forEach((g, i) => {
    if (!Number.isSafeInteger(g) || g < 0 || g >= tiling.squares.length) {
      throw new PuzzleInputError('bad-given', `given ${i + 1} must be a square index from 0 to ${tiling.squares.length - 1}, got ${String(g)}`, { field: 'givens', index: i });
    }
  });
  const givens = [...new Set(givenSquares)].sort((a, b) => a - b);
  const run = explainDeduction(board, givens, { level, showFrame });
  const proof = proveUniqueByRank(board.layout, givens.map((g) => ({ square: g, size: board.sizes[g]! })), showFrame);
  const needed = levelNeeded(board, givens, showFrame);
  const features = gradeFeatures(run, needed, givens.length, showFrame);
  return {
    level: levelName(level),
    showFrame,
    givens: givens.map((g) => { const q = tiling.squares[g]!; return { square: g, x: q.x, y: q.y, size: q.s }; }),
    steps: run.steps,
    solved: run.solved,
    proof,
    features,
    grade: gradeFromFeatures(features),
  };
}

/**
 * Make a Deduction puzzle from a verified tiling: choose the fewest givens for the level
 * (seeded), then evaluate it. The result always solves at the level and is proved unique
 * by rank; if the two ever disagreed, this throws (a bug, never a puzzle).
 */
export function makeDeductionPuzzle(tiling: Tiling, request: DeductionRequest = {}): DeductionPuzzle {
  const level = checkLevel(request.level);
  const showFrame = request.showFrame ?? false;
  const board = deductionBoard(tiling);
  const choice = chooseGivens(board, { level, showFrame }, request);
  const puzzle = evaluateDeduction(tiling, choice.givens, { level: levelName(level), showFrame });
  if (!puzzle.solved || !puzzle.proof.unique) {
    throw new Error(`deduction: propagation (${puzzle.solved}) and rank proof (${puzzle.proof.unique}) disagree`);
  }
  return { ...puzzle, minimal: choice.minimal };
}
