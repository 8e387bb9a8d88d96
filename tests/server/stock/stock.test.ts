import request from 'supertest';
import type TestAgent from 'supertest/lib/agent';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { count, eq } from 'drizzle-orm';
import { parseTiling, classifyTiling, toBouwkamp, verifyTiling } from '../../../shared/tiling/index';
import { stock } from '../../../server/areas/stock/schema';
import { submission } from '../../../server/areas/intake/schema';
import { addToStock, markStockUsed } from '../../../server/areas/stock/stock';
import { listItemTiling, stockListSchema } from '../../../shared/contracts/stock';
import { seedDemoStock, wheelWithChords } from '../../../server/areas/intake/demo-seed';
import { solvePlaneNetwork } from '../../../shared/tiling/index';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { order9Code, order9bCode } from '../../fixtures/order9';
import { order10Codes, order21Square, order24Compound } from '../../fixtures/intake/order10';

let t: TestApp;
let editor: TestAgent;
const ids: Record<string, number> = {};
beforeAll(async () => {
  t = await createTestApp();
  editor = await t.signInAs('editor');
  const setterId = await t.createUser('setter');
  t.db.transaction((tx) => {
    ids.o9 = addToStock(tx, { tiling: parseTiling(order9Code), provenance: 'foundry', params: { run: 1 } }).id;
    ids.o9b = addToStock(tx, { tiling: parseTiling(order9bCode), provenance: 'foundry' }).id;
    ids.sq21 = addToStock(tx, { tiling: parseTiling(order21Square), provenance: 'demo' }).id;
    ids.c24 = addToStock(tx, { tiling: parseTiling(order24Compound), provenance: 'demo' }).id;
    order10Codes.forEach((c, i) => {
      ids[`o10_${i}`] = addToStock(tx, { tiling: parseTiling(c), provenance: 'setter', setterId }).id;
    });
  });
});
afterAll(() => t.close());

describe('addToStock', () => {
  it('is idempotent by canonical key: a turned copy returns the existing row', () => {
    // facts.md: (9,8,15)(1,7)(10)(4,18)(14) is the 33 x 32 turned to 32 x 33
    const again = t.db.transaction((tx) => addToStock(tx, { tiling: parseTiling('(9,8,15)(1,7)(10)(4,18)(14)'), provenance: 'demo' }));
    expect(again).toMatchObject({ id: ids.o9, created: false, canonicalKey: '33x32:18,15,7,8,14,4,10,1,9' });
    expect(t.db.select({ n: count() }).from(stock).get()!.n).toBe(10);
  });

  it('refuses a tiling that does not verify', () => {
    const bad = { W: 3, H: 2, squares: [{ x: 0, y: 0, s: 2 }, { x: 2, y: 0, s: 1 }] };
    expect(() => t.db.transaction((tx) => addToStock(tx, { tiling: bad, provenance: 'demo' }))).toThrow(/not a valid tiling/);
  });

  it('markStockUsed counts puzzles and the used filter follows', async () => {
    t.db.transaction((tx) => markStockUsed(tx, ids.o9b!));
    const used = await editor.get('/api/stock?used=used').expect(200);
    expect(used.body.items.map((i: { id: number }) => i.id)).toEqual([ids.o9b]);
    const unused = await editor.get('/api/stock?used=unused').expect(200);
    expect(unused.body.total).toBe(9);
    expect(() => t.db.transaction((tx) => markStockUsed(tx, 99999))).toThrow(/does not exist/);
  });
});

describe('GET /api/stock', () => {
  it('filters by order range (catalogue: 2 of order 9, 6 of order 10)', async () => {
    const r = await editor.get('/api/stock?orderMin=9&orderMax=10&pageSize=50').expect(200);
    expect(r.body.total).toBe(8);
    const o9 = await editor.get('/api/stock?orderMax=9').expect(200);
    expect(o9.body.total).toBe(2);
  });

  it('filters square, perfect, simple, width and height, provenance and setter', async () => {
    const sq = await editor.get('/api/stock?square=true').expect(200);
    expect(sq.body.items.map((i: { id: number }) => i.id).sort()).toEqual([ids.sq21, ids.c24].sort());
    const compound = await editor.get('/api/stock?simple=false').expect(200);
    expect(compound.body.items.map((i: { id: number }) => i.id)).toEqual([ids.c24]);
    const wide = await editor.get('/api/stock?widthMin=100&heightMax=100').expect(200);
    // 105 x 104 is out (height), 111 x 98, 115 x 94 and 130 x 79 are in (o10spsr.bkp)
    expect(wide.body.total).toBe(3);
    const foundry = await editor.get('/api/stock?provenance=foundry').expect(200);
    expect(foundry.body.total).toBe(2);
    const setterId = t.db.select({ id: stock.setterId }).from(stock).where(eq(stock.id, ids.o10_0!)).get()!.id!;
    const bySetter = await editor.get(`/api/stock?setterId=${setterId}`).expect(200);
    expect(bySetter.body.total).toBe(6);
    const perfect = await editor.get('/api/stock?perfect=false').expect(200);
    expect(perfect.body.total).toBe(0);
  });

  it('sorts and pages on the server', async () => {
    const a = await editor.get('/api/stock?sort=-width&pageSize=3').expect(200);
    expect(a.body.items.map((i: { width: number }) => i.width)).toEqual([175, 130, 115]);
    const b = await editor.get('/api/stock?sort=-width&pageSize=3&page=2').expect(200);
    expect(b.body.items.map((i: { width: number }) => i.width)).toEqual([112, 111, 105]);
    expect(b.body.total).toBe(10);
  });

  it('a row carries the squares of the canonical orientation, which draw the published tiling', async () => {
    const r = await editor.get('/api/stock?orderMax=9&sort=id').expect(200);
    const row = stockListSchema.parse(r.body).items.find((i) => i.id === ids.o9)!;
    const tiling = listItemTiling(row);
    // the order-9 33 x 32 rectangle (tests/fixtures/order9.ts): its canonical code, read back off the row
    expect(verifyTiling(tiling)).toEqual({ ok: true });
    expect(toBouwkamp(tiling, { header: true })).toBe('9 33 32 (18,15)(7,8)(14,4)(10,1)(9)');
    expect(row).not.toHaveProperty('canonicalCode');
  });

  it('rejects bad query parameters with 400 naming them', async () => {
    for (const [q, where] of [
      ['orderMin=abc', 'query.orderMin'],
      ['orderMin=12&orderMax=10', 'query.orderMin'],
      ['square=yes', 'query.square'],
      ['provenance=catalogue', 'query.provenance'],
      ['colour=red', 'query'],
      ['pageSize=0', 'query.pageSize'],
    ]) {
      const r = await editor.get(`/api/stock?${q}`).expect(400);
      expect(JSON.stringify(r.body.error.details)).toContain(where);
    }
  });

  it('is for editors and admins: setters and printers get 403, anonymous 401', async () => {
    for (const role of ['setter', 'printer'] as const) {
      const a = await t.signInAs(role);
      for (const path of ['/api/stock', `/api/stock/${ids.o9}`, '/api/stock/export.csv', '/api/stock/export.txt', '/api/stock/summary']) {
        await a.get(path).expect(403);
      }
    }
    await request(t.app).get('/api/stock').expect(401);
    await (await t.signInAs('admin')).get('/api/stock').expect(200);
  });
});

describe('GET /api/stock/:id', () => {
  it('gives drawing data, Smith diagram, codes, class, provenance and history', async () => {
    const r = await editor.get(`/api/stock/${ids.o9}`).expect(200);
    expect(r.body).toMatchObject({ canonicalCode: '9 33 32 (18,15)(7,8)(14,4)(10,1)(9)', provenance: 'foundry', params: { run: 1 }, order: 9 });
    expect(verifyTiling(r.body.tiling)).toEqual({ ok: true });
    expect(r.body.smith.nodes.map((n: { y: number }) => n.y)).toEqual([0, 15, 18, 22, 23, 32]);
    expect(r.body.history).toMatchObject({ puzzles: [], editions: [] });
    expect(r.body.history.events[0].kind).toBe('added');
    await editor.get('/api/stock/987654').expect(404);
    await editor.get('/api/stock/abc').expect(400);
  });

  it('lists submitted and accepted for a tiling that came through review', async () => {
    const setter = await t.signInAs('setter');
    // a tiling of our own engine (wheel W_7 with chords), not in the stock yet
    const r = solvePlaneNetwork(wheelWithChords(7, [[1, 3], [4, 6]]), { p: 0, q: 1 });
    if (!r.ok) throw new Error(r.message);
    const sub = (await setter.post('/api/submissions').send({ code: toBouwkamp(r.tiling, { header: true }), source: 'paste' }).expect(201)).body;
    expect(sub.duplicateOf).toBe(null);
    const acc = await editor.post(`/api/submissions/${sub.id}/accept`).send({}).expect(200);
    const d = await editor.get(`/api/stock/${acc.body.stockId}`).expect(200);
    expect(d.body.history.events.map((e: { kind: string }) => e.kind)).toEqual(['submitted', 'accepted']);
  });
});

describe('exports and summary', () => {
  it('exports the filtered selection as CSV with one row per tiling', async () => {
    const r = await editor.get('/api/stock/export.csv?orderMax=10').expect(200);
    expect(r.headers['content-type']).toMatch(/text\/csv/);
    expect(r.headers['content-disposition']).toMatch(/squarewright-stock\.csv/);
    const lines = r.text.trim().split(/\r\n/);
    expect(lines[0]).toBe('id,canonicalKey,canonicalCode,width,height,order,square,perfect,simple,provenance,useCount,createdAt,acceptedAt');
    expect(lines).toHaveLength(1 + 8);
  });

  it('exports a code file that our upload reads back: every line verifies', async () => {
    const r = await editor.get('/api/stock/export.txt?orderMin=10&orderMax=10').expect(200);
    const codes = r.text.split('\n').filter((l) => l && !l.startsWith('#'));
    expect(codes.sort()).toEqual([...order10Codes].sort());
    for (const c of codes) expect(classifyTiling(parseTiling(c)).perfect).toBe(true);
  });

  it('counts the stock by order', async () => {
    const r = await editor.get('/api/stock/summary').expect(200);
    const byOrder = Object.fromEntries(r.body.byOrder.map((b: { order: number; count: number }) => [b.order, b.count]));
    expect(byOrder[9]).toBe(2);
    expect(byOrder[10]).toBe(6);
    expect(r.body.byGrade).toEqual([]);
  });
});

describe('demo stock seeder', () => {
  it('makes ~20 verified tilings with our own engine and a few pending submissions', async () => {
    const d = await createTestApp({ demo: { seeders: [{ name: 'stock', seed: seedDemoStock }] } });
    try {
      const rows = d.db.select({ id: stock.id, provenance: stock.provenance, w: stock.width, h: stock.height, json: stock.squaresJson }).from(stock).all();
      expect(rows.filter((r) => r.provenance === 'demo')).toHaveLength(20);
      expect(rows.filter((r) => r.provenance === 'setter')).toHaveLength(1);
      const pending = d.db.select({ n: count() }).from(submission).where(eq(submission.status, 'pending')).get()!.n;
      expect(pending).toBe(3);
    } finally {
      await d.close();
    }
  });

  it('a wheel with a chord, solved by Kirchhoff’s laws, gives a tiling whose full size is the spanning-tree count', () => {
    // matrix-tree theorem (facts.md: width_full = tau(G - e)); for W_6 + chord 1-3 the engine's count must equal the reduced size times the gcd
    const r = solvePlaneNetwork(wheelWithChords(6, [[1, 3]]), { p: 0, q: 1 });
    if (!r.ok) throw new Error(r.message);
    expect(verifyTiling(r.tiling)).toEqual({ ok: true });
    expect(BigInt(r.tiling.W) * r.gcd).toBe(r.fullWidth);
    expect(BigInt(r.tiling.H) * r.gcd).toBe(r.fullHeight);
  });
});

describe('stock facts (the fast path addToStock uses)', () => {
  it('equal the engine’s canonicalCode, canonicalKey and classification on published and made tilings', async () => {
    const { stockFacts } = await import('../../../server/areas/stock/stock');
    const { canonicalCode, canonicalKey } = await import('../../../shared/tiling/index');
    const { sideBySide, wheelChordTilings } = await import('../../../server/areas/intake/demo-seed');
    // published: facts.md, OEIS A014530 / A181340, squaring.net o10spsr.bkp; made: our wheels and pairs of them
    const made = [...wheelChordTilings(6, 7, 1)].map((m) => m.tiling);
    const tilings = [order9Code, order9bCode, order21Square, order24Compound, ...order10Codes].map((c) => parseTiling(c));
    tilings.push(...made, sideBySide(tilings[0]!, tilings[1]!), sideBySide(made[0]!, made[3]!));
    for (const t of tilings) {
      const f = stockFacts(t);
      const c = classifyTiling(t);
      expect(f.canonicalCode).toBe(canonicalCode(t));
      expect(f.canonicalKey).toBe(canonicalKey(t));
      expect([f.perfect, f.simple]).toEqual([c.perfect, c.simple]);
    }
  });
});

describe('GET /api/stock/:id/image.png', () => {
  it('answers a PNG of the tiling in the proportions of the rectangle, and a thumbnail', async () => {
    const { PNG } = await import('pngjs');
    const parse = (buf: Buffer) => PNG.sync.read(buf);
    const r = await editor.get(`/api/stock/${ids.o9}/image.png`).buffer(true).parse((res, cb) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => cb(null, Buffer.concat(chunks)));
    }).expect(200);
    expect(r.headers['content-type']).toBe('image/png');
    const img = parse(r.body as Buffer);
    // 33 x 32 rectangle (facts.md): height / width = 32 / 33
    expect(Math.abs(img.height / img.width - 32 / 33)).toBeLessThan(0.01);
    const thumb = await editor.get(`/api/stock/${ids.o9}/image.png?size=thumb`).buffer(true).parse((res, cb) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => cb(null, Buffer.concat(chunks)));
    }).expect(200);
    expect(parse(thumb.body as Buffer).width).toBeLessThan(img.width);
    await editor.get(`/api/stock/${ids.o9}/image.png?size=huge`).expect(400);
    await editor.get('/api/stock/99999/image.png').expect(404);
    await (await t.signInAs('printer')).get(`/api/stock/${ids.o9}/image.png`).expect(403);
  });
});
