import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { isAllowed, permissions } from '../../../server/platform/auth/permissions';
import { plainRichText } from '../../../shared/contracts/editions';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { TILING_33x32 } from '../print/fixtures/sample-edition';
import { stubPuzzles } from '../print/fixtures/stub-puzzles';
import { quadrantPublication } from './fixtures';

// Printers per publication (issue 17): an admin assigns printers; a printer of another
// publication cannot see, download or decide a proof, even with its id (404, as for an id
// that does not exist), and the proof mail goes only to the publication's printers.

let t: TestApp;
let admin: request.Agent;
let editor: request.Agent;
let ours: request.Agent;
let theirs: request.Agent;
let oursId: string;
let theirsId: string;
let quadrant: string;
let monthly: string;
let editionId: string;
const reason = { override: { reason: 'Test: the small pieces are cut from card.' } };

beforeAll(async () => {
  t = await createTestApp();
  const puzzles = stubPuzzles(t.deps);
  t.deps.puzzles = puzzles;
  admin = await t.signInAs('admin');
  editor = await t.signInAs('editor');
  ours = await t.signInAs('printer', { email: 'quadrant-printer@test.squarewright.test', name: 'Quadrant Printer' });
  theirs = await t.signInAs('printer', { email: 'monthly-printer@test.squarewright.test', name: 'Monthly Printer' });
  oursId = (await ours.get('/api/me').expect(200)).body.user.id;
  theirsId = (await theirs.get('/api/me').expect(200)).body.user.id;
  quadrant = (await admin.post('/api/publications').send(quadrantPublication).expect(201)).body.id;
  monthly = (await admin.post('/api/publications').send({ ...quadrantPublication, title: 'Squared Away Monthly', templateId: 'a4', cadence: 'monthly' }).expect(201)).body.id;
  const setterId = await t.createUser('setter');
  const d = puzzles.add({ tiling: TILING_33x32, kind: 'deduction', setterId });
  editionId = (await editor.post('/api/editions').send({ publicationId: quadrant, number: 41, date: '2026-12-05', introduction: plainRichText('Welcome.') }).expect(201)).body.id;
  await editor.patch(`/api/editions/${editionId}`).send({ slots: [{ puzzleId: d.id }] }).expect(200);
}, 60_000);
afterAll(() => t.close());

describe('assigning printers', () => {
  it('is for admins, takes printers only, and shows on the publication', async () => {
    const body = { userIds: [oursId] };
    await editor.put(`/api/publications/${quadrant}/printers`).send(body).expect(403);
    await ours.put(`/api/publications/${quadrant}/printers`).send(body).expect(403);
    const editorId = (await editor.get('/api/me')).body.user.id;
    const bad = await admin.put(`/api/publications/${quadrant}/printers`).send({ userIds: [oursId, editorId] }).expect(422);
    expect(bad.body.error.details).toEqual([{ path: 'body.userIds.1', message: `${editorId} is not an active printer` }]);
    await admin.put(`/api/publications/nope/printers`).send(body).expect(404);
    const res = await admin.put(`/api/publications/${quadrant}/printers`).send(body).expect(200);
    expect(res.body.items).toEqual([{ id: oursId, name: 'Quadrant Printer', email: 'quadrant-printer@test.squarewright.test' }]);
    await admin.put(`/api/publications/${monthly}/printers`).send({ userIds: [theirsId] }).expect(200);
    const choices = (await admin.get(`/api/publications/${quadrant}/printers`).expect(200)).body;
    expect(choices.items.map((p: { id: string }) => p.id)).toEqual([oursId]);
    expect(choices.candidates.map((p: { id: string }) => p.id).sort()).toEqual([oursId, theirsId].sort());
    await editor.get(`/api/publications/${quadrant}/printers`).expect(403);
    const pubs = (await editor.get('/api/publications').expect(200)).body.items as { id: string; printers: { id: string }[] }[];
    expect(pubs.find((p) => p.id === quadrant)!.printers.map((p) => p.id)).toEqual([oursId]);
    expect(pubs.find((p) => p.id === monthly)!.printers.map((p) => p.id)).toEqual([theirsId]);
  });
});

describe('a proof of The Saturday Quadrant', () => {
  it('is mailed to its printer only', async () => {
    await editor.post(`/api/editions/${editionId}/proofs`).send(reason).expect(201);
    await t.mailbox.waitFor({ to: 'quadrant-printer@test.squarewright.test', subject: 'Proof 1 ready' });
    expect(t.mailbox.all().filter((m) => m.to.includes('monthly-printer'))).toEqual([]);
  });

  it('is listed, shown and downloadable for its printer', async () => {
    expect((await ours.get('/api/editions').expect(200)).body.items.map((e: { id: string }) => e.id)).toEqual([editionId]);
    await ours.get(`/api/editions/${editionId}`).expect(200);
    await ours.get(`/api/editions/${editionId}/proofs/1.pdf`).expect(200);
  });

  it('does not exist for the printer of another publication, by list or by id (404 on every route)', async () => {
    expect((await theirs.get('/api/editions').expect(200)).body.items).toEqual([]);
    const zeros = '00000000-0000-0000-0000-000000000000';
    const unknown = (await theirs.get(`/api/editions/${zeros}`).expect(404)).body.error.message as string;
    const guessed = (await theirs.get(`/api/editions/${editionId}`).expect(404)).body.error.message as string;
    // the same answer as for an id that does not exist
    // (the message echoes the start of the id, cut short, the same way for both)
    expect(guessed.replace(editionId.slice(0, 24), '<id>')).toBe(unknown.replace(zeros.slice(0, 24), '<id>'));
    await theirs.get(`/api/editions/${editionId}/proofs/1.pdf`).expect(404);
    await theirs.get(`/api/editions/${editionId}/proofs/1.pdf?download=1`).expect(404);
    await theirs.get(`/api/editions/${editionId}/press.pdf`).expect(404);
    await theirs.post(`/api/editions/${editionId}/proofs/1/return`).send({ notes: 'Not mine to return.' }).expect(404);
    await theirs.post(`/api/editions/${editionId}/proofs/1/approve`).expect(404);
    // nothing changed by the attempts
    expect((await editor.get(`/api/editions/${editionId}`).expect(200)).body).toMatchObject({ state: 'in_proof', proofs: [{ version: 1, status: 'pending' }] });
  });

  it('answers the printer of another publication on every route the permission table opens to printers as for an unknown edition', async () => {
    // Derived from the table, so a printer route added later is covered too: every route a
    // printer may call that takes an id is an edition route, and each answers a guessed id of
    // an edition of another publication exactly as it answers an id that does not exist.
    const zeros = '00000000-0000-0000-0000-000000000000';
    const printerRoutes = Object.entries(permissions)
      .filter(([key, access]) => key.includes(':') && access !== 'public' && isAllowed(access, 'printer'))
      .map(([key]) => key);
    expect(printerRoutes.every((k) => k.includes(' /api/editions/:id'))).toBe(true);
    expect(printerRoutes.length).toBeGreaterThanOrEqual(5);
    for (const key of printerRoutes) {
      const [method, path] = key.split(' ') as ['GET' | 'POST', string];
      const url = (id: string) => path.replace(':id', id).replace(/:([A-Za-z_][A-Za-z0-9_]*)/g, '1');
      const call = (id: string) => (method === 'GET' ? theirs.get(url(id)) : theirs.post(url(id)).send({ notes: 'Not mine to return.' }));
      const [guessed, unknown] = [await call(editionId), await call(zeros)];
      expect(guessed.status, key).toBe(404);
      expect(guessed.body.error.code, key).toBe(unknown.body.error.code);
      // the same reply the routes give our own printer for an id that does not exist
      expect(unknown.status, key).toBe(404);
    }
    expect((await editor.get(`/api/editions/${editionId}`).expect(200)).body).toMatchObject({ state: 'in_proof', proofs: [{ version: 1, status: 'pending' }] });
  });

  it('is approved by its printer, and the press file is theirs alone too', async () => {
    await ours.post(`/api/editions/${editionId}/proofs/1/approve`).expect(200);
    await ours.get(`/api/editions/${editionId}/press.pdf`).expect(200);
    await theirs.get(`/api/editions/${editionId}/press.pdf`).expect(404);
  });

  it('disappears for a printer taken off the publication', async () => {
    await admin.put(`/api/publications/${quadrant}/printers`).send({ userIds: [] }).expect(200);
    await ours.get(`/api/editions/${editionId}`).expect(404);
    await ours.get(`/api/editions/${editionId}/press.pdf`).expect(404);
    expect((await ours.get('/api/editions').expect(200)).body.items).toEqual([]);
  });
});
