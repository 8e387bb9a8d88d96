import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { order9Code, order9bCode } from '../../fixtures/order9';
import { order21Square, order24Compound } from '../../fixtures/intake/order10';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

describe('POST /api/tilings/check', () => {
  it('gives the verdict of the published 33 x 32 rectangle: valid, order 9, perfect, simple, canonical code', async () => {
    const setter = await t.signInAs('setter');
    const res = await setter.post('/api/tilings/check').send({ code: order9Code }).expect(200);
    // squaring.net catalogue / facts.md: 9 33 32 (18,15)(7,8)(14,4)(10,1)(9) is simple, perfect and canonical
    expect(res.body).toMatchObject({ valid: true, order: 9, width: 33, height: 32, perfect: true, simple: true, square: false, duplicate: false });
    expect(res.body.canonicalCode).toBe('9 33 32 (18,15)(7,8)(14,4)(10,1)(9)');
    expect(res.body.tiling.squares).toHaveLength(9);
    // facts.md: its Smith diagram has segments at y = 0, 15, 18, 22, 23, 32
    expect(res.body.smith.nodes.map((n: { y: number }) => n.y)).toEqual([0, 15, 18, 22, 23, 32]);
  });

  it('finds the canonical code of a turned copy (facts.md lists (14,10,9)(1,8)(4,7)(18)(15) as an orientation)', async () => {
    const editor = await t.signInAs('editor');
    const res = await editor.post('/api/tilings/check').send({ code: '(14,10,9)(1,8)(4,7)(18)(15)' }).expect(200);
    expect(res.body.canonicalCode).toBe('9 33 32 (18,15)(7,8)(14,4)(10,1)(9)');
  });

  it('classifies the order-24 squared square as compound with its 94 x 111 block (OEIS A181340)', async () => {
    const editor = await t.signInAs('editor');
    const res = await editor.post('/api/tilings/check').send({ code: order24Compound }).expect(200);
    expect(res.body).toMatchObject({ valid: true, order: 24, width: 175, height: 175, square: true, perfect: true, simple: false });
    const dims = res.body.classification.subRectangles.map((r: { w: number; h: number }) => [Math.min(r.w, r.h), Math.max(r.w, r.h)]);
    expect(dims).toContainEqual([94, 111]);
  });

  it('says what is wrong and where for a code that does not close', async () => {
    const setter = await t.signInAs('setter');
    const res = await setter.post('/api/tilings/check').send({ code: '9 33 32 (18,15)(7,8)(14,5)(10,1)(9)' }).expect(200);
    expect(res.body.valid).toBe(false);
    expect(res.body.error.message).toMatch(/element 6/);
    expect(res.body.error.where).toMatchObject({ element: 6 });
  });

  it('points at the column of a character that is not a number', async () => {
    const setter = await t.signInAs('setter');
    const res = await setter.post('/api/tilings/check').send({ code: '(18,x)' }).expect(200);
    expect(res.body).toMatchObject({ valid: false, error: { where: { column: 5 } } });
  });

  it('rejects an empty or missing code with 400 naming body.code', async () => {
    const setter = await t.signInAs('setter');
    for (const body of [{ code: '   ' }, {}, { code: 12 }]) {
      const res = await setter.post('/api/tilings/check').send(body).expect(400);
      expect(res.body.error.code).toBe('bad_request');
      expect(JSON.stringify(res.body.error.details)).toContain('body.code');
    }
  });

  it('rejects a code longer than 64 kB with 400', async () => {
    const setter = await t.signInAs('setter');
    await setter.post('/api/tilings/check').send({ code: '1,'.repeat(40_000) }).expect(400);
  });

  it('stores nothing and is open to setters, editors and admins but not printers or anonymous callers', async () => {
    for (const role of ['setter', 'editor', 'admin'] as const) {
      const a = await t.signInAs(role);
      await a.post('/api/tilings/check').send({ code: order9bCode }).expect(200);
    }
    const printer = await t.signInAs('printer');
    await printer.post('/api/tilings/check').send({ code: order9bCode }).expect(403);
    await request(t.app).post('/api/tilings/check').send({ code: order9bCode }).expect(401);
    const editor = await t.signInAs('editor');
    const list = await editor.get('/api/submissions').expect(200);
    expect(list.body.total).toBe(0);
  });

  it('accepts the order-21 squared square (OEIS A014530) as perfect and simple', async () => {
    const setter = await t.signInAs('setter');
    const res = await setter.post('/api/tilings/check').send({ code: order21Square }).expect(200);
    expect(res.body).toMatchObject({ valid: true, order: 21, width: 112, height: 112, square: true, perfect: true, simple: true });
  });
});
