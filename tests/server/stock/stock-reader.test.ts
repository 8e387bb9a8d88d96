import { eq } from 'drizzle-orm';
import type TestAgent from 'supertest/lib/agent';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { stockFilterSchema, stockListQuerySchema, stockListSchema } from '../../../shared/contracts/stock';
import { parseTiling } from '../../../shared/tiling/index';
import { seedBulkStock } from '../../../server/areas/intake/demo-seed';
import { stock } from '../../../server/areas/stock/schema';
import { addToStock, exportStock, listStock, markStockUsed, stockCsvHead, stockCsvRows } from '../../../server/areas/stock/stock';
import { order21Square } from '../../fixtures/intake/order10';
import { createTestApp, type TestApp } from '../helpers/test-app';

// The stock list read on its own thread (server/areas/stock/stock-reader.ts), with its own
// read-only connection, must answer exactly what the request thread reads on its connection,
// and see every write the moment it is committed. Oracle: the same page read in-process
// (listStock on the request thread's connection, whose totals countStock checks against SQLite
// in stock-count.test.ts).

let t: TestApp;
let editor: TestAgent;
beforeAll(async () => {
  t = await createTestApp({ stockReader: true });
  editor = await t.signInAs('editor');
  seedBulkStock(t.deps, 300);
});
afterAll(() => t.close());

const queries: Record<string, string>[] = [
  {},
  { orderMin: '20', orderMax: '30', page: '2' },
  { provenance: 'foundry', sort: '-width', pageSize: '50' },
  { perfect: 'true', simple: 'true', used: 'unused', sort: 'order' },
  { widthMin: '100', heightMax: '400000', sort: '-createdAt', pageSize: '10', page: '3' },
  { square: 'false', orderMin: '25' },
  { used: 'used' },
];

async function both(q: Record<string, string>) {
  const r = await editor.get('/api/stock').query(q).expect(200);
  expect(r.headers['content-type']).toMatch(/^application\/json/);
  return { thread: stockListSchema.parse(r.body), here: listStock(t.db, stockListQuerySchema.parse(q)) };
}

describe('the stock reader thread', () => {
  it('is running, and answers every filter shape as the request thread reads it', async () => {
    expect(t.deps.stockReader?.alive).toBe(true);
    for (const q of queries) {
      const { thread, here } = await both(q);
      expect(thread, JSON.stringify(q)).toEqual(here);
    }
  });

  it('sees a tiling added and a use recorded at once, also on a cached page', async () => {
    const before = await both({ sort: '-createdAt', pageSize: '5' });
    const added = t.db.transaction((tx) => addToStock(tx, { tiling: parseTiling(order21Square), provenance: 'demo' }));
    expect(added.created).toBe(true);
    const after = await both({ sort: '-createdAt', pageSize: '5' });
    expect(after.thread.total).toBe(before.thread.total + 1);
    expect(after.thread.items[0]!.id).toBe(added.id);
    expect(after.thread).toEqual(after.here);
    // a change in place (the use count) moves a row between the used and unused views
    const used = await both({ used: 'used', pageSize: '100' });
    t.db.transaction((tx) => markStockUsed(tx, added.id));
    const used2 = await both({ used: 'used', pageSize: '100' });
    expect(used2.thread.total).toBe(used.thread.total + 1);
    expect(used2.thread.items.some((i) => i.id === added.id)).toBe(true);
    expect(used2.thread).toEqual(used2.here);
  });

  it('keeps its totals exact while rows are added between its counts (each count adds only the new rows)', async () => {
    let before = (await both({})).here.total;
    for (const n of [330, 360, 400]) {
      seedBulkStock(t.deps, n);
      const now = (await both({ pageSize: '2' })).here.total;
      expect(now).toBeGreaterThan(before);
      before = now;
      for (const q of queries) {
        const { thread, here } = await both(q);
        expect(thread.total, `${n}: ${JSON.stringify(q)}`).toBe(here.total);
        expect(thread, `${n}: ${JSON.stringify(q)}`).toEqual(here);
      }
    }
  });

  it('reports a stored row that does not read as the request thread does (500, nothing half-sent)', async () => {
    const [row] = t.db.select({ id: stock.id, squaresJson: stock.squaresJson }).from(stock).limit(1).all();
    t.db.update(stock).set({ squaresJson: '[[0,0,"x"]]' }).where(eq(stock.id, row!.id)).run();
    try {
      const r = await editor.get('/api/stock').query({ sort: 'id', pageSize: '50' });
      expect(r.status).toBe(500);
      expect(() => listStock(t.db, stockListQuerySchema.parse({ sort: 'id', pageSize: '50' }))).toThrow(`stock ${row!.id}: column squares_json`);
    } finally {
      t.db.update(stock).set({ squaresJson: row!.squaresJson }).where(eq(stock.id, row!.id)).run();
    }
  });

  it('counts and pages the exports as the Drizzle query reads the same selection (CSV and code file, with a limit)', async () => {
    for (const f of [{}, { orderMin: '22', perfect: 'true' }, { used: 'used' }] as Record<string, string>[]) {
      const expected = exportStock(t.db, stockFilterSchema.parse(f), 100_000);
      const csv = await editor.get('/api/stock/export.csv').query(f).expect(200);
      expect(csv.headers['x-total-count']).toBe(String(expected.length));
      expect(csv.text).toBe(stockCsvHead() + stockCsvRows(expected));
      const codes = await editor.get('/api/stock/export.txt').query({ ...f, limit: '7' }).buffer(true).parse((res, cb) => {
        let body = '';
        res.on('data', (c: Buffer) => (body += c.toString()));
        res.on('end', () => cb(null, body));
      }).expect(200);
      expect((codes.body as string).split('\n').filter((l) => l && !l.startsWith('#'))).toEqual(expected.slice(0, 7).map((i) => i.canonicalCode));
    }
  });

  it('a thread that stops is started again; meanwhile the request thread reads the pages', async () => {
    const reader = t.deps.stockReader!;
    // a page asked for as the thread stops is read on the request thread (whichever comes first)
    const [asked] = await Promise.all([editor.get('/api/stock').query({ orderMin: '21', pageSize: '12' }), reader.crashForTests()]);
    expect(asked.status).toBe(200);
    expect(stockListSchema.parse(asked.body)).toEqual(listStock(t.db, stockListQuerySchema.parse({ orderMin: '21', pageSize: '12' })));
    expect(reader.alive).toBe(false);
    const meanwhile = await both({ orderMin: '21', pageSize: '13' });
    expect(meanwhile.thread).toEqual(meanwhile.here);
    for (let i = 0; i < 100 && !reader.alive; i++) await new Promise((r) => setTimeout(r, 50));
    expect(reader.alive).toBe(true);
    // read by the new thread (a page not cached yet)
    const again = await both({ orderMin: '21', pageSize: '14' });
    expect(again.thread).toEqual(again.here);
  });

  it('once closed, the request thread reads the pages itself', async () => {
    await t.deps.stockReader!.close();
    expect(t.deps.stockReader!.alive).toBe(false);
    // a page not asked for before (not in the page cache)
    const after = await both({ orderMin: '22', pageSize: '21' });
    expect(after.thread.items.length).toBeGreaterThan(0);
    expect(after.thread).toEqual(after.here);
  });
});
