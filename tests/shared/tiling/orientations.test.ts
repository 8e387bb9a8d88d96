import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { canonicalCode, canonicalForm, canonicalKey, canonicalTiling, orientations, parseTiling, toBouwkamp, verifyTiling } from '../../../shared/tiling/index';
import { O21_112, O9_33x32, catalogue, withoutCaption, greedyTiling } from './helpers';

describe('orientations and the canonical code', () => {
  it('gives the eight orientations of the 33 x 32 listed in the reference facts (squaring.net)', () => {
    const all = orientations(parseTiling(O9_33x32), { all: true }).map((o) => `${o.W} ${o.H} ${toBouwkamp(o, { header: false })}`);
    expect(all.sort()).toEqual(
      [
        '33 32 (18,15)(7,8)(14,4)(10,1)(9)',
        '33 32 (15,18)(8,7)(4,14)(1,10)(9)',
        '33 32 (14,10,9)(1,8)(4,7)(18)(15)',
        '33 32 (9,10,14)(8,1)(7,4)(18)(15)',
        '32 33 (18,14)(4,10)(15,7)(1,9)(8)',
        '32 33 (14,18)(10,4)(7,15)(9,1)(8)',
        '32 33 (15,8,9)(7,1)(10)(18,4)(14)',
        '32 33 (9,8,15)(1,7)(10)(4,18)(14)',
      ].sort(),
    );
  });

  it('has 4 orientations with W >= H for a rectangle and 8 for a square', () => {
    expect(orientations(parseTiling(O9_33x32)).length).toBe(4);
    expect(orientations(parseTiling(O21_112)).length).toBe(8);
    expect(orientations(parseTiling(O21_112), { all: true }).length).toBe(8);
  });

  it('every catalogue code is already canonical (squaring.net catalogue lists canonical codes)', () => {
    for (const { code } of catalogue()) expect(canonicalCode(parseTiling(code))).toBe(withoutCaption(code));
  });

  it('the canonical code of any orientation is the same (fast-check, seeded)', () => {
    const codes = catalogue().map((c) => c.code);
    fc.assert(
      fc.property(fc.constantFrom(...codes), fc.nat(7), (code, k) => {
        const t = parseTiling(code);
        const o = orientations(t, { all: true })[k]!;
        expect(verifyTiling(o)).toEqual({ ok: true });
        expect(canonicalCode(o)).toBe(canonicalCode(t));
        expect(canonicalKey(o)).toBe(canonicalKey(t));
      }),
      { seed: 3, numRuns: 300 },
    );
  });

  it('the canonical tiling is the lexicographically largest among W >= H orientations, also for imperfect tilings', () => {
    fc.assert(
      fc.property(fc.integer({ min: 2, max: 12 }), fc.integer({ min: 2, max: 12 }), fc.array(fc.integer({ min: 1, max: 6 }), { minLength: 50, maxLength: 50 }), (W, H, picks) => {
        const t = greedyTiling(W, H, picks);
        const c = canonicalTiling(t);
        expect(c.W).toBeGreaterThanOrEqual(c.H);
        const seq = (x: typeof c) => x.squares.map((q) => q.s);
        for (const o of orientations(t)) {
          const a = seq(o);
          const b = seq(c);
          const i = a.findIndex((v, j) => v !== b[j]);
          if (i >= 0) expect(a[i]!).toBeLessThan(b[i]!);
        }
      }),
      { seed: 11, numRuns: 300 },
    );
  });

  it('canonicalForm gives the canonical orientation, code and key of one canonicalisation (facts.md worked example)', () => {
    // facts.md: the canonical code of every orientation of the 33 x 32 is (18,15)(7,8)(14,4)(10,1)(9)
    for (const o of orientations(parseTiling(O9_33x32), { all: true })) {
      const f = canonicalForm(o);
      expect(f.code).toBe('9 33 32 (18,15)(7,8)(14,4)(10,1)(9)');
      expect(f.key).toBe('33x32:18,15,7,8,14,4,10,1,9');
      expect(f.tiling).toEqual(canonicalTiling(o));
    }
    for (const { code } of catalogue()) {
      const f = canonicalForm(parseTiling(code));
      expect(f.code).toBe(withoutCaption(code));
      expect(f.key).toBe(canonicalKey(parseTiling(code)));
    }
  });

  it('keys the 33 x 32 as documented in the API contract', () => {
    expect(canonicalKey(parseTiling('(9,10,14)(8,1)(7,4)(18)(15)'))).toBe('33x32:18,15,7,8,14,4,10,1,9');
  });

  it('orders squares correctly with coordinates near 2^31 (comparator fallback past 2^52 packed keys)', () => {
    const s = 2 ** 30;
    // a 2^31 x 2^30 rectangle of two halves, the left half cut in four
    const t = { W: 2 * s, H: s, squares: [{ x: s, y: 0, s }, { x: 0, y: 0, s: s / 2 }, { x: s / 2, y: 0, s: s / 2 }, { x: 0, y: s / 2, s: s / 2 }, { x: s / 2, y: s / 2, s: s / 2 }] };
    expect(canonicalCode(t)).toBe(`5 ${2 * s} ${s} (${s},${s / 2},${s / 2})(${s / 2},${s / 2})`);
    expect(orientations(t, { all: true }).every((o) => verifyTiling(o).ok)).toBe(true);
  });
});
