import { describe, expect, it } from 'vitest';
import { parseTiling } from '../../../shared/tiling/index';
import type { Tiling } from '../../../shared/tiling/index';
import { chooseGivens } from '../../../shared/puzzle/deduction-givens';
import { isSolvable } from '../../../shared/puzzle/deduction-propagate';
import type { DeductionBoard } from '../../../shared/puzzle/deduction-propagate';
import { tilingLayout } from '../../../shared/puzzle/layout-graph';
import { catalogue } from './catalogue';

const board = (t: Tiling): DeductionBoard => ({ layout: tilingLayout(t), sizes: t.squares.map((q) => q.s) });
const INF = Number.POSITIVE_INFINITY;
// OEIS A014530; Duijvestijn 1978
const SQUARE_112 = '21 112 112 (50,35,27)(8,19)(15,17,11)(6,24)(29,25,9,2)(7,18)(16)(42)(4,37)(33)';

function smallestBruteForce(b: DeductionBoard, level: number, showFrame: boolean): number {
  const n = b.sizes.length;
  for (let size = 0; size <= n; size++) {
    const idx = Array.from({ length: size }, (_, i) => i);
    for (;;) {
      if (isSolvable(b, idx, { level, showFrame })) return size;
      let j = size - 1;
      while (j >= 0 && idx[j] === n - size + j) j--;
      if (j < 0) break;
      idx[j]!++;
      for (let t = j + 1; t < size; t++) idx[t] = idx[t - 1]! + 1;
    }
  }
  return n;
}

describe('choosing givens', () => {
  it('removing any chosen given breaks solvability at the chosen level (catalogue orders 9-11, levels 2, 3, closure)', () => {
    for (const order of [9, 10, 11]) for (const { tiling } of catalogue(order)) {
      const b = board(tiling);
      for (const level of [2, 3, INF]) {
        const rules = { level, showFrame: false };
        const { givens } = chooseGivens(b, rules, { seed: 5, restarts: 4 });
        expect(isSolvable(b, givens, rules)).toBe(true);
        for (const g of givens) expect(isSolvable(b, givens.filter((x) => x !== g), rules)).toBe(false);
      }
    }
  });

  it('a set marked proved-minimal has the size a brute-force search over all subsets finds (order 9 and 10)', () => {
    for (const order of [9, 10]) for (const { tiling } of catalogue(order)) {
      const b = board(tiling);
      for (const [level, showFrame] of [[2, false], [3, true], [INF, false]] as const) {
        const choice = chooseGivens(b, { level, showFrame }, { seed: 2 });
        expect(choice.minimal).toBe('proved');
        expect(choice.givens.length).toBe(smallestBruteForce(b, level, showFrame));
      }
    }
  });

  it('is reproducible for a seed', () => {
    const b = board(parseTiling(SQUARE_112));
    const a1 = chooseGivens(b, { level: 3, showFrame: false }, { seed: 42, exactLimit: 0 });
    const a2 = chooseGivens(b, { level: 3, showFrame: false }, { seed: 42, exactLimit: 0 });
    expect(a1).toEqual(a2);
    expect(a1.minimal).toBe('inclusion');
  });

  it('the 112 square needs 3 givens at the closure without the frame, 2 with it (engine.md 8.2, measured by our prototype)', () => {
    const b = board(parseTiling(SQUARE_112));
    const bare = chooseGivens(b, { level: INF, showFrame: false }, { seed: 1 });
    expect(bare.givens.length).toBe(3);
    expect(bare.minimal).toBe('proved');
    const framed = chooseGivens(b, { level: INF, showFrame: true }, { seed: 1 });
    expect(framed.givens.length).toBe(2);
  });

  it('fewer givens for a longer chain: the minimum never grows with the level (112 square)', () => {
    const b = board(parseTiling(SQUARE_112));
    const sizes = [2, 3, 4, INF].map((level) => chooseGivens(b, { level, showFrame: false }, { seed: 9 }).givens.length);
    for (let i = 1; i < sizes.length; i++) expect(sizes[i]!).toBeLessThanOrEqual(sizes[i - 1]!);
  });
});
