import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { job, jobPart } from '../../../../server/platform/jobs/schema';
import { jobWorkersFromEnv } from '../../../../server/platform/jobs/runtime';
import { jobsFixture, sleep, until, type JobsFixture } from './helpers';

// The job system in thread mode (the default): parts run on worker threads of this process,
// the sink stores results on the main thread in small transactions.

let f: JobsFixture;
beforeAll(() => {
  f = jobsFixture();
});
afterAll(() => f.close());

describe('jobs on worker threads', () => {
  it('runs a job on a thread, streams every result to the sink and stores the summary with the count stored', async () => {
    const id = f.jobs.submit({ kind: 'test-count', params: { to: 2000, every: 10 } });
    const r = await f.jobs.wait(id);
    expect(r.state).toBe('done');
    expect(r.summary).toEqual({ counted: 2000, found: 200, parts: 1, stored: 200, received: 200 });
    expect(f.stored.count(id)).toBe(200);
    expect(r.startedAt).not.toBeNull();
    expect(r.finishedAt).not.toBeNull();
  });

  it('reports progress with done of total, rate and time left while running', async () => {
    const id = f.jobs.submit({ kind: 'test-count', params: { to: 400, stepMs: 3 } });
    let seen = null as null | NonNullable<ReturnType<typeof f.jobs.get>>['progress'];
    await until(() => {
      const p = f.jobs.get(id)?.progress;
      if (p && p.done > 50 && p.done < 400 && p.rate !== undefined) seen = p;
      return seen !== null || f.jobs.get(id)?.state === 'done';
    });
    expect(seen).not.toBeNull();
    expect(seen!.total).toBe(400);
    expect(seen!.phase).toBe('counting');
    expect(seen!.rate).toBeGreaterThan(0);
    expect(seen!.etaMs).toBeGreaterThan(0);
    expect((await f.jobs.wait(id)).state).toBe('done');
  });

  it('splits a job into parts: each part runs with ctx.part, progress and summaries add up', async () => {
    const id = f.jobs.submit({ kind: 'test-count', params: { to: 3000, every: 1, parts: 3 } });
    const r = await f.jobs.wait(id);
    expect(r.state).toBe('done');
    expect(r.summary).toMatchObject({ counted: 3000, found: 3000, parts: 3, stored: 3000 });
    expect(f.stored.count(id)).toBe(3000);
    expect(r.progress).toMatchObject({ parts: { done: 3, count: 3 }, stored: 3000, received: 3000 });
    const parts = f.db.select().from(jobPart).all().filter((p) => p.jobId === id);
    expect(parts.map((p) => p.state)).toEqual(['done', 'done', 'done']);
  });

  it('cancels a running job: it stops at its next poll, and nothing is stored after cancel() returns', async () => {
    const id = f.jobs.submit({ kind: 'test-count', params: { to: 100_000, stepMs: 1 } });
    await until(() => f.stored.count(id) > 0, 20_000, 'first results');
    const t0 = Date.now();
    expect(f.jobs.cancel(id)).toBe(true);
    const atCancel = f.stored.count(id);
    const r = await f.jobs.wait(id);
    expect(r.state).toBe('cancelled');
    // the run says how much it had stored
    expect((r.summary as { stored: number }).stored).toBe(atCancel);
    // the thread stops well within 2 s (it polls at every step)
    await until(() => !f.jobs.active().includes(id), 2000, 'the job to leave the pool');
    expect(Date.now() - t0).toBeLessThan(2000);
    await sleep(400);
    expect(f.stored.count(id)).toBe(atCancel);
  });

  it('cancels a queued job before it starts; nothing of it is stored', async () => {
    const a = f.jobs.submit({ kind: 'test-count', params: { to: 200, stepMs: 2 } });
    const b = f.jobs.submit({ kind: 'test-count', params: { to: 10 } });
    expect(f.jobs.cancel(b)).toBe(true);
    expect((await f.jobs.wait(b)).state).toBe('cancelled');
    expect((await f.jobs.wait(a)).state).toBe('done');
    expect(f.stored.count(b)).toBe(0);
  });

  it('runs an interactive job on an extra thread while a bulk job holds the pool', async () => {
    const bulk = f.jobs.submit({ kind: 'test-count', params: { to: 1_000_000, stepMs: 1 }, lane: 'bulk' });
    await until(() => f.jobs.get(bulk)?.state === 'running');
    const quick = f.jobs.submit({ kind: 'test-count', params: { to: 5 } });
    expect((await f.jobs.wait(quick)).state).toBe('done');
    expect(f.jobs.get(bulk)?.state).toBe('running');
    f.jobs.cancel(bulk);
    expect((await f.jobs.wait(bulk)).state).toBe('cancelled');
  });

  it('stops a job at its time budget and marks the summary', async () => {
    const id = f.jobs.submit({ kind: 'test-count', params: { to: 1_000_000, stepMs: 1 }, budgetMs: 300 });
    const r = await f.jobs.wait(id);
    expect(r.state).toBe('done');
    expect(r.summary).toMatchObject({ budgetExceeded: true });
  });

  it('marks a job whose handler throws as failed with the message', async () => {
    const id = f.jobs.submit({ kind: 'test-count', params: { to: 10, failAt: 5 } });
    const r = await f.jobs.wait(id);
    expect(r.state).toBe('failed');
    expect(r.error).toBe('asked to fail at 5');
  });

  it('fails a job with bad parameters inside the worker, and refuses an unknown kind at once', async () => {
    const id = f.jobs.submit({ kind: 'test-count', params: { to: -1 } });
    const r = await f.jobs.wait(id);
    expect(r.state).toBe('failed');
    expect(r.error).toMatch(/to/);
    expect(() => f.jobs.submit({ kind: 'no-such-kind', params: {} })).toThrow(/unknown job kind 'no-such-kind'/);
  });

  it('computes a value for a waiting caller without storing anything', async () => {
    const before = f.db.select().from(job).all().length;
    const v = await f.jobs.compute<{ counted: number }>('test-count', { to: 50 });
    expect(v).toEqual({ counted: 50, found: 50, stopped: null });
    expect(f.db.select().from(job).all().length).toBe(before);
    await expect(f.jobs.compute('test-count', { to: 10, failAt: 3 })).rejects.toThrow('asked to fail at 3');
  });

  it('reads the thread count from JOB_WORKERS (1 without Redis, 0 with it) and rejects a bad value', () => {
    expect(jobWorkersFromEnv({})).toBe(1);
    expect(jobWorkersFromEnv({ JOB_WORKERS: '2' })).toBe(2);
    expect(jobWorkersFromEnv({ REDIS_URL: 'redis://127.0.0.1:6379' })).toBe(0);
    expect(jobWorkersFromEnv({ REDIS_URL: 'redis://127.0.0.1:6379', JOB_WORKERS: '2' })).toBe(2);
    expect(() => jobWorkersFromEnv({ JOB_WORKERS: 'many' })).toThrow(/JOB_WORKERS/);
    expect(() => jobWorkersFromEnv({ JOB_WORKERS: '0' })).toThrow(/JOB_WORKERS/);
    expect(() => jobWorkersFromEnv({ REDIS_URL: 'http://x' })).toThrow(/REDIS_URL/);
  });
});

describe('after a server stop (thread mode)', () => {
  it('jobs left queued or running become interrupted; resume runs only the parts not done, restart runs all', async () => {
    // part 1 of 3 is slow, so parts 0 and 2 finish and part 1 is still running at the stop
    const id = f.jobs.submit({ kind: 'test-count', params: { to: 3000, every: 1, parts: 3, slowPart: { index: 1, stepMs: 2 } } });
    await until(() => f.db.select().from(jobPart).all().filter((p) => p.jobId === id && p.state === 'done').length === 2, 20_000, 'two parts done');
    const jobs = await f.restart();
    const r = jobs.get(id)!;
    expect(r.state).toBe('interrupted');
    expect(r.error).toMatch(/server stopped/);
    expect(r.retry).toEqual({ resume: true, restart: true });
    const storedBefore = f.stored.count(id);
    expect(storedBefore).toBeGreaterThanOrEqual(2000);
    const notDone = f.db.select().from(jobPart).all().filter((p) => p.jobId === id && p.state !== 'done').map((p) => p.idx);
    expect(notDone).toHaveLength(1);

    jobs.retry(id, 'resume');
    const startedParts: number[] = [];
    const watch = setInterval(() => {
      for (const p of f.db.select().from(jobPart).all()) if (p.jobId === id && p.state === 'running' && !startedParts.includes(p.idx)) startedParts.push(p.idx);
    }, 5);
    const resumed = await jobs.wait(id);
    clearInterval(watch);
    expect(resumed.state).toBe('done');
    expect(startedParts).toEqual(notDone);
    // the summary still adds up every part (the two kept ones from before the stop)
    expect(resumed.summary).toMatchObject({ counted: 3000, found: 3000, parts: 3 });
    expect(f.stored.count(id)).toBe(3000);
    // a finished job does not run again
    expect(() => jobs.retry(id, 'restart')).toThrow(/only an interrupted, failed or cancelled job/);
  });

  it('a cancelled job restarted runs every part again from the start (stored results are not doubled)', async () => {
    const id = f.jobs.submit({ kind: 'test-count', params: { to: 3000, stepMs: 0.3, parts: 2 } });
    await until(() => f.stored.count(id) > 10);
    f.jobs.cancel(id);
    expect((await f.jobs.wait(id)).state).toBe('cancelled');
    expect(f.stored.count(id)).toBeLessThan(3000);
    const attempts = () => f.db.select().from(jobPart).all().filter((p) => p.jobId === id).map((p) => p.attempts);
    const before = attempts();
    f.jobs.retry(id, 'restart');
    const r = await f.jobs.wait(id);
    expect(r.state).toBe('done');
    expect(r.summary).toMatchObject({ counted: 3000, parts: 2 });
    expect(f.stored.count(id)).toBe(3000);
    // both parts ran again
    expect(attempts().map((a, i) => a - before[i]!)).toEqual([1, 1]);
  });
});
