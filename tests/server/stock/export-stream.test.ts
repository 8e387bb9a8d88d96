import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sql } from 'drizzle-orm';
import { parseTiling } from '../../../shared/tiling/index';
import { addToStock } from '../../../server/areas/stock/stock';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { order9Code } from '../../fixtures/order9';

// The stock exports stream the whole selection in batches (keyset by created_at, id): no silent
// cap at 10,000 rows any more, rows in order even where many share a created_at.

let t: TestApp;
const N = 12_345;
beforeAll(async () => {
  t = await createTestApp();
  const first = addToStock(t.db, { tiling: parseTiling(order9Code), provenance: 'demo' });
  // N more rows copied from it in one statement (unique keys, all with the same created_at)
  t.db.run(sql`
    with recursive n(i) as (select 1 union all select i + 1 from n where i < ${N})
    insert into stock (canonical_key, canonical_code, reduced_key, squares_json, width, height, "order", square, perfect, simple, provenance, created_at)
    select canonical_key || '#' || i, canonical_code, reduced_key || '#' || i, squares_json, width, height, "order", square, perfect, simple, 'foundry', 1767225600000
    from stock, n where stock.id = ${first.id}`);
});
afterAll(() => t.close());

describe('stock exports', () => {
  it('stream every row of the selection, beyond 10,000, newest first, and say how many in X-Total-Count', async () => {
    const editor = await t.signInAs('editor');
    const r = await editor.get('/api/stock/export.csv').buffer(true).expect(200);
    expect(r.headers['x-total-count']).toBe(String(N + 1));
    const lines = r.text.trimEnd().split('\r\n');
    expect(lines).toHaveLength(1 + N + 1);
    const ids = lines.slice(1).map((l) => Number(l.split(',')[0]));
    expect(new Set(ids).size).toBe(N + 1);
    // the copies share one created_at, older than the first row: newest first, then id descending
    expect(ids[0]).toBe(1);
    expect(ids.slice(1)).toEqual(ids.slice(1).sort((a, b) => b - a));
  });

  it('the filter and limit apply: the first rows only, and the code file with its count', async () => {
    const editor = await t.signInAs('editor');
    const r = await editor.get('/api/stock/export.csv?provenance=foundry&limit=2500').buffer(true).expect(200);
    expect(r.headers['x-total-count']).toBe('2500');
    expect(r.text.trimEnd().split('\r\n')).toHaveLength(1 + 2500);
    const bkp = await editor.get('/api/stock/export.txt?provenance=demo').buffer(true).expect(200);
    expect(bkp.text.split('\n')[0]).toMatch(/^# Squarewright stock export, 1 tilings, /);
    expect(bkp.text.split('\n').filter((l) => l && !l.startsWith('#'))).toHaveLength(1);
  });
});
