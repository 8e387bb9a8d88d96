import request from 'supertest';
import { afterAll, describe, expect, it } from 'vitest';
import { jobKindNames } from '../../../../server/job-kinds';
import { STORING_PHASE } from '../../../../server/platform/jobs/progress';
import { createJobs, jobEnvFrom } from '../../../../server/platform/jobs/runtime';
import { createTestApp, type TestApp } from '../../helpers/test-app';
import { countSink, jobsFixture, sleep, until, type JobsFixture } from './helpers';

// Storing results on the server: small transactions with a turn of the event loop between
// them, honest progress while storing, and a cancel that stops storing at once.

describe('the storing phase', () => {
  let f: JobsFixture;
  afterAll(() => f.close());

  it('shows its own progress (stored of received, rate, time left), and a cancel during it stores nothing more', async () => {
    // 6,000 results found in a few ms; storing each costs ~0.4 ms, so storing takes seconds
    f = jobsFixture({ busyUs: 400 });
    const id = f.jobs.submit({ kind: 'test-count', params: { to: 6000 } });
    let storing = null as null | NonNullable<ReturnType<typeof f.jobs.get>>['progress'];
    await until(() => {
      const p = f.jobs.get(id)?.progress;
      if (p?.phase === STORING_PHASE && p.rate !== undefined && p.done > 0) storing = p;
      return storing !== null;
    }, 20_000, 'the storing phase with a rate');
    expect(storing!.total).toBe(6000);
    expect(storing!.done).toBeLessThan(6000);
    expect(storing!.etaMs).toBeGreaterThan(0);
    expect(storing!.stored).toBe(storing!.done);

    expect(f.jobs.cancel(id)).toBe(true);
    const atCancel = f.stored.count(id);
    expect(atCancel).toBeGreaterThan(0);
    expect(atCancel).toBeLessThan(6000);
    const r = await f.jobs.wait(id);
    expect(r.state).toBe('cancelled');
    // it says how much it had stored, and nothing more is stored afterwards
    expect(r.summary).toMatchObject({ stored: atCancel, received: 6000, cancelled: true });
    await sleep(500);
    expect(f.stored.count(id)).toBe(atCancel);
  });
});

describe('the API while a large job stores its results', () => {
  let t: TestApp;
  afterAll(() => t.close());

  it('answers a request before the job stores its last batch (storing yields between small transactions)', async () => {
    t = await createTestApp();
    const order: string[] = [];
    let healthSent = false;
    let healthAnswered = false;
    await t.deps.jobs.close();
    const { sink, stored } = countSink(t.db, {
      busyUs: 100,
      onStore: () => {
        order.push('batch');
        if (!healthSent) {
          healthSent = true;
          void request(t.app)
            .get('/api/health')
            .then((res) => {
              order.push(`health ${res.status}`);
              healthAnswered = true;
            });
        }
      },
    });
    t.deps.jobs = createJobs({ db: t.db, kinds: jobKindNames, sinks: [sink], env: jobEnvFrom({}) });
    // 20,000 results at ~0.1 ms each: about 2 s of storing on this thread
    const id = t.deps.jobs.submit({ kind: 'test-count', params: { to: 20_000 } });
    const r = await t.deps.jobs.wait(id);
    expect(r.state).toBe('done');
    expect(stored.count(id)).toBe(20_000);
    expect(healthAnswered).toBe(true);
    const health = order.indexOf('health 200');
    const lastBatch = order.lastIndexOf('batch');
    // the request was answered while batches were still being stored, not after the last one
    expect(health).toBeGreaterThan(0);
    expect(health).toBeLessThan(lastBatch);
    // and storing went in many small transactions, not one big one
    expect(stored.sliceMs.get(id)!.length).toBeGreaterThan(50);
  });
});
