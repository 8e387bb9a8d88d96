import request from 'supertest';
import { afterAll, describe, expect, it } from 'vitest';
import { jobKindNames } from '../../../../server/job-kinds';
import { STORE_SHARE } from '../../../../server/platform/jobs/host';
import { BATCH_ITEMS, MAX_UNSTORED_BATCHES } from '../../../../server/platform/jobs/types';
import { STORING_PHASE } from '../../../../server/platform/jobs/progress';
import { createJobs, jobEnvFrom } from '../../../../server/platform/jobs/runtime';
import { RequestPulse } from '../../../../server/platform/request-pulse';
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

describe('storing gives way while people use the server', () => {
  // Two jobs store at once, each row costs 0.4 ms. With requests coming in (the pulse beaten
  // every 20 ms, as the HTTP layer does per request), both together take at most their share
  // (0.25, STORE_SHARE) of the thread; with no requests they store flat out.
  const run = async (busy: boolean) => {
    const pulse = new RequestPulse();
    const ends: { at: number; job: string }[] = [];
    const f = jobsFixture({ busyUs: 400, pulse, onStore: (job) => ends.push({ at: performance.now(), job }) });
    const beat = busy ? setInterval(() => pulse.beat(), 20) : null;
    pulse.beat(); // the first slice already sees the pulse when busy is true; harmless when not (one slice)
    try {
      const ids = [f.jobs.submit({ kind: 'test-count', params: { to: 1500 } }), f.jobs.submit({ kind: 'test-count', params: { to: 1500 } })];
      for (const id of ids) expect((await f.jobs.wait(id)).state).toBe('done');
      for (const id of ids) expect(f.stored.count(id)).toBe(1500);
      // busy time of every slice (measured inside the transaction) over the time from the first slice's start to the last one's end
      const slices = ends.map((e, i) => ({ ...e, ms: f.stored.sliceMs.get(e.job)![ends.slice(0, i).filter((x) => x.job === e.job).length]! }));
      const start = Math.min(...slices.map((s) => s.at - s.ms));
      const span = Math.max(...slices.map((s) => s.at)) - start;
      const busyMs = slices.reduce((a, s) => a + s.ms, 0);
      return { share: busyMs / span, slices: slices.length, busyMs };
    } finally {
      if (beat) clearInterval(beat);
      await f.close();
    }
  };

  it('takes at most STORE_SHARE of the thread for all jobs together while requests come in, and the whole thread when none do', async () => {
    const busy = await run(true);
    expect(STORE_SHARE).toBe(0.25);
    expect(busy.busyMs).toBeGreaterThan(1000); // 3,000 rows at 0.4 ms: the measurement is long enough to mean something
    expect(busy.slices).toBeGreaterThan(50);
    // timers never fire early by more than their millisecond rounding, so the share can only come out lower
    expect(busy.share).toBeLessThanOrEqual(0.3);
    const idle = await run(false);
    expect(idle.share).toBeGreaterThan(0.5);
  }, 60_000);
});

describe('flow control between a job thread and storing', () => {
  it('keeps at most MAX_UNSTORED_BATCHES batches of results waiting to be stored, however fast the search', async () => {
    // counting to 8,000 takes the thread milliseconds; storing each result costs 0.5 ms, so
    // without flow control nearly all 8,000 would wait in the server's memory at once
    const f = jobsFixture({ busyUs: 500 });
    try {
      const id = f.jobs.submit({ kind: 'test-count', params: { to: 8000 } });
      let most = 0;
      let seen = 0;
      while (f.jobs.get(id)?.state !== 'done') {
        const p = f.jobs.get(id)?.progress;
        if (p?.received !== undefined && p.stored !== undefined) {
          most = Math.max(most, p.received - p.stored);
          seen++;
        }
        await sleep(25);
      }
      expect(f.stored.count(id)).toBe(8000);
      expect(seen).toBeGreaterThan(10);
      expect(most).toBeGreaterThan(0);
      expect(most).toBeLessThanOrEqual(MAX_UNSTORED_BATCHES * BATCH_ITEMS);
    } finally {
      await f.close();
    }
  }, 60_000);
});
