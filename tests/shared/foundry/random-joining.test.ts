import { describe, expect, it } from 'vitest';
import { canonicalKey, classifyTiling, parseTiling, verifyTiling } from '../../../shared/tiling/index';
import { exhaustiveTilings } from '../../../shared/foundry/exhaustive';
import { joinCornerToCorner, joinStock } from '../../../shared/foundry/joining';
import { randomTilings } from '../../../shared/foundry/random-tilings';
import type { FoundTiling } from '../../../shared/foundry/found-tiling';

describe('random squared rectangles', () => {
  it('is reproducible from the seed and gives verified simple perfect rectangles in the order range', () => {
    const run = (seed: number) => {
      const out: FoundTiling[] = [];
      randomTilings({ count: 8, orderMin: 15, orderMax: 40, seed, onFound: (t) => out.push(t) });
      return out;
    };
    const a = run(2026);
    expect(a.map((t) => t.key)).toEqual(run(2026).map((t) => t.key));
    expect(a.map((t) => t.key)).not.toEqual(run(2027).map((t) => t.key));
    for (const t of a) {
      expect(verifyTiling(t.tiling)).toEqual({ ok: true });
      const c = classifyTiling(t.tiling);
      expect(c.simple && c.perfect).toBe(true);
      expect(c.order).toBeGreaterThanOrEqual(15);
      expect(c.order).toBeLessThanOrEqual(40);
    }
  });

  it('applies the largest-side and aspect filters', () => {
    const out: FoundTiling[] = [];
    randomTilings({ count: 4, orderMin: 12, orderMax: 15, maxSide: 80, aspectMin: 1.2, aspectMax: 1.6, seed: 9, onFound: (t) => out.push(t) });
    expect(out.length).toBe(4);
    for (const t of out) {
      expect(t.maxSize).toBeLessThanOrEqual(80);
      const r = t.width / t.height;
      expect(r).toBeGreaterThanOrEqual(1.2);
      expect(r).toBeLessThanOrEqual(1.6);
    }
  });

  it('rejects what the stock already has', () => {
    const first: string[] = [];
    randomTilings({ count: 3, orderMin: 9, orderMax: 10, seed: 1, onFound: (t) => first.push(t.key) });
    const known = new Set(first);
    const again: string[] = [];
    const s = randomTilings({ count: 3, orderMin: 9, orderMax: 10, seed: 1, isKnown: (k) => known.has(k), onFound: (t) => again.push(t.key) });
    expect(again.some((k) => known.has(k))).toBe(false);
    expect(s.rejectedKnown).toBeGreaterThan(0);
  });

  it('gives up after maxTries and validates its options', () => {
    // Order 9 has only two simple perfect rectangles (OEIS A002839), so a third cannot be found.
    const s = randomTilings({ count: 3, orderMin: 9, orderMax: 9, seed: 3, maxTries: 400 });
    expect(s.found).toBe(2);
    expect(s.exhaustedTries).toBe(true);
    expect(() => randomTilings({ count: 1, orderMin: 20, orderMax: 12, seed: 1 })).toThrow(/orderMax \(12\) is below orderMin \(20\)/);
    expect(() => randomTilings({ count: 1, orderMin: 9, orderMax: 41, seed: 1 })).toThrow(/orderMax must be an integer <= 40/);
  });
});

describe('joining stock rectangles into squared squares', () => {
  const parts: { id: string; tiling: FoundTiling['tiling'] }[] = [];
  for (let n = 9; n <= 14; n++) exhaustiveTilings({ order: n, onFound: (t) => { if (t.perfect) parts.push({ id: t.key, tiling: t.tiling }); } });

  it('offers only verified perfect squared squares whose side is a + b or a + b - c', () => {
    const out: FoundTiling[] = [];
    const s = joinStock(parts, { onFound: (t) => out.push(t) });
    expect(s.found).toBeGreaterThan(0);
    for (const t of out) {
      expect(verifyTiling(t.tiling)).toEqual({ ok: true });
      const c = classifyTiling(t.tiling);
      expect(c.square).toBe(true);
      expect(c.perfect).toBe(true);
      // made of two rectangles: always compound
      expect(c.simple).toBe(false);
      const [ida, idb] = t.origin.parts as [string, string];
      const [a, b] = ida.split(':')[0]!.split('x').map(Number) as [number, number];
      expect(idb.split(':')[0]).toBe(`${a}x${b}`);
      if (t.origin.construction === 'corner-to-corner') expect(t.width).toBe(a + b);
      else expect(t.width).toBe(a + b - (t.origin.shared as number));
    }
  });

  it('joins the two 928 x 705 rectangles of order 14 corner to corner into a 1633 square of order 30', () => {
    const pair = parts.filter((p) => p.id.startsWith('928x705:'));
    expect(pair.length).toBe(2);
    const t = joinCornerToCorner(pair[0]!.tiling, pair[1]!.tiling);
    expect(t).not.toBeNull();
    const c = classifyTiling(t!);
    expect([c.width, c.height, c.order, c.perfect]).toEqual([1633, 1633, 30, true]);
  });

  it('detects the compound 175 square of OEIS A181340 as compound and perfect', () => {
    // OEIS A181340 / A217155 (Willcocks 1948): compound perfect squared square of order 24, side 175.
    const t = parseTiling('24 175 175 (81,56,38)(18,20)(55,16,3)(1,5,14)(4)(9)(39)(51,30)(29,31,64)(43,8)(35,2)(33)');
    const c = classifyTiling(t);
    expect([c.square, c.perfect, c.simple]).toEqual([true, true, false]);
    expect(canonicalKey(t).startsWith('175x175:')).toBe(true);
  });
});
