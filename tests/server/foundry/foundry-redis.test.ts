import { spawn, type ChildProcess } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import { Redis } from 'ioredis';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runSchema, type Run } from '../../../shared/contracts/foundry';
import { fromRoot } from '../../../server/platform/app-root';
import { jobPart } from '../../../server/platform/jobs/schema';
import { createTestApp, type TestApp } from '../helpers/test-app';

// The same foundry run as on the server's own threads, through BullMQ on Redis: an exhaustive
// run of order 16 split into 4 shards, taken by two worker PROCESSES started as `npm run worker`
// starts them (no database); the server runs none of it and stores what comes back. The counts
// are OEIS A002839 (9,016 simple perfect squared rectangles of order 16) and A002881 (953 simple
// imperfect). .ci/run starts a redis-server and sets TEST_REDIS_URL, so CI always runs this; it
// is skipped only on a machine without TEST_REDIS_URL (no Redis to talk to).
const REDIS = process.env.TEST_REDIS_URL;

const procs: ChildProcess[] = [];
function startWorker(env: Record<string, string>): Promise<void> {
  const proc = spawn(process.execPath, ['--import', 'tsx', fromRoot('server', 'worker-main.ts')], {
    cwd: fromRoot(),
    env: { PATH: process.env.PATH ?? '', HOME: process.env.HOME ?? '', ...env },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  procs.push(proc);
  let out = '';
  return new Promise<void>((resolve, reject) => {
    proc.stdout!.on('data', (d: Buffer) => {
      out += d.toString();
      if (out.includes('Squarewright job worker')) resolve();
    });
    proc.stderr!.on('data', (d: Buffer) => (out += d.toString()));
    proc.on('exit', (code) => reject(new Error(`worker exited (${code}): ${out}`)));
  });
}

describe.skipIf(!REDIS)('a foundry run through BullMQ worker processes (skipped: TEST_REDIS_URL is not set, so there is no Redis here)', () => {
  let t: TestApp;
  let env: Record<string, string>;
  beforeAll(async () => {
    env = { REDIS_URL: REDIS!, JOB_QUEUE_PREFIX: `swfoundry-${randomUUID().slice(0, 8)}`, JOB_LOCK_MS: '5000' };
    t = await createTestApp({ env });
    await t.deps.jobs.ready();
  });
  afterAll(async () => {
    for (const p of procs) if (p.exitCode === null) p.kill('SIGKILL');
    await t.close();
    const r = new Redis(REDIS!);
    const keys = await r.keys(`${env.JOB_QUEUE_PREFIX}:*`);
    if (keys.length) await r.del(...keys);
    r.disconnect();
  });

  it('exhaustive order 16 in 4 shards over two worker processes: OEIS counts, every perfect tiling in the stock once', async () => {
    expect(t.deps.jobs.mode).toBe('redis');
    await Promise.all([startWorker({ ...env, JOB_WORKERS: '1' }), startWorker({ ...env, JOB_WORKERS: '1' })]);
    const editor = await t.signInAs('editor');
    const started = runSchema.parse((await editor.post('/api/foundry/runs').send({ mode: 'exhaustive', order: 16 }).expect(201)).body);
    let run: Run = started;
    const deadline = Date.now() + 240_000;
    while (run.state === 'queued' || run.state === 'running') {
      if (Date.now() > deadline) throw new Error(`run still ${run.state}: ${JSON.stringify(run.progress)}`);
      await new Promise((r) => setTimeout(r, 250));
      run = runSchema.parse((await editor.get(`/api/foundry/runs/${started.id}`).expect(200)).body);
    }
    expect(run.state).toBe('done');
    expect(run.summary).toMatchObject({ simplePerfect: 9016, simpleImperfect: 953 });
    expect(run.foundPerfect).toBe(9016);
    // perfect ones only go into the stock (the run did not ask for imperfect ones), each once
    expect(run.addedToStock).toBe(9016);
    const parts = t.db.select().from(jobPart).all().filter((p) => p.jobId === started.id);
    expect(parts.map((p) => p.state)).toEqual(['done', 'done', 'done', 'done']);
    // two workers of one thread each: two shards ran at the same time
    const spans = parts.map((p) => [p.startedAt!.getTime(), p.finishedAt!.getTime()] as const);
    expect(spans.some(([a0, a1], i) => spans.some(([b0, b1], j) => i !== j && a0 < b1 && b0 < a1))).toBe(true);
  }, 300_000);
});
