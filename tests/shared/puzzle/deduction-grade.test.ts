import { describe, expect, it } from 'vitest';
import { gradeFromFeatures } from '../../../shared/puzzle/deduction-grade';
import type { GradeFeatures } from '../../../shared/puzzle/deduction-grade';

const base: GradeFeatures = { levelNeeded: 2, steps: 10, rounds: 4, bottleneck: 2, singleRounds: 0, givens: 5, showFrame: true, maxTerms: 2, meanTerms: 2 };

// The formula is our own (docs/decisions/020-deduction-grade.md, common practice weights);
// these checks pin its documented table so that a change is deliberate.
describe('deduction grade', () => {
  it('a short local puzzle with the frame printed is grade 1', () => {
    expect(gradeFromFeatures(base)).toBe(1);
  });
  it('the level dominates: each longer chain length raises the grade', () => {
    expect(([2, 3, 4, 5, 'closure', null] as const).map((levelNeeded) => gradeFromFeatures({ ...base, levelNeeded }))).toEqual([1, 2, 3, 4, 4, 4]);
  });
  it('many rounds, single-option rounds and a hidden frame add half points', () => {
    expect(gradeFromFeatures({ ...base, rounds: 10 })).toBe(2);
    expect(gradeFromFeatures({ ...base, rounds: 7, singleRounds: 3 })).toBe(2);
    expect(gradeFromFeatures({ ...base, showFrame: false, rounds: 7 })).toBe(2);
    expect(gradeFromFeatures({ ...base, showFrame: false })).toBe(1);
  });
  it('never leaves 1..5', () => {
    expect(gradeFromFeatures({ ...base, levelNeeded: 'closure', rounds: 40, singleRounds: 20, showFrame: false })).toBe(5);
  });
});
