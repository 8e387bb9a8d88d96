import { spawn, type ChildProcess } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import { Redis } from 'ioredis';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { fromRoot } from '../../../../server/platform/app-root';
import { jobPart } from '../../../../server/platform/jobs/schema';
import { jobsFixture, sleep, until, type JobsFixture } from './helpers';

// The Redis mode: jobs through BullMQ on Debian's redis-server, run by worker PROCESSES started
// as `npm run worker` starts them (server/worker-main.ts), with no database. .ci/run starts a
// redis-server on a free port and sets TEST_REDIS_URL; CI always runs these tests. They are
// skipped only on a machine without TEST_REDIS_URL (no Redis to talk to), and say so.
const REDIS = process.env.TEST_REDIS_URL;

/** A worker process, as `npm run worker` starts it. */
interface WorkerProc {
  proc: ChildProcess;
  ready: Promise<void>;
  output: () => string;
}

const procs: ChildProcess[] = [];
function startWorker(env: Record<string, string>): WorkerProc {
  const proc = spawn(process.execPath, ['--import', 'tsx', fromRoot('server', 'worker-main.ts')], {
    cwd: fromRoot(),
    env: { PATH: process.env.PATH ?? '', HOME: process.env.HOME ?? '', ...env },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  procs.push(proc);
  let out = '';
  const ready = new Promise<void>((resolve, reject) => {
    proc.stdout!.on('data', (d: Buffer) => {
      out += d.toString();
      if (out.includes('Squarewright job worker')) resolve();
    });
    proc.stderr!.on('data', (d: Buffer) => (out += d.toString()));
    proc.on('exit', (code) => reject(new Error(`worker exited (${code}): ${out}`)));
  });
  return { proc, ready, output: () => out };
}

describe.skipIf(!REDIS)('jobs through BullMQ on Redis, run by worker processes (skipped: TEST_REDIS_URL is not set, so there is no Redis here)', () => {
  let f: JobsFixture;
  let prefix: string;
  let env: Record<string, string>;

  beforeAll(() => {
    prefix = `swtest-${randomUUID().slice(0, 8)}`;
    // a dead worker's part runs again 2 s after its lock was last renewed
    env = { REDIS_URL: REDIS!, JOB_QUEUE_PREFIX: prefix, JOB_LOCK_MS: '2000' };
    f = jobsFixture({ env });
  });
  afterEach(() => {
    for (const p of procs.splice(0)) if (p.exitCode === null) p.kill('SIGKILL');
  });
  afterAll(async () => {
    await f.close();
    const r = new Redis(REDIS!);
    const keys = await r.keys(`${prefix}:*`);
    if (keys.length) await r.del(...keys);
    r.disconnect();
  });

  it('the server runs no job itself; a worker process runs it and the server stores what it sends back', async () => {
    expect(f.jobs.mode).toBe('redis');
    await f.jobs.ready();
    const id = f.jobs.submit({ kind: 'test-count', params: { to: 3000, every: 3 } });
    await sleep(300);
    // no worker yet: the job waits in the queue
    expect(f.jobs.get(id)?.state).toBe('queued');
    const w = startWorker({ ...env, JOB_WORKERS: '1' });
    await w.ready;
    const r = await f.jobs.wait(id);
    expect(r.state).toBe('done');
    expect(r.summary).toMatchObject({ counted: 3000, found: 1000, stored: 1000 });
    expect(f.stored.count(id)).toBe(1000);
    expect(await f.jobs.workerCount()).toBeGreaterThanOrEqual(1);
    // compute: a value from the worker, nothing stored
    expect(await f.jobs.compute('test-count', { to: 7 })).toEqual({ counted: 7, found: 7, stopped: null });
  });

  it('a worker killed mid-part (kill -9): its part is run again by another worker, and the run completes', async () => {
    // two parts, each ~3 s; worker A takes one, dies in the middle of it; worker B takes it over
    const a = startWorker({ ...env, JOB_WORKERS: '1' });
    await a.ready;
    const id = f.jobs.submit({ kind: 'test-count', params: { to: 1200, every: 1, stepMs: 4, parts: 2 }, lane: 'bulk' });
    await until(() => f.stored.count(id) > 50, 30_000, 'worker A to store results');
    const running = f.db.select().from(jobPart).all().filter((p) => p.jobId === id && p.state === 'running').map((p) => p.idx);
    expect(running).toHaveLength(1);
    const killedPart = running[0]!;
    a.proc.kill('SIGKILL');
    const b = startWorker({ ...env, JOB_WORKERS: '2' });
    await b.ready;
    const r = await f.jobs.wait(id);
    expect(r.state).toBe('done');
    expect(r.summary).toMatchObject({ counted: 1200, found: 1200, parts: 2 });
    // every result once, though the killed part sent some of them twice
    expect(f.stored.count(id)).toBe(1200);
    const parts = f.db.select().from(jobPart).all().filter((p) => p.jobId === id);
    expect(parts.find((p) => p.idx === killedPart)!.attempts).toBeGreaterThanOrEqual(2);
    expect(parts.every((p) => p.state === 'done')).toBe(true);
  });

  it('cancel: the worker stops the part within 2 s and nothing more is stored', async () => {
    const w = startWorker({ ...env, JOB_WORKERS: '1' });
    await w.ready;
    const id = f.jobs.submit({ kind: 'test-count', params: { to: 100_000, stepMs: 2 } });
    await until(() => f.stored.count(id) > 20, 30_000, 'first results');
    expect(f.jobs.cancel(id)).toBe(true);
    const atCancel = f.stored.count(id);
    expect((await f.jobs.wait(id)).state).toBe('cancelled');
    // the worker is free again within 2 s: a short job submitted now starts on it at once
    const t0 = Date.now();
    const next = f.jobs.submit({ kind: 'test-count', params: { to: 5 } });
    expect((await f.jobs.wait(next)).state).toBe('done');
    expect(Date.now() - t0).toBeLessThan(4000);
    await sleep(500);
    expect(f.stored.count(id)).toBe(atCancel);
  });

  it('jobs go on across a server restart: what the workers sent meanwhile is stored, nothing runs again from zero', async () => {
    const w = startWorker({ ...env, JOB_WORKERS: '2' });
    await w.ready;
    const id = f.jobs.submit({ kind: 'test-count', params: { to: 3000, every: 1, stepMs: 1, parts: 2 } });
    await until(() => f.stored.count(id) > 50, 30_000, 'first results');
    // the server stops (its job system closes; the job stays running in Redis and in the table)
    await f.jobs.close();
    await sleep(1500);
    const jobs = await f.restart();
    const r = await jobs.wait(id);
    expect(r.state).toBe('done');
    expect(f.stored.count(id)).toBe(3000);
    const parts = f.db.select().from(jobPart).all().filter((p) => p.jobId === id);
    // resumed, not restarted: each part ran once
    expect(parts.map((p) => p.attempts)).toEqual([1, 1]);
  });
});
