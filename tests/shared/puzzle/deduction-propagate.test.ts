import { describe, expect, it } from 'vitest';
import { mulberry32, parseTiling } from '../../../shared/tiling/index';
import type { Tiling } from '../../../shared/tiling/index';
import { explainDeduction, isSolvable, squareLabel } from '../../../shared/puzzle/deduction-propagate';
import type { DeductionBoard } from '../../../shared/puzzle/deduction-propagate';
import { tilingLayout } from '../../../shared/puzzle/layout-graph';
import { catalogue } from './catalogue';

const board = (t: Tiling): DeductionBoard => ({ layout: tilingLayout(t), sizes: t.squares.map((q) => q.s) });
const INF = Number.POSITIVE_INFINITY;

/** Evaluate "C = 33 - 18 = 15" (or "C = 15 (as A)") independently of the engine's own sum. */
function arithmetic(text: string): { label: string; expr: number; result: number } {
  const [label, ...rest] = text.replace(/ \(as [A-Z]+\)$/, '').split(' = ');
  const result = Number(rest[rest.length - 1]);
  const expr = rest.length === 1 ? result : rest[0]!.split(' ').reduce<{ acc: number; sign: number }>((st, tok) => {
    if (tok === '+') return { ...st, sign: 1 };
    if (tok === '-') return { ...st, sign: -1 };
    return { acc: st.acc + st.sign * Number(tok), sign: 1 };
  }, { acc: 0, sign: 1 }).acc;
  return { label: label!, expr, result };
}

describe('deduction propagation', () => {
  it('every step value equals the true size, its arithmetic adds up, its chain obeys the level and uses only earlier knowledge (catalogue orders 9-11, seeded givens)', () => {
    const rnd = mulberry32(3);
    const tilings = [9, 10, 11].flatMap((o) => catalogue(o).map((c) => c.tiling));
    let solvedRuns = 0;
    for (const t of tilings) {
      const b = board(t);
      const n = t.squares.length;
      const givens = [...new Set(Array.from({ length: 1 + Math.floor(rnd() * 4) }, () => Math.floor(rnd() * n)))];
      for (const level of [1, 2, 3, INF]) for (const showFrame of [false, true]) {
        const run = explainDeduction(b, givens, { level, showFrame });
        expect(run.solved).toBe(isSolvable(b, givens, { level, showFrame }));
        if (run.solved) solvedRuns++;
        const knownRound = new Map<number, number>(givens.map((g) => [g, 0]));
        for (const st of run.steps) knownRound.set(st.square, st.round);
        for (const st of run.steps) {
          expect(st.value).toBe(t.squares[st.square]!.s);
          expect(st.terms.length).toBeLessThanOrEqual(level);
          const a = arithmetic(st.text);
          expect(a.label).toBe(squareLabel(st.square));
          expect(a.expr).toBe(st.value);
          expect(a.result).toBe(st.value);
          for (const term of st.terms) {
            if (typeof term.ref === 'number') {
              expect(knownRound.get(term.ref)!).toBeLessThan(st.round);
              expect(term.value).toBe(t.squares[term.ref]!.s);
            } else {
              expect(showFrame).toBe(true);
              expect(term.value).toBe(term.ref === 'W' ? t.W : t.H);
            }
          }
        }
        expect(run.available.reduce((a, c) => a + c, 0)).toBe(run.steps.length);
      }
    }
    expect(solvedRuns).toBeGreaterThan(0);
  });

  it('a level as long as the longest possible chain is the same as the full closure', () => {
    for (const { tiling } of catalogue(11)) {
      const b = board(tiling);
      const longest = b.layout.horizontal.length + b.layout.vertical.length;
      for (const g of [[0], [1, 2], [3]]) {
        expect(isSolvable(b, g, { level: longest, showFrame: false })).toBe(isSolvable(b, g, { level: INF, showFrame: false }));
      }
    }
  });

  it('all sizes given means nothing to deduce; no given and no frame means nothing can be deduced', () => {
    const t = parseTiling('9 33 32 (18,15)(7,8)(14,4)(10,1)(9)');
    const b = board(t);
    const all = t.squares.map((_, i) => i);
    expect(explainDeduction(b, all, { level: 2, showFrame: false })).toMatchObject({ solved: true, steps: [] });
    expect(explainDeduction(b, [], { level: INF, showFrame: false })).toMatchObject({ solved: false, steps: [] });
  });

  it('writes the steps of the 33 x 32 rectangle as arithmetic on known lengths', () => {
    // 9 33 32 (18,15)(7,8)(14,4)(10,1)(9) (squaring.net); squares A..I in reading order
    const t = parseTiling('9 33 32 (18,15)(7,8)(14,4)(10,1)(9)');
    // A = 18 and F = 4 given. E hangs beside F under A: E = A - F; then G under F beside E: G = E - F
    const run = explainDeduction(board(t), [0, 5], { level: 2, showFrame: false });
    expect(run.steps.map((s) => `${s.round}: ${s.text}`)).toEqual(['1: E = 18 - 4 = 14', '2: G = 14 - 4 = 10']);
    expect(run.solved).toBe(false);
    // with C = 7 as well, H = F + C - G is a chain of three lengths: level 2 is stuck, level 3 solves
    expect(isSolvable(board(t), [0, 2, 5], { level: 2, showFrame: false })).toBe(false);
    expect(isSolvable(board(t), [0, 2, 5], { level: 3, showFrame: false })).toBe(true);
  });

  it('deduces through a cross (four squares meeting at a point are on one segment each way)', () => {
    // a 2 x 2 frame in four unit squares: one size gives all the others, each by one known length
    const t: Tiling = { W: 2, H: 2, squares: [{ x: 0, y: 0, s: 1 }, { x: 1, y: 0, s: 1 }, { x: 0, y: 1, s: 1 }, { x: 1, y: 1, s: 1 }] };
    const run = explainDeduction(board(t), [0], { level: 1, showFrame: false });
    expect(run.solved).toBe(true);
    expect(run.steps.map((s) => s.text)).toEqual(['B = 1 (as A)', 'C = 1 (as A)', 'D = 1 (as B)']);
  });

  it('a one-term step names the square it copies', () => {
    // two 2s side by side in a 4 x 2 frame: B hangs between the same top and bottom lines as A
    const t: Tiling = { W: 4, H: 2, squares: [{ x: 0, y: 0, s: 2 }, { x: 2, y: 0, s: 2 }] };
    const run = explainDeduction(board(t), [0], { level: 1, showFrame: false });
    expect(run.steps.map((s) => s.text)).toEqual(['B = 2 (as A)']);
  });

  it('the bug guard stops a deduction that disagrees with the true size', () => {
    const t = parseTiling('9 33 32 (18,15)(7,8)(14,4)(10,1)(9)');
    const b = board(t);
    const wrong = { layout: b.layout, sizes: b.sizes.map((s, i) => (i === 0 ? s + 1 : s)) };
    expect(() => explainDeduction(wrong, [0, 1, 2, 3], { level: INF, showFrame: true })).toThrow(/bug guard/);
  });

  it('labels squares A..Z, then AA, AB', () => {
    expect([0, 25, 26, 27, 51, 52].map(squareLabel)).toEqual(['A', 'Z', 'AA', 'AB', 'AZ', 'BA']);
  });
});
