import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { plainRichText } from '../../../shared/contracts/editions';
import { getEditionFor, listEditions } from '../../../server/areas/editions/editions';
import { approveProof } from '../../../server/areas/editions/proofs';
import { edition, editionProof, editionSlot } from '../../../server/areas/editions/schema';
import { StoredRowError } from '../../../server/areas/editions/stored-json';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { TILING_33x32, TILING_69x61 } from '../print/fixtures/sample-edition';
import { stubPuzzles } from '../print/fixtures/stub-puzzles';
import { assignPrinters, quadrantPublication } from './fixtures';

// Parse, don't cast: the editions' JSON columns (introduction, slot instructions, a proof's
// preflight and print document) are read through their schemas; a corrupt row is an error
// naming the table, the row id and the column, never an empty document or a cast.

let t: TestApp;
let editionId: string;
let slotId: number;
let proofId: number;
const editor = { id: '', name: 'Editor', email: 'editor@test.squarewright.test', role: 'editor' as const };
const printer = { id: '', name: 'Printer', email: 'printer@test.squarewright.test', role: 'printer' as const };

beforeAll(async () => {
  t = await createTestApp();
  const puzzles = stubPuzzles(t.deps);
  t.deps.puzzles = puzzles;
  editor.id = await t.createUser('editor');
  printer.id = await t.createUser('printer');
  const setterId = await t.createUser('setter');
  const a = puzzles.add({ tiling: TILING_69x61, kind: 'assembly', setterId });
  const d = puzzles.add({ tiling: TILING_33x32, kind: 'deduction', setterId });
  const admin = await t.signInAs('admin');
  const ed = await t.signInAs('editor');
  const pub = await admin
    .post('/api/publications')
    .send(quadrantPublication)
    .expect(201);
  assignPrinters(t, pub.body.id);
  editionId = (await ed.post('/api/editions').send({ publicationId: pub.body.id, number: 41, date: '2026-12-05', introduction: plainRichText('Welcome.') }).expect(201)).body.id;
  await ed.patch(`/api/editions/${editionId}`).send({ slots: [{ puzzleId: a.id }, { puzzleId: d.id }] }).expect(200);
  // the stub puzzles break the newspaper column's floors: sent with the editor's reason (issue 16)
  await ed.post(`/api/editions/${editionId}/proofs`).send({ override: { reason: 'Test: the small pieces are cut from card.' } }).expect(201);
  slotId = t.db.select({ id: editionSlot.id }).from(editionSlot).where(eq(editionSlot.editionId, editionId)).all()[0]!.id;
  proofId = t.db.select({ id: editionProof.id }).from(editionProof).where(eq(editionProof.editionId, editionId)).get()!.id;
});
afterAll(() => t.close());

/** Sets one column of one row to `text`, runs `read`, puts the column back, and returns what `read` threw. */
async function withCorrupt(table: 'edition' | 'edition_slot' | 'edition_proof', column: string, id: string | number, text: string, read: () => unknown): Promise<unknown> {
  const sqlite = t.db.$client;
  const kept = sqlite.prepare(`select ${column} as v from ${table} where id = ?`).get(id) as { v: string };
  sqlite.prepare(`update ${table} set ${column} = ? where id = ?`).run(text, id);
  try {
    await read();
  } catch (e) {
    return e;
  } finally {
    sqlite.prepare(`update ${table} set ${column} = ? where id = ?`).run(kept.v, id);
  }
  return undefined;
}

describe('a corrupt JSON column', () => {
  it('introduction_json: reading the edition names the edition row', async () => {
    const e = await withCorrupt('edition', 'introduction_json', editionId, '{"type":"doc"', () => getEditionFor(t.deps, editor, editionId));
    expect(e).toBeInstanceOf(StoredRowError);
    expect((e as Error).message).toMatch(new RegExp(`^edition ${editionId}: column introduction_json is not JSON`));
  });

  it('instructions_json: JSON of the wrong shape names the slot row (no silent empty instructions)', async () => {
    const e = await withCorrupt('edition_slot', 'instructions_json', slotId, '{"type":"paragraph"}', () => getEditionFor(t.deps, editor, editionId));
    expect(e).toBeInstanceOf(StoredRowError);
    expect((e as Error).message).toMatch(new RegExp(`^edition_slot ${slotId}: column instructions_json does not have its stored shape: type: a rich text document starts with type "doc"`));
  });

  it('preflight_json: listing the editions names the proof row', async () => {
    const e = await withCorrupt('edition_proof', 'preflight_json', proofId, '{"ok":"yes"}', () => listEditions(t.deps, editor, {}));
    expect(e).toBeInstanceOf(StoredRowError);
    expect((e as Error).message).toMatch(new RegExp(`^edition_proof ${proofId}: column preflight_json does not have its stored shape: ok: `));
  });

  it('document_json: approving names the proof row and makes no press file', async () => {
    const e = await withCorrupt('edition_proof', 'document_json', proofId, '{"publicationTitle":"The Saturday Quadrant"}', () => approveProof(t.deps, printer, editionId, 1));
    expect(e).toBeInstanceOf(StoredRowError);
    expect((e as Error).message).toMatch(new RegExp(`^edition_proof ${proofId}: column document_json does not have its stored shape: editionNumber: `));
    expect(t.db.select({ state: edition.state, press: edition.pressPath }).from(edition).where(eq(edition.id, editionId)).get()).toEqual({ state: 'in_proof', press: null });
  });

  it('reads every column back once it is whole again', async () => {
    expect(getEditionFor(t.deps, editor, editionId)).toMatchObject({ introduction: plainRichText('Welcome.'), slots: [{ position: 1 }, { position: 2 }] });
    await approveProof(t.deps, printer, editionId, 1);
    expect(t.db.select({ state: edition.state }).from(edition).where(eq(edition.id, editionId)).get()).toEqual({ state: 'approved' });
  });
});
