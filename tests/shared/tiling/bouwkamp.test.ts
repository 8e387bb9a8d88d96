import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { canonicalCode, edgesOf, mulberry32, parseTiling, randomCNet, solvePlaneNetwork, toBouwkamp, toTableCode } from '../../../shared/tiling/index';
import { O24_175, O9_33x32, catalogue, withoutCaption, greedyTiling } from './helpers';

describe('toBouwkamp', () => {
  it('writes the groups of the squares hanging from one segment (squaring.net "Bouwkamp code")', () => {
    expect(toBouwkamp(parseTiling('18 15 7 8 14 4 10 1 9'))).toBe(O9_33x32);
    expect(toBouwkamp(parseTiling(O9_33x32), { header: false })).toBe('(18,15)(7,8)(14,4)(10,1)(9)');
    expect(toTableCode(parseTiling(O9_33x32))).toBe('9 33 32 18 15 7 8 14 4 10 1 9');
  });

  it('round-trips every catalogue code and the 175 square', () => {
    for (const { code } of catalogue()) expect(toBouwkamp(parseTiling(code))).toBe(withoutCaption(code));
    expect(toBouwkamp(parseTiling(O24_175))).toBe(O24_175);
  });

  it('decode(encode(t)) = t for random tilings, with and without header, bracketed or table code (fast-check, seeded)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 20 }), fc.integer({ min: 1, max: 20 }), fc.array(fc.integer({ min: 1, max: 8 }), { minLength: 60, maxLength: 60 }), (W, H, picks) => {
        const t = greedyTiling(W, H, picks);
        const sorted = { W, H, squares: t.squares.slice().sort((a, b) => a.y - b.y || a.x - b.x) };
        expect(parseTiling(toBouwkamp(t))).toEqual(sorted);
        expect(parseTiling(toBouwkamp(t, { header: false }))).toEqual(sorted);
        expect(parseTiling(toTableCode(t))).toEqual(sorted);
        expect(canonicalCode(parseTiling(canonicalCode(t)))).toBe(canonicalCode(t));
      }),
      { seed: 99, numRuns: 500 },
    );
  });

  it('round-trips tilings solved from seeded random c-nets of orders 9 to 40', () => {
    const rng = mulberry32(77);
    let n = 0;
    while (n < 150) {
      const g = randomCNet(10 + Math.floor(rng() * 31), rng);
      const es = edgesOf(g);
      const [p, q] = es[Math.floor(rng() * es.length)]!;
      const r = solvePlaneNetwork(g, { p, q });
      if (!r.ok) continue;
      n++;
      const code = toBouwkamp(r.tiling);
      expect(toBouwkamp(parseTiling(code))).toBe(code);
      expect(canonicalCode(parseTiling(canonicalCode(r.tiling)))).toBe(canonicalCode(r.tiling));
    }
  });
});
