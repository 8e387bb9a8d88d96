import type TestAgent from 'supertest/lib/agent';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { scaleText } from '../../../shared/contracts/tilings';
import { gcdOfKey, reducedFormOf } from '../../../server/areas/stock/tiling-analysis';
import { canonicalForm, parseTiling } from '../../../shared/tiling/index';
import { uploaded } from './upload-helper';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { order10Codes } from '../../fixtures/intake/order10';

// Issue 16: duplicates at scale. A tiling and its copy at 2x (every size doubled, a tiling
// of the same shape: the scaling keeps every square's place) are the same tiling to a desk.
// Detection works on the reduced tiling (divided by the gcd of all sizes) as well as up to
// symmetry; the queue's badge and the drawer say the same, read live.

/** The 57 x 55 of order 10 (squaring.net o10spsr.bkp, via tests/fixtures/intake/order10.ts), every size times k, in Bouwkamp code. */
function scaled(code: string, k: number): string {
  const [head, ...rest] = code.split(' (');
  const [order, w, h] = head!.split(' ').map(Number);
  return `${order} ${w! * k} ${h! * k} (${rest.join(' (').replace(/\d+/g, (n) => String(Number(n) * k))}`;
}

let t: TestApp;
let editor: TestAgent;
let setter: TestAgent;
beforeAll(async () => {
  t = await createTestApp();
  editor = await t.signInAs('editor');
  setter = await t.signInAs('setter');
});
afterAll(() => t.close());

describe('the reduced key', () => {
  it('is the same for a tiling, its mirror image and its copies at 2x and 3x, and differs between two tilings', () => {
    const base = parseTiling(order10Codes[0]!);
    const form = canonicalForm(base);
    const reduced = reducedFormOf(form.tiling, form.key);
    expect(reduced).toEqual({ reducedKey: form.key, gcd: 1 });
    for (const k of [2, 3]) {
      const f = canonicalForm(parseTiling(scaled(order10Codes[0]!, k)));
      expect(f.key).not.toBe(form.key); // the canonical key still tells them apart
      expect(reducedFormOf(f.tiling, f.key)).toEqual({ reducedKey: form.key, gcd: k });
      expect(gcdOfKey(f.key)).toBe(k);
    }
    const mirror = { W: base.W, H: base.H, squares: base.squares.map((q) => ({ x: base.W - q.x - q.s, y: q.y, s: q.s * 1 })) };
    const m2 = canonicalForm({ W: mirror.W * 2, H: mirror.H * 2, squares: mirror.squares.map((q) => ({ x: q.x * 2, y: q.y * 2, s: q.s * 2 })) });
    expect(reducedFormOf(m2.tiling, m2.key).reducedKey).toBe(form.key);
    const other = canonicalForm(parseTiling(order10Codes[1]!));
    expect(reducedFormOf(other.tiling, other.key).reducedKey).not.toBe(form.key);
  });

  it('writes scales in words', () => {
    expect(scaleText(2, 1)).toBe('2x');
    expect(scaleText(1, 2)).toBe('1/2x');
    expect(scaleText(6, 4)).toBe('3/2x');
    expect(scaleText(3, 3)).toBe('1x');
  });
});

describe('a copy at 2x', () => {
  it('is flagged "same as stock tiling N at 2x" on the way in, in the queue and in the drawer, and cannot be accepted', async () => {
    const first = (await setter.post('/api/submissions').send({ code: order10Codes[0], title: 'Original', source: 'paste' }).expect(201)).body;
    const twin = (await setter.post('/api/submissions').send({ code: scaled(order10Codes[0]!, 2), title: 'Twice as large', source: 'paste' }).expect(201)).body;
    // both pending: each is "also pending" against the other
    expect(twin.duplicateOf).toBe('pending');
    const queue = async () => (await editor.get('/api/submissions?status=pending').expect(200)).body.items as { id: number; duplicateOf: string | null; sameAs: { stockId: number; scale: string } | null }[];
    expect((await queue()).find((s) => s.id === first.id)).toMatchObject({ duplicateOf: 'pending', sameAs: null });

    // the original is accepted: the twin's badge follows at once (read live, not as stored)
    const accepted = (await editor.post(`/api/submissions/${first.id}/accept`).send({}).expect(200)).body;
    const stockId = accepted.stockId as number;
    expect((await queue()).find((s) => s.id === twin.id)).toMatchObject({ duplicateOf: 'stock', sameAs: { stockId, scale: '2x' } });
    const drawer = (await editor.get(`/api/submissions/${twin.id}`).expect(200)).body;
    expect(drawer.duplicates).toEqual({ stockId, scale: '2x', submissions: [{ id: first.id, status: 'accepted' }] });
    expect(drawer.sameAs).toEqual({ stockId, scale: '2x' });
    // the filter reads the same live state
    const dups = (await editor.get('/api/submissions?status=pending&duplicate=true').expect(200)).body.items.map((s: { id: number }) => s.id);
    expect(dups).toContain(twin.id);

    const refused = await editor.post(`/api/submissions/${twin.id}/accept`).send({}).expect(409);
    expect(refused.body.error.message).toBe(`this tiling is already in the stock: it is stock tiling ${stockId} at 2x; reject "Twice as large" as a duplicate instead`);

    // a check by a setter says "in the stock", never which tiling
    const check = (await setter.post('/api/tilings/check').send({ code: scaled(order10Codes[0]!, 3) }).expect(200)).body;
    expect(check).toMatchObject({ duplicate: true, duplicateOf: 'stock' });
    const mine = (await setter.get('/api/submissions').expect(200)).body.items.find((s: { id: number }) => s.id === twin.id);
    expect(mine).toMatchObject({ duplicateOf: 'stock', sameAs: null });
  });

  it('an accepted submission is not its own duplicate, and a file with a tiling twice at two scales flags the second line', async () => {
    const list = (await editor.get('/api/submissions?status=accepted').expect(200)).body.items;
    // its own stock row does not count; the 2x twin still waiting does
    expect(list[0]).toMatchObject({ duplicateOf: 'pending', sameAs: null });
    const file = `${order10Codes[2]}\n${scaled(order10Codes[2]!, 5)}\n`;
    const report = await uploaded(setter, Buffer.from(file), 'codes.txt');
    expect(report.lines.map((l) => `${l.verdict}:${l.duplicateOf ?? ''}`)).toEqual(['valid:', 'duplicate:this-file']);
  });
});
