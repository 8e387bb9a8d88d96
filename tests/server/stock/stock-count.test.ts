import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { stockFilterSchema } from '../../../shared/contracts/stock';
import { stock } from '../../../server/areas/stock/schema';
import { seedBulkStock } from '../../../server/areas/intake/demo-seed';
import { exportStock, markStockUsed } from '../../../server/areas/stock/stock';
import { countStock, setSnapshotChunkRowsForTests, stockSnapshotCurrent } from '../../../server/areas/stock/stock-filter';
import { longTiling } from '../../fixtures/long-codes';
import { createTestApp, type TestApp } from '../helpers/test-app';

// The list's totals are counted in memory (server/areas/stock/stock-filter.ts countStock); SQLite
// is the oracle: the same filter through the export's SQL (Drizzle, stockWhere) must give as many rows.

let t: TestApp;
let setterId: string;
beforeAll(async () => {
  t = await createTestApp();
  setterId = await t.createUser('setter');
  seedBulkStock(t.deps, 400);
  const setterRows = t.db.select({ id: stock.id }).from(stock).where(eq(stock.provenance, 'setter')).all().slice(0, 30);
  for (const r of setterRows) t.db.update(stock).set({ setterId }).where(eq(stock.id, r.id)).run();
  t.db.transaction((tx) => {
    for (const id of [3, 17, 40, 41, 99, 250]) markStockUsed(tx, id);
  });
});
afterAll(() => t.close());

// mulberry32, seed 10: seeded randomness (common practice)
function rng(seed: number) {
  let s = seed;
  return () => {
    s = (s + 0x6d2b79f5) | 0;
    let x = Math.imul(s ^ (s >>> 15), 1 | s);
    x = (x + Math.imul(x ^ (x >>> 7), 61 | x)) ^ x;
    return ((x ^ (x >>> 14)) >>> 0) / 4294967296;
  };
}

async function snapshotTaken() {
  for (let i = 0; i < 400 && !stockSnapshotCurrent(t.db); i++) {
    countStock(t.db, {});
    await new Promise((r) => setTimeout(r, 20));
  }
  expect(stockSnapshotCurrent(t.db)).toBe(true);
}

describe('countStock', () => {
  it('agrees with SQLite on 300 random filters', async () => {
    await snapshotTaken(); // the in-memory count, not SQLite's
    const rnd = rng(10);
    const widths = t.db.select({ w: stock.width, h: stock.height, o: stock.order }).from(stock).all();
    const pick = <T,>(xs: readonly T[]) => xs[Math.floor(rnd() * xs.length)]!;
    const maybe = (p: number) => rnd() < p;
    let nonTrivial = 0;
    for (let k = 0; k < 300; k++) {
      const a = pick(widths);
      const b = pick(widths);
      const q: Record<string, string> = {};
      if (maybe(0.4)) q.orderMin = String(Math.min(a.o, b.o));
      if (maybe(0.4)) q.orderMax = String(Math.max(a.o, b.o));
      if (maybe(0.3)) q.widthMin = String(Math.min(a.w, b.w));
      if (maybe(0.3)) q.widthMax = String(Math.max(a.w, b.w));
      if (maybe(0.3)) q.heightMin = String(Math.min(a.h, b.h));
      if (maybe(0.3)) q.heightMax = String(Math.max(a.h, b.h));
      for (const key of ['square', 'perfect', 'simple'] as const) if (maybe(0.3)) q[key] = pick(['true', 'false']);
      if (maybe(0.3)) q.provenance = pick(['setter', 'foundry', 'demo']);
      if (maybe(0.3)) q.used = pick(['used', 'unused']);
      if (maybe(0.15)) q.setterId = setterId;
      const f = stockFilterSchema.parse(q);
      const expected = exportStock(t.db, f, 100_000).length;
      if (expected > 0 && expected < 400) nonTrivial++;
      expect(countStock(t.db, f), JSON.stringify(q)).toBe(expected);
    }
    expect(nonTrivial).toBeGreaterThan(50);
  });

  it('follows a stock write at once', () => {
    const before = countStock(t.db, { used: 'used' });
    t.db.transaction((tx) => markStockUsed(tx, 5));
    expect(countStock(t.db, { used: 'used' })).toBe(before + 1);
  });

  it('follows a write that bypasses the stock service, and counts from a fresh snapshot later', async () => {
    const before = countStock(t.db, { used: 'used' });
    t.db.update(stock).set({ useCount: 2 }).where(eq(stock.id, 7)).run();
    expect(countStock(t.db, { used: 'used' })).toBe(before + 1);
    // past the snapshot's minimum age the in-memory count takes over again, still exact
    await new Promise((r) => setTimeout(r, 1100));
    expect(countStock(t.db, { used: 'used' })).toBe(before + 1);
    expect(countStock(t.db, { used: 'unused' })).toBe(exportStock(t.db, { used: 'unused' }, 100_000).length);
  });

  it('takes its snapshot chunk by chunk, one per turn of the event loop; SQLite counts meanwhile, exactly', async () => {
    await snapshotTaken();
    setSnapshotChunkRowsForTests(50); // 400 rows: 9 turns
    try {
      t.db.transaction((tx) => markStockUsed(tx, 11));
      const unused = exportStock(t.db, { used: 'unused' }, 100_000).length;
      await new Promise((r) => setTimeout(r, 1100)); // stable for the minimum age
      expect(countStock(t.db, { used: 'unused' })).toBe(unused); // starts the retake, answers from SQLite
      expect(stockSnapshotCurrent(t.db)).toBe(false);
      await new Promise((r) => setImmediate(r));
      await new Promise((r) => setImmediate(r));
      expect(stockSnapshotCurrent(t.db)).toBe(false); // not in one piece
      await snapshotTaken();
      expect(countStock(t.db, { used: 'unused' })).toBe(unused);
    } finally {
      setSnapshotChunkRowsForTests(2_000);
    }
  });

  it('a write between two chunks: counts stay exact, and a snapshot of the database as it is now follows', async () => {
    await snapshotTaken();
    setSnapshotChunkRowsForTests(50);
    try {
      t.db.transaction((tx) => markStockUsed(tx, 12));
      await new Promise((r) => setTimeout(r, 1100));
      countStock(t.db, {}); // starts a retake
      await new Promise((r) => setImmediate(r)); // one chunk read
      t.db.transaction((tx) => markStockUsed(tx, 13)); // a write between two chunks
      await new Promise((r) => setTimeout(r, 100)); // the partial retake is dropped, not installed
      expect(stockSnapshotCurrent(t.db)).toBe(false);
      await snapshotTaken();
      expect(countStock(t.db, { used: 'used' })).toBe(exportStock(t.db, { used: 'used' }, 100_000).length);
    } finally {
      setSnapshotChunkRowsForTests(2_000);
    }
  });

  it('rows added after the snapshot are counted over their rowid range, exactly, and the snapshot stays in use (a foundry run storing)', async () => {
    await snapshotTaken();
    const filters = [{}, { perfect: 'true' }, { provenance: 'demo' }, { used: 'unused' }, { orderMin: '12', simple: 'false' }, { provenance: 'setter', setterId }].map((q) => stockFilterSchema.parse(q));
    // 40 more tilings through the stock service, in two transactions (compound rows of scaled
    // order-9 and order-10 rectangles, tests/fixtures/long-codes.ts)
    for (const from of [100, 120]) {
      t.db.transaction((tx) => {
        for (let i = from; i < from + 20; i++) expect(t.deps.stock.add(tx, { tiling: longTiling(i, 6), provenance: i % 2 ? 'setter' : 'demo' }).created).toBe(true);
      });
    }
    expect(stockSnapshotCurrent(t.db)).toBe(true);
    for (const f of filters) expect(countStock(t.db, f), JSON.stringify(f)).toBe(exportStock(t.db, f, 100_000).length);
    // an insert that is rolled back is not counted
    const all = countStock(t.db, {});
    expect(() =>
      t.db.transaction((tx) => {
        t.deps.stock.add(tx, { tiling: longTiling(99, 6), provenance: 'setter' });
        throw new Error('rolled back');
      }),
    ).toThrow('rolled back');
    expect(countStock(t.db, {})).toBe(all);
    expect(all).toBe(exportStock(t.db, {}, 100_000).length);
  });
});
