import { expect, it } from 'vitest';
import { databaseMigratedUpTo } from '../helpers/migrations';

// Migration 0010: foundry_result.stock_id was text without a foreign key; it becomes an
// integer referencing stock(id). Existing rows must survive with their stock id as a number.

it('keeps every foundry result and turns its text stock id into an integer reference', () => {
  const m = databaseMigratedUpTo('0009_intake-stock-sort-indexes');
  try {
    const s = m.sqlite;
    s.prepare(`insert into job (id, kind, state, params) values ('run-1', 'foundry-run', 'done', '{}')`).run();
    const stockId = s
      .prepare(`insert into stock (canonical_key, canonical_code, squares_json, width, height, "order", square, perfect, simple, provenance) values ('k', 'c', '[]', 1, 1, 1, 1, 1, 1, 'foundry') returning id`)
      .pluck()
      .get() as number;
    const insert = s.prepare(`insert into foundry_result (job_id, canonical_key, code, "order", width, height, perfect, simple, square, max_size, origin, stock_id) values ('run-1', ?, 'c', 9, 33, 32, 1, 1, 0, 18, '{}', ?)`);
    insert.run('with-stock', String(stockId));
    insert.run('without-stock', null);
    insert.run('dangling', '999999');
    m.migrateRest();
    const rows = s.prepare(`select canonical_key as k, stock_id as sid, typeof(stock_id) as t from foundry_result order by foundry_result.id`).all();
    expect(rows).toEqual([
      { k: 'with-stock', sid: stockId, t: 'integer' },
      { k: 'without-stock', sid: null, t: 'null' },
      // a stock id naming no stock row cannot satisfy the new foreign key: it becomes null, the row stays
      { k: 'dangling', sid: null, t: 'null' },
    ]);
    expect(s.pragma('foreign_key_check')).toEqual([]);
  } finally {
    m.close();
  }
});
