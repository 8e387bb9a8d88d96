import { createHash } from 'node:crypto';
import type TestAgent from 'supertest/lib/agent';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { z } from 'zod';
import { preflightSchema } from '../../../shared/contracts/preflight';
import { plainRichText } from '../../../shared/contracts/editions';
import type { RenderResult } from '../../../server/areas/print/types';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { TILING_33x32, TILING_69x61 } from '../print/fixtures/sample-edition';
import { stubPuzzles, type StubPuzzles } from '../print/fixtures/stub-puzzles';
import { quadrantPublication } from './fixtures';

// Sending a proof renders the edition once: the checks before proof read the preflight of
// the very PDF that is stored (it used to render a preview for the checks, then the file).
// Every render goes through the job system as a 'print-render' compute job (the print area's
// renderEditionPdf on a worker thread), counted here by wrapping deps.jobs.compute; it still
// renders for real.

const renders = { calls: [] as { opts: unknown; result: Promise<Pick<RenderResult, 'pdf' | 'preflight'>> }[] };
const renderedSchema = z.object({ pdf: z.string(), preflight: preflightSchema });

function countRenders(jobs: TestApp['deps']['jobs']): void {
  const compute = jobs.compute.bind(jobs);
  jobs.compute = <R,>(kind: string, params: unknown, opts?: Parameters<typeof compute>[2]): Promise<R> => {
    const result = compute<R>(kind, params, opts);
    const p = z.object({ doc: z.unknown(), opts: z.unknown() }).safeParse(params);
    if (kind === 'print-render' && p.success) {
      renders.calls.push({ opts: p.data.opts, result: result.then((v) => renderedSchema.parse(v)).then((v) => ({ pdf: Buffer.from(v.pdf, 'base64'), preflight: v.preflight })) });
    }
    return result;
  };
}

let t: TestApp;
let editor: TestAgent;
let puzzles: StubPuzzles;
let pubId: string;

beforeAll(async () => {
  t = await createTestApp();
  countRenders(t.deps.jobs);
  puzzles = stubPuzzles(t.deps);
  t.deps.puzzles = puzzles;
  editor = await t.signInAs('editor');
  const admin = await t.signInAs('admin');
  pubId = (
    await admin
      .post('/api/publications')
      .send({ ...quadrantPublication, title: 'Squared Away Monthly', templateId: 'a4', cadence: 'monthly', reuseWindowDays: 365 })
      .expect(201)
  ).body.id;
});
afterAll(() => t.close());
beforeEach(() => {
  renders.calls.length = 0;
});

async function draftWith(number: number, puzzleIds: string[]): Promise<string> {
  const ed = await editor.post('/api/editions').send({ publicationId: pubId, number, date: `2027-0${number}-01`, introduction: plainRichText('This month.') }).expect(201);
  await editor.patch(`/api/editions/${ed.body.id}`).send({ slots: puzzleIds.map((puzzleId) => ({ puzzleId })) }).expect(200);
  return ed.body.id as string;
}

describe('sending a proof', () => {
  it('renders the edition once, and stores and checks that very rendering', async () => {
    const setterId = await t.createUser('setter');
    const a = puzzles.add({ tiling: TILING_69x61, kind: 'assembly', setterId });
    const d = puzzles.add({ tiling: TILING_33x32, kind: 'deduction', setterId });
    const id = await draftWith(1, [a.id, d.id]);
    renders.calls.length = 0;

    // the Assembly's half-scale 2-piece is under A4's 3 mm floor: sent past it with a reason (issue 16)
    const sent = await editor.post(`/api/editions/${id}/proofs`).send({ override: { reason: 'Small pieces agreed with the printer.' } }).expect(201);

    expect(renders.calls.map((c) => c.opts)).toEqual([{ stamp: 'PROOF', proofVersion: 1 }]);
    const only = await renders.calls[0]!.result;
    const proof = sent.body.proofs[0];
    // the stored file is the bytes of that one rendering (SHA-256, FIPS 180-4 via Node's crypto) ...
    expect(proof.sha256).toBe(createHash('sha256').update(only.pdf).digest('hex'));
    // ... and the preflight stored with it is the one the legibility check read
    expect(proof.preflight).toEqual(only.preflight);
    const floor = only.preflight.warnings.find((w) => w.code === 'error:square-small');
    expect(floor).toBeDefined();
    expect(sent.body.overrides).toEqual([expect.objectContaining({ kind: 'preflight', refused: expect.stringContaining(floor!.message) })]);
  });

  it('renders once when the checks refuse the proof, and stores nothing', async () => {
    const setterId = await t.createUser('setter', { email: 'stale@test.squarewright.test' });
    const stale = puzzles.add({ tiling: TILING_69x61, kind: 'deduction', setterId, current: false });
    const id = await draftWith(2, [stale.id]);
    renders.calls.length = 0;

    const refused = await editor.post(`/api/editions/${id}/proofs`).expect(422);

    expect(refused.body.error.details).toContainEqual({ path: 'slots.1', message: expect.stringMatching(/certificate .* is out of date/), overridable: false });
    expect(renders.calls).toHaveLength(1);
    expect((await editor.get(`/api/editions/${id}`).expect(200)).body).toMatchObject({ state: 'draft', proofs: [] });
  });

  it('leaves the checks route its own unstamped render', async () => {
    const id = (await editor.get('/api/editions').expect(200)).body.items.find((e: { number: number }) => e.number === 2).id;
    renders.calls.length = 0;
    const checks = (await editor.get(`/api/editions/${id}/checks`).expect(200)).body;
    expect(renders.calls.map((c) => c.opts)).toEqual([{ stamp: null }]);
    expect(checks.preflight).toEqual((await renders.calls[0]!.result).preflight);
  });
});
