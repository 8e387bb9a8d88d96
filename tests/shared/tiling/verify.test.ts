import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { parseTiling, verifyTiling, type Tiling } from '../../../shared/tiling/index';
import { O9_33x32, greedyTiling } from './helpers';

const base = () => parseTiling(O9_33x32);

describe('verifyTiling: inside + disjoint + total area (engine.md section 3, common practice)', () => {
  it('accepts the worked 33 x 32 (squaring.net)', () => {
    expect(verifyTiling(base())).toEqual({ ok: true });
  });

  it('rejects a square outside the frame, naming it', () => {
    const t = base();
    t.squares[8] = { x: 25, y: 23, s: 9 };
    expect(verifyTiling(t)).toEqual({ ok: false, square: 8, message: 'square 9 (size 9 at x=25, y=23) lies outside the 33 x 32 frame' });
  });

  it('rejects overlapping squares, naming both', () => {
    const t: Tiling = { W: 2, H: 2, squares: [{ x: 0, y: 0, s: 1 }, { x: 0, y: 0, s: 1 }, { x: 1, y: 0, s: 1 }, { x: 1, y: 1, s: 1 }] };
    expect(verifyTiling(t)).toEqual({ ok: false, square: 1, message: 'square 1 (size 1 at x=0, y=0) overlaps square 2 (size 1 at x=0, y=0)' });
  });

  it('rejects an area mismatch', () => {
    const t = base();
    t.squares.pop();
    expect(verifyTiling(t)).toEqual({ ok: false, message: 'the squares cover an area of 975, the frame 33 x 32 = 1056' });
  });

  it('rejects malformed values', () => {
    expect(verifyTiling({ W: 1.5, H: 1, squares: [] }).ok).toBe(false);
    expect(verifyTiling({ W: 1, H: 0, squares: [] }).ok).toBe(false);
    expect(verifyTiling({ W: 1, H: 1, squares: [] })).toEqual({ ok: false, message: 'a tiling needs at least one square' });
    expect(verifyTiling({ W: 1, H: 1, squares: [{ x: 0, y: 0, s: 0 }] }).ok).toBe(false);
    expect(verifyTiling({ W: 1, H: 1, squares: [{ x: 0, y: Number.NaN, s: 1 }] }).ok).toBe(false);
    expect(verifyTiling({ W: 1, H: 1, squares: [null as never] }).ok).toBe(false);
    expect(verifyTiling(null as never).ok).toBe(false);
    expect(verifyTiling({ W: 2001, H: 1, squares: Array.from({ length: 2001 }, (_, i) => ({ x: i, y: 0, s: 1 })) }).ok).toBe(false);
  });

  it('checks the area exactly beyond 2^53 (BigInt path)', () => {
    const s = 2 ** 30;
    const ok: Tiling = { W: 2 * s, H: s, squares: [{ x: 0, y: 0, s }, { x: s, y: 0, s }] };
    expect(verifyTiling(ok)).toEqual({ ok: true });
    const bad: Tiling = { W: 2 * s, H: s + 1, squares: [{ x: 0, y: 0, s }, { x: s, y: 0, s }] };
    expect(verifyTiling(bad).ok).toBe(false);
  });

  it('random valid tilings verify and moving one square breaks them (fast-check, seeded)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 2, max: 15 }), fc.integer({ min: 2, max: 15 }), fc.array(fc.integer({ min: 1, max: 7 }), { minLength: 80, maxLength: 80 }), fc.nat(), fc.constantFrom([1, 0], [-1, 0], [0, 1], [0, -1]), (W, H, picks, k, [dx, dy]) => {
        const t = greedyTiling(W, H, picks);
        expect(verifyTiling(t)).toEqual({ ok: true });
        const i = k % t.squares.length;
        const q = t.squares[i]!;
        t.squares[i] = { x: q.x + dx!, y: q.y + dy!, s: q.s };
        expect(verifyTiling(t).ok).toBe(false);
      }),
      { seed: 5, numRuns: 500 },
    );
  });
});
