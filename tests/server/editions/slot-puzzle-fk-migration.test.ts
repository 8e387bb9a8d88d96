import { expect, it } from 'vitest';
import { databaseMigratedUpTo } from '../helpers/migrations';

// Migration 0011: edition_slot.puzzle_id was text without a foreign key; it becomes an
// integer referencing puzzle(id). A slot naming a puzzle row survives with every column
// and the puzzle's integer id; a slot naming none cannot satisfy the key and is not copied
// (the API never wrote one: see the comment at the top of the migration).

it('keeps every slot that names a puzzle, its text id now an integer reference', () => {
  const m = databaseMigratedUpTo('0010_foundry-result-stock-fk');
  try {
    const s = m.sqlite;
    s.prepare(
      `insert into publication (id, title, publisher, template_id, cadence, solution_rule, reuse_window_days, currency, fee_assembly_minor, fee_deduction_minor)
       values ('pub', 'The Saturday Quadrant', 'Larkspur & Quill Press', 'newspaper-column', 'weekly', 'next_edition', 180, 'GBP', 4000, 5500)`,
    ).run();
    s.prepare(`insert into edition (id, publication_id, number, edition_date, state, introduction_json) values ('ed-40', 'pub', 40, '2026-11-28', 'published', '{"type":"doc","content":[]}')`).run();
    s.prepare(`insert into edition (id, publication_id, number, edition_date, state, introduction_json) values ('ed-41', 'pub', 41, '2026-12-05', 'draft', '{"type":"doc","content":[]}')`).run();
    const stockId = s
      .prepare(`insert into stock (canonical_key, canonical_code, squares_json, width, height, "order", square, perfect, simple, provenance) values ('k', 'c', '[]', 33, 32, 9, 0, 1, 1, 'demo') returning id`)
      .pluck()
      .get() as number;
    const newPuzzle = s.prepare(`insert into puzzle (stock_id, kind, title, input_hash) values (?, ?, ?, 'h') returning id`).pluck();
    const a = newPuzzle.get(stockId, 'assembly', 'Assembly 33 x 32') as number;
    const d = newPuzzle.get(stockId, 'deduction', 'Deduction, 9 squares') as number;
    const slot = s.prepare(`insert into edition_slot (edition_id, position, puzzle_id, instructions_json) values (?, ?, ?, ?)`);
    const instr = (text: string) => JSON.stringify({ type: 'doc', content: [{ type: 'paragraph', content: [{ type: 'text', text }] }] });
    slot.run('ed-40', 1, String(a), instr('Use every piece once.'));
    slot.run('ed-40', 2, String(d), instr('Find every size.'));
    slot.run('ed-41', 1, String(d), instr('Again.'));
    slot.run('ed-41', 2, 'pz-a', instr('a stub id, no puzzle row'));
    slot.run('ed-41', 3, '999999', instr('digits, but no puzzle row'));
    slot.run('ed-41', 4, `00${a}`, instr('leading zeros name puzzle a, as the old puzzle store read them'));
    slot.run('ed-41', 5, `0${d}`, instr('puzzle d again in this edition: not copied'));
    const before = s.prepare(`select id from edition_slot where edition_id = 'ed-40' order by position`).pluck().all();

    m.migrateRest();

    const rows = s.prepare(`select id, edition_id as e, position as pos, puzzle_id as pid, typeof(puzzle_id) as t, instructions_json as instr from edition_slot order by edition_id, position`).all();
    expect(rows).toEqual([
      { id: before[0], e: 'ed-40', pos: 1, pid: a, t: 'integer', instr: instr('Use every piece once.') },
      { id: before[1], e: 'ed-40', pos: 2, pid: d, t: 'integer', instr: instr('Find every size.') },
      { id: expect.any(Number), e: 'ed-41', pos: 1, pid: d, t: 'integer', instr: instr('Again.') },
      { id: expect.any(Number), e: 'ed-41', pos: 4, pid: a, t: 'integer', instr: instr('leading zeros name puzzle a, as the old puzzle store read them') },
    ]);
    expect(s.pragma('foreign_key_check')).toEqual([]);
    // the key holds from now on: a slot naming no puzzle is refused, and a printed puzzle cannot be deleted
    expect(() => slot.run('ed-41', 6, 999999, instr('x'))).toThrow(/FOREIGN KEY constraint failed/);
    expect(() => s.prepare('delete from puzzle where id = ?').run(a)).toThrow(/FOREIGN KEY constraint failed/);
    const indexes = s.prepare(`select name from sqlite_master where type = 'index' and tbl_name = 'edition_slot' and name not like 'sqlite_%' order by name`).pluck().all();
    expect(indexes).toEqual(['edition_slot_position_idx', 'edition_slot_puzzle_idx', 'edition_slot_puzzle_lookup_idx']);
  } finally {
    m.close();
  }
});
