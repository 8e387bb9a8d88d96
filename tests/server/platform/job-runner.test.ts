import { jobKindNames } from '../../../server/job-kinds';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDatabase, openDatabase, type Db } from '../../../server/platform/db/client';
import { job } from '../../../server/platform/jobs/schema';
import { JobRunner } from '../../../server/platform/jobs/runner';
import { jobWorkersFromEnv } from '../../../server/platform/jobs/runtime';

// The worker-thread job runner with the tiny 'test-count' kind (server/platform/jobs/test-count-job.ts).

let dir: string;
let db: Db;
let runner: JobRunner;

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'sw-jobs-'));
  db = openDatabase(join(dir, 'jobs.db'));
  runner = new JobRunner(db, { kinds: jobKindNames, size: 1, graceMs: 1000 });
});
afterAll(async () => {
  await runner.close();
  closeDatabase(db);
  rmSync(dir, { recursive: true, force: true });
});

describe('job runner', () => {
  it('runs a job in a worker thread, streams every result back and stores the summary', async () => {
    const got: number[] = [];
    const id = runner.submit({
      kind: 'test-count',
      params: { to: 2000, every: 10 },
      sink: { onResults: (items) => { for (const i of items) got.push((i as { n: number }).n); } },
    });
    const r = await runner.wait(id);
    expect(r.state).toBe('done');
    expect(r.summary).toEqual({ counted: 2000, found: 200, stopped: null });
    expect(got).toEqual(Array.from({ length: 200 }, (_, i) => (i + 1) * 10));
    expect(r.startedAt).not.toBeNull();
    expect(r.finishedAt).not.toBeNull();
  });

  it('reports progress with done of total, rate and time left while running', async () => {
    const id = runner.submit({ kind: 'test-count', params: { to: 400, stepMs: 3 } });
    let seen = null as null | NonNullable<ReturnType<JobRunner['get']>>['progress'];
    for (let i = 0; i < 100 && !seen; i++) {
      await new Promise((r) => setTimeout(r, 50));
      const p = runner.get(id)?.progress;
      if (p && p.done > 0 && p.done < 400) seen = p;
    }
    expect(seen).not.toBeNull();
    expect(seen!.total).toBe(400);
    expect(seen!.rate).toBeGreaterThan(0);
    expect(seen!.etaMs).toBeGreaterThan(0);
    expect((await runner.wait(id)).state).toBe('done');
  });

  it('cancels a running job; the handler stops at its next poll', async () => {
    const id = runner.submit({ kind: 'test-count', params: { to: 100_000, stepMs: 1 } });
    for (let i = 0; i < 100 && runner.get(id)?.state !== 'running'; i++) await new Promise((r) => setTimeout(r, 20));
    await new Promise((r) => setTimeout(r, 100));
    expect(runner.cancel(id)).toBe(true);
    const r = await runner.wait(id);
    expect(r.state).toBe('cancelled');
    expect((r.summary as { counted: number }).counted).toBeLessThan(100_000);
  });

  it('cancels a queued job before it starts', async () => {
    const a = runner.submit({ kind: 'test-count', params: { to: 200, stepMs: 2 } });
    const b = runner.submit({ kind: 'test-count', params: { to: 10 } });
    expect(runner.cancel(b)).toBe(true);
    expect((await runner.wait(b)).state).toBe('cancelled');
    expect((await runner.wait(a)).state).toBe('done');
  });

  it('runs an interactive job in an extra worker while a bulk job occupies the pool', async () => {
    const bulk = runner.submit({ kind: 'test-count', params: { to: 1_000_000, stepMs: 1 }, lane: 'bulk' });
    for (let i = 0; i < 200 && runner.get(bulk)?.state !== 'running'; i++) await new Promise((r) => setTimeout(r, 20));
    const quick = runner.submit({ kind: 'test-count', params: { to: 5 } });
    const r = await runner.wait(quick);
    expect(r.state).toBe('done');
    expect(runner.get(bulk)?.state).toBe('running');
    runner.cancel(bulk);
    expect((await runner.wait(bulk)).state).toBe('cancelled');
  });

  it('stops a job at its time budget and marks the summary', async () => {
    const id = runner.submit({ kind: 'test-count', params: { to: 1_000_000, stepMs: 1 }, budgetMs: 300 });
    const r = await runner.wait(id);
    expect(r.state).toBe('done');
    expect(r.summary).toMatchObject({ stopped: 'budget', budgetExceeded: true });
  });

  it('marks a job whose handler throws as failed with the message', async () => {
    const id = runner.submit({ kind: 'test-count', params: { to: 10, failAt: 5 } });
    const r = await runner.wait(id);
    expect(r.state).toBe('failed');
    expect(r.error).toBe('asked to fail at 5');
  });

  it('fails a job with bad parameters inside the worker, and refuses an unknown kind at once', async () => {
    const id = runner.submit({ kind: 'test-count', params: { to: -1 } });
    const r = await runner.wait(id);
    expect(r.state).toBe('failed');
    expect(r.error).toMatch(/to/);
    expect(() => runner.submit({ kind: 'no-such-kind', params: {} })).toThrow(/unknown job kind 'no-such-kind'/);
  });

  it('turns jobs left queued or running by a stopped server into interrupted on the next start', () => {
    db.insert(job).values([
      { id: 'left-running', kind: 'test-count', params: '{}', state: 'running' },
      { id: 'left-queued', kind: 'test-count', params: '{}', state: 'queued' },
      { id: 'finished', kind: 'test-count', params: '{}', state: 'done' },
    ]).run();
    const next = new JobRunner(db, { kinds: jobKindNames });
    expect(next.recoverInterrupted()).toBe(2);
    expect(next.get('left-running')?.state).toBe('interrupted');
    expect(next.get('left-queued')?.state).toBe('interrupted');
    expect(next.get('finished')?.state).toBe('done');
  });

  it('reads the pool size from JOB_WORKERS (default 1) and rejects a bad value', () => {
    expect(jobWorkersFromEnv({})).toBe(1);
    expect(jobWorkersFromEnv({ JOB_WORKERS: '2' })).toBe(2);
    expect(() => jobWorkersFromEnv({ JOB_WORKERS: 'many' })).toThrow(/JOB_WORKERS/);
  });
});
