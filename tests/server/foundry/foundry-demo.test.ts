import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runListSchema } from '../../../shared/contracts/foundry';
import { classifyTiling } from '../../../shared/tiling/index';
import { stock } from '../../../server/areas/stock/schema';
import { seedDemoFoundry } from '../../../server/areas/foundry/demo-seed';
import { stockTiling } from '../../../server/areas/stock/stock';
import { createTestApp, type TestApp } from '../helpers/test-app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({ demo: { seeders: [{ name: 'foundry', seed: seedDemoFoundry }] } });
});
afterAll(async () => {
  await t.close();
});

describe('foundry demo data', () => {
  it('records two finished runs and fills the stock with small simple perfect foundry tilings', async () => {
    const editor = await t.signInAs('editor');
    const runs = runListSchema.parse((await editor.get('/api/foundry/runs').expect(200)).body).items;
    expect(runs.map((r) => r.params.mode).sort()).toEqual(['exhaustive', 'random']);
    expect(runs.every((r) => r.state === 'done')).toBe(true);
    const exhaustive = runs.find((r) => r.params.mode === 'exhaustive')!;
    // OEIS A002839: 6 simple perfect squared rectangles of order 10.
    expect(exhaustive.found).toBe(6);
    const random = runs.find((r) => r.params.mode === 'random')!;
    expect(random.found).toBe(8);
    const rows = t.db.select({ id: stock.id }).from(stock).where(eq(stock.provenance, 'foundry')).all();
    expect(rows.length).toBe(14);
    for (const r of rows) {
      const c = classifyTiling(stockTiling(t.db, r.id).tiling);
      expect(c.simple && c.perfect).toBe(true);
      expect(c.maxSize).toBeLessThanOrEqual(150);
    }
  });
});
