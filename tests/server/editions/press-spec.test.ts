import { execFileSync } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
import type request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { plainRichText } from '../../../shared/contracts/editions';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { TILING_33x32 } from '../print/fixtures/sample-edition';
import { stubPuzzles } from '../print/fixtures/stub-puzzles';
import { hasPoppler, writeTemp } from '../print/poppler';
import { assignPrinters, quadrantPublication } from './fixtures';

// A publication's press spec over its template's defaults, and the preflight and the press
// files following it: smallest type, bleed (read back with pdfinfo -box) and PDF/X-4 with the
// plant's profile (Ghostscript's CMYK profile from Debian stands in; never copied into the repo).

const PT_PER_MM = 72 / 25.4;
const GS_CMYK = '/usr/share/color/icc/ghostscript/default_cmyk.icc';
let t: TestApp;
let admin: request.Agent;
let editor: request.Agent;
let pubId: string;
let editionId: string;

function binary(res: request.Response, cb: (err: Error | null, body: Buffer) => void) {
  const chunks: Buffer[] = [];
  res.on('data', (c: Buffer) => chunks.push(c));
  res.on('end', () => cb(null, Buffer.concat(chunks)));
}

beforeAll(async () => {
  t = await createTestApp();
  const puzzles = stubPuzzles(t.deps);
  t.deps.puzzles = puzzles;
  admin = await t.signInAs('admin');
  editor = await t.signInAs('editor');
  await t.signInAs('printer');
  pubId = (await admin.post('/api/publications').send({ ...quadrantPublication, title: 'Squared Away Monthly', templateId: 'a4' }).expect(201)).body.id;
  assignPrinters(t, pubId);
  const d = puzzles.add({ tiling: TILING_33x32, kind: 'deduction', setterId: await t.createUser('setter') });
  editionId = (await editor.post('/api/editions').send({ publicationId: pubId, number: 7, date: '2027-01-02', introduction: plainRichText('This month.') }).expect(201)).body.id;
  await editor.patch(`/api/editions/${editionId}`).send({ slots: [{ puzzleId: d.id }] }).expect(200);
}, 60_000);
afterAll(() => t.close());

const blank = { standard: null, condition: null, bleedMm: null, minTypePt: null, minLinePt: null };

describe('the press spec', () => {
  it('starts from the template (A4: PDF/X-1a, FOGRA39, 3 mm bleed, 6 pt, 0.25 pt)', async () => {
    const res = (await editor.get(`/api/publications/${pubId}/press-spec`).expect(200)).body;
    expect(res.spec).toEqual(blank);
    expect(res.effective).toEqual({ standard: 'pdfx-1a', condition: 'FOGRA39', bleedMm: 3, minTypePt: 6, minLinePt: 0.25, profileSha256: null });
    expect(res.profile).toBeNull();
  });

  it('is set by admins only, refuses hairlines under 0.25 pt (common practice) and PDF/X-4 without a profile', async () => {
    await editor.put(`/api/publications/${pubId}/press-spec`).send(blank).expect(403);
    const thin = await admin.put(`/api/publications/${pubId}/press-spec`).send({ ...blank, minLinePt: 0.1 }).expect(400);
    expect(thin.body.error.details[0].path).toBe('body.minLinePt');
    await admin.put(`/api/publications/${pubId}/press-spec`).send({ ...blank, condition: 'JAPAN2001' }).expect(400);
    const x4 = await admin.put(`/api/publications/${pubId}/press-spec`).send({ ...blank, standard: 'pdfx-4' }).expect(422);
    expect(x4.body.error.message).toMatch(/upload it first/);
  });

  it('is what the preflight reads: a larger minimum type fails the checks', async () => {
    await admin.put(`/api/publications/${pubId}/press-spec`).send({ ...blank, minTypePt: 9 }).expect(200);
    const checks = (await editor.get(`/api/editions/${editionId}/checks`).expect(200)).body;
    expect(checks.preflight.spec.minTypePt).toBe(9);
    expect(checks.preflight.warnings.map((w: { code: string }) => w.code)).toContain('error:type-small');
    await admin.put(`/api/publications/${pubId}/press-spec`).send(blank).expect(200);
    const again = (await editor.get(`/api/editions/${editionId}/checks`).expect(200)).body;
    expect(again.preflight.warnings).toEqual([]);
  }, 60_000);

  it.skipIf(!hasPoppler)('sets the bleed of the press files (pdfinfo -box)', async () => {
    await admin.put(`/api/publications/${pubId}/press-spec`).send({ ...blank, bleedMm: 5, condition: 'FOGRA51' }).expect(200);
    const pdf = (await editor.get(`/api/editions/${editionId}/preview.pdf`).buffer(true).parse(binary).expect(200)).body as Buffer;
    const out = execFileSync('pdfinfo', ['-box', writeTemp(pdf)], { encoding: 'utf8' });
    const trim = /^TrimBox:\s+([\d.]+)\s+([\d.]+)\s+([\d.]+)\s+([\d.]+)/m.exec(out)!.slice(1).map(Number);
    const media = /^MediaBox:\s+([\d.]+)\s+([\d.]+)\s+([\d.]+)\s+([\d.]+)/m.exec(out)!.slice(1).map(Number);
    expect(trim[0]).toBeCloseTo(5 * PT_PER_MM, 1);
    expect(media[2]).toBeCloseTo((210 + 10) * PT_PER_MM, 1);
    expect(pdf.toString('latin1')).toContain('/OutputConditionIdentifier (FOGRA51)');
    await admin.put(`/api/publications/${pubId}/press-spec`).send(blank).expect(200);
  }, 60_000);
});

describe('the plant\'s output profile', () => {
  it('refuses a file that is not a CMYK output profile, naming why', async () => {
    const res = await admin.put(`/api/publications/${pubId}/output-profile`).attach('file', Buffer.from('not a profile at all'), 'x.icc').expect(422);
    expect(res.body.error.message).toMatch(/too short for an ICC profile/);
    await editor.put(`/api/publications/${pubId}/output-profile`).attach('file', Buffer.from('x'), 'x.icc').expect(403);
  });

  it.skipIf(!existsSync(GS_CMYK) || !hasPoppler)('takes a CMYK output profile; PDF/X-4 proofs then embed it', async () => {
    const icc = readFileSync(GS_CMYK);
    const up = (await admin.put(`/api/publications/${pubId}/output-profile`).attach('file', icc, 'plant.icc').expect(200)).body;
    expect(up.profile).toMatchObject({ bytes: icc.length, sha256: expect.stringMatching(/^[0-9a-f]{64}$/) });
    await admin.put(`/api/publications/${pubId}/press-spec`).send({ ...blank, standard: 'pdfx-4' }).expect(200);
    const ed = (await editor.get(`/api/editions/${editionId}`).expect(200)).body;
    await editor.post(`/api/editions/${editionId}/proofs`).send({ updatedAt: ed.updatedAt }).expect(201);
    const proof = (await editor.get(`/api/editions/${editionId}/proofs/1.pdf`).buffer(true).parse(binary).expect(200)).body as Buffer;
    expect(execFileSync('pdfinfo', [writeTemp(proof)], { encoding: 'utf8' })).toMatch(/^PDF subtype:\s+PDF\/X-4$/m);
    const stored = (await editor.get(`/api/editions/${editionId}`).expect(200)).body.proofs[0].preflight;
    expect(stored.ok).toBe(true);
    expect(stored.pdfx).toMatchObject({ version: 'PDF/X-4', outputIntent: { profileEmbedded: true } });
  }, 60_000);
});
