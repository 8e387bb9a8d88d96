import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { parseTiling } from '../../../shared/tiling/index';
import { addToStock, getStockDetail, listStock, stockTiling } from '../../../server/areas/stock/stock';
import { storedTiling } from '../../../server/areas/stock/stored-json';
import { StoredRowError } from '../../../server/platform/db/stored-json';
import { stockListQuerySchema } from '../../../shared/contracts/stock';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { order9Code, order9bCode } from '../../fixtures/order9';

// Stored JSON of the stock is parsed, not cast: a row written badly (here directly with SQL,
// as a faulty migration or hand edit would) is an error that names the table, the row and the
// column, on every path that reads it.

let t: TestApp;
let editor: Awaited<ReturnType<TestApp['signInAs']>>;
let good: number;
let bad: number;
let badSquares: string;
beforeAll(async () => {
  t = await createTestApp();
  editor = await t.signInAs('editor');
  t.db.transaction((tx) => {
    good = addToStock(tx, { tiling: parseTiling(order9Code), provenance: 'foundry', params: { run: 7 } }).id;
    bad = addToStock(tx, { tiling: parseTiling(order9bCode), provenance: 'foundry', params: { run: 8 } }).id;
  });
  badSquares = t.db.$client.prepare('select squares_json from stock where id = ?').pluck().get(bad) as string;
});
afterAll(() => t.close());

const setColumn = (column: 'squares_json' | 'params_json', text: string, id: number) =>
  t.db.$client.prepare(`update stock set ${column} = ? where id = ?`).run(text, id);
const detail = (id: number) => getStockDetail({ db: t.db, stockUsage: t.deps.stockUsage, submissionHistory: t.deps.submissionHistory }, id);

describe('squares_json of the stock', () => {
  it('reads back what addToStock wrote: the canonical orientation of the 33 x 32 (facts.md)', () => {
    const { tiling } = stockTiling(t.db, good);
    expect(tiling.W).toBe(33);
    expect(tiling.squares.map((q) => q.s)).toEqual([18, 15, 7, 8, 14, 4, 10, 1, 9]);
    expect(detail(good).params).toEqual({ run: 7 });
  });

  it('a row that is not a list of [x,y,s] is an error naming the table, the row id and the column', () => {
    for (const text of ['[[0,0,"18"]]', '{"squares":[]}', '[]', '[[0,0]]', '[[0,0,1.5]]', 'not json']) {
      setColumn('squares_json', text, bad);
      expect(() => stockTiling(t.db, bad), text).toThrow(new RegExp(`^stock ${bad}: column squares_json does not have its stored shape`));
      expect(() => detail(bad), text).toThrow(StoredRowError);
    }
  });

  it('the list says which row is broken; the API answers 500 without internals and logs the row', async () => {
    setColumn('squares_json', '[[0,0,"18"]]', bad);
    expect(() => listStock(t.db, stockListQuerySchema.parse({ pageSize: '50', sort: 'id' }))).toThrow(`stock ${bad}: column squares_json`);
    const spy = vi.spyOn(console, 'error').mockImplementation(() => undefined);
    const r = await editor.get(`/api/stock/${bad}`).expect(500);
    expect(r.body.error.code).toBe('internal');
    expect(JSON.stringify(r.body)).not.toContain('squares_json');
    expect(spy.mock.calls.flat().map(String).join(' ')).toContain(`stock ${bad}: column squares_json does not have its stored shape`);
    spy.mockRestore();
    // the other rows still read
    await editor.get(`/api/stock/${good}`).expect(200);
  });
});

describe('params_json of the stock', () => {
  it('a row whose params are not an object, or not JSON, is an error naming the row', () => {
    setColumn('squares_json', badSquares, bad);
    setColumn('params_json', '[1,2]', bad);
    expect(() => detail(bad)).toThrow(`stock ${bad}: column params_json does not have its stored shape: (root): Invalid input: expected record, received array`);
    setColumn('params_json', '{"run":', bad);
    expect(() => detail(bad)).toThrow(`stock ${bad}: column params_json is not JSON`);
  });
});

describe('storedTiling', () => {
  it('names the submission table for a submission row', () => {
    expect(() => storedTiling('submission', { id: 41, width: 1, height: 1, squaresJson: '[[0,0,-1]]' })).toThrow(/^submission 41: column squares_json/);
  });
});
