import { describe, expect, it } from 'vitest';
import { parseFoundryArgs, runFoundryCli } from '../../../server/cli/foundry';

describe('foundry command line', () => {
  it('prints one JSON line per tiling and a summary line (order 9: OEIS A002839 = 2, A002881 = 1)', () => {
    const lines: string[] = [];
    runFoundryCli(['--order', '9'], (s) => lines.push(s));
    const parsed = lines.map((l) => JSON.parse(l) as Record<string, unknown>);
    const summary = parsed.at(-1)!.summary as Record<string, number>;
    expect(summary).toMatchObject({ order: 9, graphs: 2, simplePerfect: 2, simpleImperfect: 1, squares: 0 });
    const tilings = parsed.slice(0, -1);
    expect(tilings).toHaveLength(3);
    // squaring.net catalogue: the two simple perfect rectangles of order 9
    expect(tilings.filter((t) => t.perfect).map((t) => t.code).sort()).toEqual(['9 33 32 (18,15)(7,8)(14,4)(10,1)(9)', '9 69 61 (36,33)(5,28)(25,9,2)(7)(16)']);
    expect(Object.keys(tilings[0]!)).toEqual(['code', 'order', 'width', 'height', 'perfect', 'simple']);
  });

  it('random mode gives K tilings of the order with sides at most S, the same for the same seed', () => {
    const run = () => {
      const lines: string[] = [];
      runFoundryCli(['--order', '14', '--random', '--count', '3', '--max-side', '300', '--seed', '8'], (s) => lines.push(s));
      return lines;
    };
    const a = run();
    expect(a.slice(0, -1)).toEqual(run().slice(0, -1)); // the summary carries the time taken
    expect(a).toHaveLength(4);
    for (const l of a.slice(0, -1)) {
      const t = JSON.parse(l) as { order: number; code: string };
      expect(t.order).toBe(14);
      const sizes = t.code.replace(/^\d+ \d+ \d+ /, '').match(/\d+/g)!.map(Number);
      expect(Math.max(...sizes)).toBeLessThanOrEqual(300);
    }
  });

  it('rejects bad arguments with a message naming the option', () => {
    expect(() => parseFoundryArgs([])).toThrow(/--order N is required/);
    expect(() => parseFoundryArgs(['--order', 'x'])).toThrow(/--order must be a number/);
    expect(() => parseFoundryArgs(['--order', '9', '--colour', 'red'])).toThrow(/unknown option --colour/);
    expect(() => parseFoundryArgs(['--order', '30'])).toThrow(/exhaustive --order must be at most 25/);
    expect(() => parseFoundryArgs(['--order', '9', '--count'])).toThrow(/--count needs a value/);
  });
});
