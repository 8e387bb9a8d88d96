import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { TilingInputError, parseTiling, readCode, tilingFromSquares, toBouwkamp, toTableCode, verifyTiling } from '../../../shared/tiling/index';
import { order9Tiling } from '../../fixtures/order9';
import { O21_112, O24_175, O9_33x32, O9_69x61, catalogue } from './helpers';

function errorOf(f: () => unknown): TilingInputError {
  try {
    f();
  } catch (e) {
    if (e instanceof TilingInputError) return e;
    throw new Error(`expected a TilingInputError, got ${String(e)}`);
  }
  throw new Error('expected a TilingInputError, nothing was thrown');
}

describe('parseTiling: decoding by the highest-then-leftmost rule', () => {
  it('places the 33 x 32 exactly as the published worked example', () => {
    // placement listed in the reference facts (squaring.net "Bouwkamp code" conventions)
    const t = parseTiling(O9_33x32);
    expect(t.W).toBe(33);
    expect(t.H).toBe(32);
    expect(t.squares).toEqual(order9Tiling.squares);
  });

  it('decodes every named tiling (squaring.net, OEIS A014530, OEIS A181340) into a verified tiling', () => {
    for (const code of [O9_33x32, O9_69x61, O21_112, O24_175]) {
      const t = parseTiling(code);
      expect(verifyTiling(t)).toEqual({ ok: true });
      expect(toBouwkamp(t)).toBe(code);
    }
  });

  it('decodes all 310 catalogue codes of orders 9 to 13 with their caption ignored (squaring.net catalogue)', () => {
    const all = catalogue();
    expect(all.length).toBe(310); // A002839: 2 + 6 + 22 + 67 + 213
    for (const { order, code } of all) {
      const t = parseTiling(code);
      expect(t.squares.length).toBe(order);
    }
  });

  it('reads the same tiling with or without header, with (), [] or {} groups, commas or spaces', () => {
    const ref = parseTiling(O9_33x32);
    for (const variant of [
      '(18,15)(7,8)(14,4)(10,1)(9)',
      '9 33 32 [18,15][7,8][14,4][10,1][9]',
      '9 33 32 {18 15} {7 8} {14 4} {10 1} {9}',
      '9, 33, 32, (18, 15) (7, 8) (14, 4) (10, 1) (9) * 9 : 33x32A',
      '  9 33 32\n(18,15)(7,8)\n(14,4)(10,1)(9)  ',
      '9 33 32 18 15 7 8 14 4 10 1 9',
      '18 15 7 8 14 4 10 1 9',
      '18,15,7,8,14,4,10,1,9 * caption with (brackets) and 12 numbers',
    ]) {
      expect(parseTiling(variant), variant).toEqual(ref);
    }
  });

  it('reads table code without a header by trying each prefix sum as the width', () => {
    const t = parseTiling(toTableCode(parseTiling(O21_112), { header: false }));
    expect([t.W, t.H]).toEqual([112, 112]);
  });

  it('accepts explicit squares as JSON text and as an object', () => {
    const json = JSON.stringify({ width: 33, height: 32, squares: parseTiling(O9_33x32).squares.map((q) => ({ x: q.x, y: q.y, size: q.s })) });
    expect(parseTiling(json)).toEqual(parseTiling(O9_33x32));
    expect(tilingFromSquares(JSON.parse(json)).squares.length).toBe(9);
  });
});

describe('parseTiling: precise errors', () => {
  it('names the element, its size, the free segment and its position when a size is too wide', () => {
    // (14,4) swapped into (14,10): element 6 is 10, and only 4 is free right of the 14 at y=18
    const e = errorOf(() => parseTiling('9 33 32 (18,15)(7,8)(14,10)(4,1)(9)'));
    expect(e.code).toBe('too-wide');
    expect(e.message).toBe('element 6 (size 10) is wider than the free segment (4) at x=14, y=18');
    expect(e.where).toEqual({ line: 1, column: 25, element: 6, group: 3 });
  });

  it('says which group does not fill its segment', () => {
    const e = errorOf(() => parseTiling('(18,15)(7)(8)(14,4)(10,1)(9)'));
    expect(e.code).toBe('group-short');
    expect(e.message).toBe('group 2 fills 7 of its free segment (15) at x=18, y=15; a group must fill its segment exactly');
    expect(e.where?.group).toBe(2);
  });

  it('says which group holds one square too many', () => {
    const e = errorOf(() => parseTiling('(18,15)(7,8,1)(14,4)(10)(9)'));
    expect(e.code).toBe('group-overfull');
    expect(e.message).toContain('group 2 already fills its free segment (15) at x=18, y=15; element 5 (size 1)');
  });

  it('rejects squares reaching below the bottom and codes that leave the rectangle incomplete', () => {
    expect(errorOf(() => parseTiling('9 33 20 (18,15)(7,8)(14,4)(10,1)(9)')).code).toBe('too-tall');
    const e = errorOf(() => parseTiling('8 33 32 (18,15)(7,8)(14,4)(10,1)'));
    expect(e.code).toBe('incomplete');
    expect(e.message).toBe('the squares leave the 33 x 32 rectangle incomplete: the free segment (9) at x=24, y=23 is not covered');
    expect(errorOf(() => parseTiling('10 33 32 (18,15)(7,8)(14,4)(10,1)(9)(3)')).code).toBe('too-many-squares');
  });

  it('rejects a header that disagrees with the code', () => {
    const e = errorOf(() => parseTiling('10 33 32 (18,15)(7,8)(14,4)(10,1)(9)'));
    expect(e.code).toBe('header-mismatch');
    expect(e.message).toBe('the header gives order 10 but the code lists 9 sizes');
    expect(errorOf(() => parseTiling('33 32 (18,15)(7,8)(14,4)(10,1)(9)')).code).toBe('bad-header');
    expect(errorOf(() => parseTiling('9 0 32 (18,15)(7,8)(14,4)(10,1)(9)')).code).toBe('non-positive');
  });

  it('rejects non-numbers, fractions, zero and negative sizes with their column', () => {
    const a = errorOf(() => parseTiling('9 33 32 (18,15)(7,x)(14,4)(10,1)(9)'));
    expect(a.code).toBe('not-a-number');
    expect(a.where).toEqual({ line: 1, column: 19 });
    expect(errorOf(() => parseTiling('(18,15)(7.5,8)')).code).toBe('not-an-integer');
    expect(errorOf(() => parseTiling('(18,15)(7e2,8)')).code).toBe('not-an-integer');
    const z = errorOf(() => parseTiling('9 33 32 (18,15)(7,8)(14,4)(10,1)(0)'));
    expect(z.code).toBe('non-positive');
    expect(z.where?.element).toBe(9);
    expect(errorOf(() => parseTiling('(18,-15)')).code).toBe('non-positive');
  });

  it('rejects broken brackets', () => {
    expect(errorOf(() => parseTiling('(18,15(7,8)')).message).toContain('groups cannot nest');
    expect(errorOf(() => parseTiling('(18,15]')).code).toBe('bad-bracket');
    expect(errorOf(() => parseTiling('18,15)')).code).toBe('bad-bracket');
    expect(errorOf(() => parseTiling('(18,15')).message).toContain('is never closed');
    expect(errorOf(() => parseTiling('(18,15)()')).code).toBe('empty-group');
    expect(errorOf(() => parseTiling('(18,15) 7 (8)')).code).toBe('outside-group');
    expect(errorOf(() => parseTiling('   ')).code).toBe('empty');
    expect(errorOf(() => parseTiling('* only a caption')).code).toBe('empty');
  });

  it('guards the limits: 2^31, 2000 squares, 64 kB', () => {
    expect(errorOf(() => parseTiling('(2147483649)')).code).toBe('too-large');
    expect(errorOf(() => parseTiling('9'.repeat(400))).code).toBe('too-large');
    const many = `(${Array.from({ length: 2001 }, () => '1').join(',')})`;
    expect(errorOf(() => parseTiling(many)).code).toBe('too-many');
    expect(errorOf(() => parseTiling(' '.repeat(65_537))).code).toBe('too-long');
    expect(errorOf(() => parseTiling(42 as unknown as string)).code).toBe('not-text');
  });

  it('accepts the largest allowed side and 2000 squares without hanging', () => {
    expect(parseTiling('1 2147483648 2147483648 (2147483648)').W).toBe(2 ** 31);
    // a 2000 x 1 strip of unit squares
    const strip = parseTiling(`(${Array.from({ length: 2000 }, () => '1').join(',')})`);
    expect([strip.W, strip.H, strip.squares.length]).toEqual([2000, 1, 2000]);
  });

  it('reports a table code without header that fits no rectangle', () => {
    expect(errorOf(() => parseTiling('5 3 2')).code).toBe('no-frame');
  });

  it('reads headerless table code in the W < H orientation too (32 x 33 image of the 33 x 32, reference facts)', () => {
    expect(parseTiling('18 14 4 10 15 7 1 9 8')).toMatchObject({ W: 32, H: 33 });
  });

  it('gives up on headerless table code after a bounded number of width guesses, never hanging', () => {
    // 1616 unit squares and one 848: the area 1616 + 848^2 = 720720 has 240 divisors, and every
    // width below 848 made of the leading ones fails on the 848, so the guesses run out
    const code = [...Array.from({ length: 1616 }, () => '1'), '848'].join(' ');
    const e = errorOf(() => parseTiling(code));
    expect(e.code).toBe('no-frame');
    expect(e.message).toContain('first 64 candidates');
  });

  it('rejects bad explicit squares with the square number', () => {
    expect(errorOf(() => tilingFromSquares({ width: 2, height: 1, squares: [{ x: 0, y: 0, size: 1 }, { x: 0, y: 0, size: 1 }] })).message).toContain('overlaps');
    const e = errorOf(() => tilingFromSquares({ width: 2, height: 1, squares: [{ x: 0, y: 0, size: 1 }, { x: 1, y: 0, size: 0 }] }));
    expect(e.where).toEqual({ square: 2 });
    expect(errorOf(() => tilingFromSquares({ width: -1, height: 1, squares: [] })).code).toBe('bad-squares');
    expect(errorOf(() => tilingFromSquares({ width: 1, height: 1, squares: [] })).code).toBe('empty');
    expect(errorOf(() => tilingFromSquares(null as never)).code).toBe('bad-squares');
    expect(errorOf(() => parseTiling('{"width": 1, "height": ')).code).toBe('bad-json');
  });

  it('readCode reports the header and groups', () => {
    expect(readCode(O9_33x32)).toMatchObject({ header: { order: 9, W: 33, H: 32 }, groupOf: [1, 1, 2, 2, 3, 3, 4, 4, 5] });
  });
});

describe('parseTiling: property tests (fast-check, seeded)', () => {
  const codes = catalogue().map((c) => c.code.split('*')[0]!.trim());

  it('a mutated catalogue code is either a valid tiling or rejected with a TilingInputError, never anything else', () => {
    fc.assert(
      fc.property(
        fc.constantFrom(...codes),
        fc.nat(),
        fc.constantFrom('delete', 'insert', 'replace'),
        fc.constantFrom(...'0123456789(),[]{} -x*.'.split('')),
        (code, pos, op, ch) => {
          const i = pos % code.length;
          const mutated = op === 'delete' ? code.slice(0, i) + code.slice(i + 1) : op === 'insert' ? code.slice(0, i) + ch + code.slice(i) : code.slice(0, i) + ch + code.slice(i + 1);
          try {
            const t = parseTiling(mutated);
            expect(verifyTiling(t)).toEqual({ ok: true });
          } catch (e) {
            expect(e).toBeInstanceOf(TilingInputError);
            expect((e as TilingInputError).message.length).toBeGreaterThan(10);
          }
        },
      ),
      { seed: 20261202, numRuns: 3000 },
    );
  });

  it('random sequences of sizes never crash or hang the decoder', () => {
    fc.assert(
      fc.property(fc.array(fc.integer({ min: 1, max: 60 }), { minLength: 1, maxLength: 40 }), fc.boolean(), (sizes, grouped) => {
        const text = grouped ? `(${sizes.slice(0, 2).join(',')})${sizes.slice(2).map((s) => `(${s})`).join('')}` : sizes.join(' ');
        try {
          expect(verifyTiling(parseTiling(text))).toEqual({ ok: true });
        } catch (e) {
          expect(e).toBeInstanceOf(TilingInputError);
        }
      }),
      { seed: 7, numRuns: 2000 },
    );
  });
});
