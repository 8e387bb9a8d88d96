import { describe, expect, it } from 'vitest';
import { parseTiling } from '../../../shared/tiling/index';
import { solveAssembly } from '../../../shared/puzzle/assembly';
import { assembleAnswer, deduceAnswer, parseFrameArg, parseLevelArg, parsePiecesArg, parseStartersArg } from '../../../shared/puzzle/cli-format';
import { makeDeductionPuzzle } from '../../../shared/puzzle/deduction-puzzle';
import { PuzzleInputError } from '../../../shared/puzzle/errors';

// engine.md 7: an order-13 pair of different simple perfect rectangles with the same elements
const TWIN_13 = '13 112 75 (33,24,19,36)(5,14)(9,20)(42)(11,3)(39)(31)';

describe('command-line answers', () => {
  it('parses --frame, --pieces, --starters and --level', () => {
    expect(parseFrameArg('112x75')).toEqual({ width: 112, height: 75 });
    expect(parsePiecesArg('3, 2,1')).toEqual([3, 2, 1]);
    expect(parseStartersArg('33@0,0;5@33,0')).toEqual([{ size: 33, x: 0, y: 0 }, { size: 5, x: 33, y: 0 }]);
    expect(parseStartersArg('')).toEqual([]);
    expect(parseLevelArg('3')).toBe(3);
    expect(parseLevelArg('closure')).toBe('closure');
  });

  it('says what is wrong and where', () => {
    expect(() => parseFrameArg('112 by 75')).toThrow(/--frame: expected WxH/);
    expect(() => parsePiecesArg('3,,1')).toThrow(PuzzleInputError);
    expect(() => parsePiecesArg('3,-2')).toThrow(/piece 2 must be a positive whole number/);
    expect(() => parseStartersArg('33@0,0;5@x,0')).toThrow(/starter 2: x must be a whole number/);
    expect(() => parseStartersArg('33-0-0')).toThrow(/starter 1 must read size@x,y/);
    expect(() => parseLevelArg('0')).toThrow(/level/);
  });

  it('the assemble answer lists one Bouwkamp code per class, and the codes parse back to the same pieces', () => {
    const t = parseTiling(TWIN_13);
    const a = assembleAnswer(solveAssembly({ width: 112, height: 75, pieces: t.squares.map((q) => q.s) }));
    expect(Object.keys(a)).toEqual(['verdict', 'classes', 'complete', 'solutions', 'nodes', 'ms']);
    expect(a.verdict).toBe('multiple');
    expect(a.solutions).toHaveLength(2);
    const sorted = (x: number[]) => [...x].sort((p, q) => p - q);
    for (const code of a.solutions) expect(sorted(parseTiling(code).squares.map((q) => q.s))).toEqual(sorted(t.squares.map((q) => q.s)));
    expect(JSON.parse(JSON.stringify(a))).toEqual(a);
  });

  it('the deduce answer has the documented fields and is plain JSON', () => {
    const t = parseTiling(TWIN_13);
    const d = deduceAnswer(makeDeductionPuzzle(t, { level: 3, seed: 1 }));
    expect(Object.keys(d)).toEqual(['givens', 'steps', 'grade', 'unique', 'level']);
    expect(d.unique).toBe(true);
    expect(d.level).toBe(3);
    expect(d.givens.length + d.steps.length).toBe(13);
    expect(deduceAnswer(makeDeductionPuzzle(t, { seed: 1 })).level).toBe('closure');
  });
});
