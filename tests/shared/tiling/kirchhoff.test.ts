import { describe, expect, it } from 'vitest';
import { checkKirchhoff, parseTiling, type Tiling } from '../../../shared/tiling/index';
import { O21_112, O24_175, catalogue } from './helpers';

describe("checkKirchhoff: Kirchhoff's current and voltage laws on both Smith diagrams (BSST 1940)", () => {
  it('hold for every catalogue tiling, the 112 and the 175 squares', () => {
    for (const { code } of [...catalogue(), { code: O21_112 }, { code: O24_175 }]) {
      expect(checkKirchhoff(parseTiling(code)), code).toEqual({ ok: true, violations: [] });
    }
  });

  it('hold for a tiling with a cross', () => {
    expect(checkKirchhoff(parseTiling('(1,1)(1,1)')).ok).toBe(true);
  });

  it('report the node where the current law fails, in a tiling with a gap', () => {
    // 33 x 32 with the 9 at the bottom right missing: current 9 never reaches the bottom
    const t = parseTiling('9 33 32 (18,15)(7,8)(14,4)(10,1)(9)');
    const broken: Tiling = { ...t, squares: t.squares.slice(0, 8) };
    const r = checkKirchhoff(broken);
    expect(r.ok).toBe(false);
    const current = r.violations.filter((v) => v.law === 'current' && v.direction === 'horizontal');
    expect(current.map((v) => v.message)).toContain('current law fails at the horizontal segment at y=23 (x 24..33): 9 flows in and 0 flows out; they should balance');
    expect(current.map((v) => v.message)).toContain('current law fails at the horizontal segment at y=32 (x 0..24): 24 flows in and 0 flows out; it should absorb 33');
  });

  it('report a square that no potential reaches from the pole (voltage law), in overlapping squares', () => {
    // a 3 x 3 square with a stray 1 floating inside it
    const t: Tiling = { W: 3, H: 3, squares: [{ x: 0, y: 0, s: 3 }, { x: 1, y: 1, s: 1 }] };
    const r = checkKirchhoff(t);
    expect(r.ok).toBe(false);
    expect(r.violations).toContainEqual({ law: 'voltage', direction: 'horizontal', square: 1, message: 'square 2 (size 1) is not connected to the top pole in the horizontal network' });
    expect(r.violations).toContainEqual({
      law: 'current',
      direction: 'vertical',
      node: 1,
      message: 'current law fails at the vertical segment at x=1 (y 1..2): 0 flows in and 1 flows out; they should balance',
    });
  });

  it('report a missing pole and malformed input', () => {
    expect(checkKirchhoff({ W: 3, H: 3, squares: [{ x: 1, y: 1, s: 1 }] }).violations[0]!.message).toMatch(/no top pole/);
    expect(checkKirchhoff(null as never).ok).toBe(false);
  });

  it('regression (found by fuzzing): a zero-size square at y = -1 is reported, not a crash', () => {
    const r = checkKirchhoff({ W: 0, H: 0, squares: [{ x: 0, y: -1, s: 0 }] });
    expect(r.ok).toBe(false);
    expect(r.violations[0]!.message).toMatch(/^not a tiling/);
    // negative coordinates with valid sizes reach the segment builder and are reported too
    const shifted = checkKirchhoff({ W: 2, H: 1, squares: [{ x: -1, y: 0, s: 1 }, { x: 1, y: 0, s: 1 }] });
    expect(shifted.ok).toBe(false);
  });
});
