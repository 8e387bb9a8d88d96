import { describe, expect, it } from 'vitest';
import { parseTiling } from '../../../shared/tiling/index';
import { evaluateDeduction, makeDeductionPuzzle } from '../../../shared/puzzle/deduction-puzzle';
import { isSolvable } from '../../../shared/puzzle/deduction-propagate';
import { levelValue } from '../../../shared/puzzle/deduction-grade';
import { PuzzleInputError } from '../../../shared/puzzle/errors';
import { tilingLayout } from '../../../shared/puzzle/layout-graph';
import { catalogue } from './catalogue';

// OEIS A014530; Duijvestijn 1978
const SQUARE_112 = '21 112 112 (50,35,27)(8,19)(15,17,11)(6,24)(29,25,9,2)(7,18)(16)(42)(4,37)(33)';

describe('deduction puzzle', () => {
  it('on the 112 square: solves at the level, is proved unique by rank, every step is true, grade in 1..5', () => {
    const t = parseTiling(SQUARE_112);
    for (const level of [2, 3, Number.POSITIVE_INFINITY]) {
      const p = makeDeductionPuzzle(t, { level, seed: 3 });
      expect(p.solved).toBe(true);
      expect(p.proof.unique).toBe(true);
      expect(p.proof.rank).toBe(p.proof.unknowns);
      expect(p.features.levelNeeded).not.toBeNull();
      expect(levelValue(p.features.levelNeeded!)).toBeLessThanOrEqual(level);
      expect(p.level).toBe(Number.isFinite(level) ? level : 'closure');
      expect(p.steps.length + p.givens.length).toBe(21);
      for (const s of p.steps) expect(s.value).toBe(t.squares[s.square]!.s);
      for (const g of p.givens) expect(t.squares[g.square]).toEqual({ x: g.x, y: g.y, s: g.size });
      expect(p.grade).toBeGreaterThanOrEqual(1);
      expect(p.grade).toBeLessThanOrEqual(5);
    }
  });

  it('rank proof and propagation agree on every catalogue rectangle of order 12 (solvable at the closure implies rank = unknowns)', () => {
    for (const { tiling } of catalogue(12)) {
      const p = makeDeductionPuzzle(tiling, { level: Number.POSITIVE_INFINITY, restarts: 2, seed: 1 });
      expect(p.solved && p.proof.unique).toBe(true);
      const layout = tilingLayout(tiling);
      const board = { layout, sizes: tiling.squares.map((q) => q.s) };
      // and the level needed is the smallest level that works
      const k = p.features.levelNeeded;
      if (typeof k === 'number' && k > 1) expect(isSolvable(board, p.givens.map((g) => g.square), { level: k - 1, showFrame: false })).toBe(false);
    }
  });

  it('an evaluated puzzle with too few givens is reported unsolved, not guessed', () => {
    const t = parseTiling('9 33 32 (18,15)(7,8)(14,4)(10,1)(9)');
    const p = evaluateDeduction(t, [0], { level: 2 });
    expect(p.solved).toBe(false);
    // one size and no frame: not even the closure gets anywhere
    expect(p.features.levelNeeded).toBeNull();
    // A and F given: level 2 is stuck (see the propagation test), the closure is not
    const q = evaluateDeduction(t, [0, 2, 5], { level: 2 });
    expect(q.solved).toBe(false);
    expect(q.features.levelNeeded).toBe(3);
  });

  it('is plain JSON (it crosses worker threads and is stored): a JSON round trip changes nothing', () => {
    const t = parseTiling(SQUARE_112);
    for (const level of [3, 'closure'] as const) {
      const p = makeDeductionPuzzle(t, { level, seed: 1 });
      expect(JSON.parse(JSON.stringify(p))).toEqual(p);
    }
  });

  it('names bad input', () => {
    const t = parseTiling('9 33 32 (18,15)(7,8)(14,4)(10,1)(9)');
    expect(() => makeDeductionPuzzle(t, { level: 0 })).toThrow(PuzzleInputError);
    expect(() => makeDeductionPuzzle(t, { level: 2.5 })).toThrow(/level must be a whole number >= 1 or 'closure'/);
    expect(() => evaluateDeduction(t, [9])).toThrow(/given 1 must be a square index from 0 to 8/);
    expect(() => makeDeductionPuzzle({ W: 3, H: 3, squares: [{ x: 0, y: 0, s: 2 }] })).toThrow(/does not verify/);
  });
});
