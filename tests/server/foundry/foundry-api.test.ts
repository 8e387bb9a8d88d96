import { eq } from 'drizzle-orm';
import { join } from 'node:path';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runListSchema, runResultsSchema, runSchema, type Run } from '../../../shared/contracts/foundry';
import { closeDatabase, openDatabase } from '../../../server/platform/db/client';
import { stock } from '../../../server/areas/stock/schema';
import { createAppJobs } from '../../../server/compose';
import { createTestApp, type TestApp } from '../helpers/test-app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(async () => {
  await t.close();
});

async function waitFinished(agent: Awaited<ReturnType<TestApp['signInAs']>>, id: string, timeoutMs = 30_000): Promise<Run> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const res = await agent.get(`/api/foundry/runs/${id}`).expect(200);
    const run = runSchema.parse(res.body);
    if (!['queued', 'running'].includes(run.state)) return run;
    if (Date.now() > deadline) throw new Error(`run ${id} still ${run.state}`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

/** Polls until the run has started (at most 200 polls, 50 ms apart), then returns. */
async function waitRunning(agent: Awaited<ReturnType<TestApp['signInAs']>>, id: string): Promise<void> {
  for (let i = 0; i < 200; i++) {
    const r = runSchema.parse((await agent.get(`/api/foundry/runs/${id}`).expect(200)).body);
    if (r.state === 'running') break;
    await new Promise((res) => setTimeout(res, 50));
  }
}

describe('foundry runs API', () => {
  it('is for editors and admins only', async () => {
    await request(t.app).get('/api/foundry/runs').expect(401);
    for (const role of ['setter', 'printer'] as const) {
      const a = await t.signInAs(role);
      await a.get('/api/foundry/runs').expect(403);
      await a.post('/api/foundry/runs').send({ mode: 'exhaustive', order: 9 }).expect(403);
    }
    await (await t.signInAs('admin')).get('/api/foundry/runs').expect(200);
  });

  it('rejects bad run parameters with the place of the problem', async () => {
    const editor = await t.signInAs('editor');
    const bad = await editor.post('/api/foundry/runs').send({ mode: 'exhaustive', order: 19 }).expect(400);
    expect(JSON.stringify(bad.body.error)).toMatch(/body\.order/);
    expect(JSON.stringify(bad.body.error)).toMatch(/squaresOnly/);
    const bad2 = await editor.post('/api/foundry/runs').send({ mode: 'random', count: 3, orderMin: 20, orderMax: 12, seed: 1 }).expect(400);
    expect(JSON.stringify(bad2.body.error)).toMatch(/orderMax/);
    await editor.post('/api/foundry/runs').send({ mode: 'sideways' }).expect(400);
    await editor.get('/api/foundry/runs/not-a-uuid').expect(400);
    await editor.get('/api/foundry/runs/00000000-0000-4000-8000-000000000000').expect(404);
  });

  it('an exhaustive order-9 run finds 2 simple perfect and 1 simple imperfect rectangle, and puts only the perfect ones into the stock', async () => {
    // OEIS A002839 (2 simple perfect of order 9) and A002881 (1 simple imperfect of order 9).
    const editor = await t.signInAs('editor');
    const res = await editor.post('/api/foundry/runs').send({ mode: 'exhaustive', order: 9 }).expect(201);
    const started = runSchema.parse(res.body);
    expect(started.params).toEqual({ mode: 'exhaustive', order: 9, squaresOnly: false, includeImperfect: false });
    const run = await waitFinished(editor, started.id);
    expect(run.state).toBe('done');
    expect(run.summary).toMatchObject({ order: 9, graphs: 2, simplePerfect: 2, simpleImperfect: 1 });
    expect([run.found, run.foundPerfect, run.foundImperfect, run.addedToStock]).toEqual([3, 2, 1, 2]);
    const rows = t.db.select({ key: stock.canonicalKey, provenance: stock.provenance, params: stock.paramsJson, perfect: stock.perfect }).from(stock).where(eq(stock.provenance, 'foundry')).all();
    expect(rows.length).toBe(2);
    expect(rows.every((r) => r.perfect)).toBe(true);
    // the 33 x 32 rectangle of order 9 (squaring.net catalogue)
    expect(rows.map((r) => r.key)).toContain('33x32:18,15,7,8,14,4,10,1,9');
    expect(JSON.parse(rows[0]!.params!)).toMatchObject({ runId: started.id, mode: 'exhaustive', order: 9 });
    const results = runResultsSchema.parse((await editor.get(`/api/foundry/runs/${started.id}/results`).expect(200)).body);
    expect(results.total).toBe(3);
    // every result is listed; the imperfect one has no stock row
    expect(results.items.map((r) => `${r.perfect}:${r.stockId !== null}`).sort()).toEqual(['false:false', 'true:true', 'true:true']);

    // a second run finds the same tilings but adds nothing new to the stock
    const again = runSchema.parse((await editor.post('/api/foundry/runs').send({ mode: 'exhaustive', order: 9 }).expect(201)).body);
    const run2 = await waitFinished(editor, again.id);
    expect([run2.found, run2.addedToStock]).toEqual([3, 0]);
    const list = runListSchema.parse((await editor.get('/api/foundry/runs').expect(200)).body);
    expect(list.items[0]!.id).toBe(again.id);

    // asked for, the imperfect one goes in too
    const all = runSchema.parse((await editor.post('/api/foundry/runs').send({ mode: 'exhaustive', order: 9, includeImperfect: true }).expect(201)).body);
    const run3 = await waitFinished(editor, all.id);
    expect([run3.foundPerfect, run3.foundImperfect, run3.addedToStock]).toEqual([2, 1, 1]);
    expect(t.db.select({ perfect: stock.perfect }).from(stock).where(eq(stock.provenance, 'foundry')).all().filter((r) => !r.perfect)).toHaveLength(1);
  });

  it('a random run is reproducible from its seed and skips what the stock has', async () => {
    const editor = await t.signInAs('editor');
    const body = { mode: 'random', count: 3, orderMin: 12, orderMax: 16, maxSide: 200, seed: 77 };
    const a = await waitFinished(editor, runSchema.parse((await editor.post('/api/foundry/runs').send(body).expect(201)).body).id);
    expect(a.state).toBe('done');
    expect(a.addedToStock).toBe(3);
    const b = await waitFinished(editor, runSchema.parse((await editor.post('/api/foundry/runs').send(body).expect(201)).body).id);
    expect(b.addedToStock).toBe(3);
    expect((b.summary as { rejectedKnown: number }).rejectedKnown).toBeGreaterThanOrEqual(3);
  });

  it('a joining run makes perfect squared squares from same-size stock pairs and stores them', async () => {
    const editor = await t.signInAs('editor');
    const fill = runSchema.parse((await editor.post('/api/foundry/runs').send({ mode: 'exhaustive', order: 14 }).expect(201)).body);
    // OEIS A002839: 744 simple perfect squared rectangles of order 14
    expect((await waitFinished(editor, fill.id)).summary).toMatchObject({ simplePerfect: 744 });
    const join = runSchema.parse((await editor.post('/api/foundry/runs').send({ mode: 'joining' }).expect(201)).body);
    const run = await waitFinished(editor, join.id);
    expect(run.state).toBe('done');
    expect(run.found).toBeGreaterThan(0);
    const results = runResultsSchema.parse((await editor.get(`/api/foundry/runs/${join.id}/results`).expect(200)).body);
    for (const r of results.items) expect([r.square, r.perfect, r.simple]).toEqual([true, true, false]);
    // the two 928 x 705 rectangles of order 14 joined corner to corner: side 928 + 705
    expect(results.items.map((r) => `${r.width}x${r.order}`)).toContain('1633x30');
  });

  it('cancels a running run; what it found so far stays', async () => {
    const editor = await t.signInAs('editor');
    const started = runSchema.parse((await editor.post('/api/foundry/runs').send({ mode: 'exhaustive', order: 18 }).expect(201)).body);
    await waitRunning(editor, started.id);
    const c = await editor.post(`/api/foundry/runs/${started.id}/cancel`).expect(200);
    expect(['running', 'cancelled']).toContain(runSchema.parse(c.body).state);
    const run = await waitFinished(editor, started.id);
    expect(run.state).toBe('cancelled');
    await editor.post(`/api/foundry/runs/${started.id}/cancel`).expect(409);
  });

  it('a run left running when the server stops shows as interrupted after the restart', async () => {
    const editor = await t.signInAs('editor');
    const started = runSchema.parse((await editor.post('/api/foundry/runs').send({ mode: 'exhaustive', order: 18 }).expect(201)).body);
    await waitRunning(editor, started.id);
    // the next server process opens the same database file and starts its own job system
    const db2 = openDatabase(join(t.deps.env.DATA_DIR, 'squarewright.db'));
    const next = createAppJobs({ db: db2, env: t.deps.env });
    try {
      expect(next.get(started.id)?.state).toBe('interrupted');
    } finally {
      await next.close();
      closeDatabase(db2);
    }
    const r = runSchema.parse((await editor.get(`/api/foundry/runs/${started.id}`).expect(200)).body);
    expect(r.state).toBe('interrupted');
    expect(r.error).toMatch(/server stopped/);
    // stop the old process's worker; its late answer must not overwrite the state
    expect(t.deps.jobs.cancel(started.id)).toBe(true);
    for (let i = 0; i < 200 && t.deps.jobs.active().includes(started.id); i++) await new Promise((res) => setTimeout(res, 50));
    expect(t.deps.jobs.active()).not.toContain(started.id);
    expect(runSchema.parse((await editor.get(`/api/foundry/runs/${started.id}`).expect(200)).body).state).toBe('interrupted');
  });
});
