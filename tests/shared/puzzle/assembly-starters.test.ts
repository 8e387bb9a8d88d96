import { describe, expect, it } from 'vitest';
import { canonicalKey, parseTiling } from '../../../shared/tiling/index';
import { solveAssembly } from '../../../shared/puzzle/assembly';
import { findFewestStarters } from '../../../shared/puzzle/assembly-starters';
import { PuzzleInputError } from '../../../shared/puzzle/errors';

// engine.md 7: an order-13 pair of different simple perfect rectangles with the same elements
const TWIN_13 = '13 112 75 (33,24,19,36)(5,14)(9,20)(42)(11,3)(39)(31)';
// OEIS A181340 (Willcocks 1948)
const COMPOUND_175 = '24 175 175 (81,56,38)(18,20)(55,16,3)(1,5,14)(4)(9)(39)(51,30)(29,31,64)(43,8)(35,2)(33)';

describe('fewest starter pieces', () => {
  it('needs none for a set that is already unique (the 33 x 32 rectangle, squaring.net)', () => {
    const r = findFewestStarters(parseTiling('9 33 32 (18,15)(7,8)(14,4)(10,1)(9)'));
    expect(r.starters).toEqual([]);
    expect(r.fewestProved).toBe(true);
  });

  it('one starter settles the order-13 twin set, and the solver confirms it', () => {
    const t = parseTiling(TWIN_13);
    const r = findFewestStarters(t);
    expect(r.starters).toHaveLength(1);
    expect(r.fewestProved).toBe(true);
    const check = solveAssembly({ width: t.W, height: t.H, pieces: t.squares.map((q) => q.s), starters: r.starters! }, { mode: 'count' });
    expect(check.verdict).toBe('unique');
    expect(canonicalKey(check.solutions[0]!)).toBe(canonicalKey(t));
  });

  it('finds starters for the compound 175 square, each candidate proved by the solver', () => {
    const t = parseTiling(COMPOUND_175);
    const r = findFewestStarters(t, { budget: { maxNodes: 5_000_000 } }); // a node budget keeps the test deterministic
    expect(r.starters).not.toBeNull();
    expect(r.starters!.length).toBeGreaterThan(0);
    const check = solveAssembly({ width: 175, height: 175, pieces: t.squares.map((q) => q.s), starters: r.starters! });
    expect(check.verdict).toBe('unique');
  });

  it('stops honestly when the budget is spent', () => {
    const t = parseTiling(COMPOUND_175);
    const r = findFewestStarters(t, { budget: { maxNodes: 10 } });
    expect(r.starters).toBeNull();
    expect(r.fewestProved).toBe(false);
    expect(r.stoppedBy).toBe('max-nodes');
  });

  it('can be cancelled and reports progress', () => {
    const t = parseTiling(COMPOUND_175);
    const seen: number[] = [];
    let calls = 0;
    const r = findFewestStarters(t, { shouldStop: () => ++calls > 3, onProgress: (n) => seen.push(n) });
    expect(r.stoppedBy).toBe('cancelled');
    expect(r.starters).toBeNull();
    expect(seen[seen.length - 1]).toBe(r.nodes);
  });

  it('refuses a tiling that does not verify', () => {
    expect(() => findFewestStarters({ W: 2, H: 2, squares: [{ x: 0, y: 0, s: 1 }] })).toThrow(PuzzleInputError);
  });
});
