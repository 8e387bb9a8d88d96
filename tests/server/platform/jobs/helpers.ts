import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { sql } from 'drizzle-orm';
import { jobKindNames } from '../../../../server/job-kinds';
import { closeDatabase, openDatabase, type Db } from '../../../../server/platform/db/client';
import { defineJobSink, type JobSink, type Jobs } from '../../../../server/platform/jobs/port';
import { createJobs, jobEnvFrom } from '../../../../server/platform/jobs/runtime';
import type { RequestPulse } from '../../../../server/platform/request-pulse';

// The job system's tests run the tiny 'test-count' kind (server/platform/jobs/test-count-job.ts)
// with a sink that writes each result into a table of its own, so what was stored can be counted.

export interface Stored {
  /** the job's rows in the test table */
  count(jobId: string): number;
  /** the time each storing transaction took, ms, per job */
  sliceMs: Map<string, number[]>;
}

/** A sink for 'test-count': one row per result (idempotent by job and number), `busyUs` of work per row. */
export function countSink(db: Db, opts: { busyUs?: number; onStore?: (jobId: string, n: number) => void } = {}): { sink: JobSink; stored: Stored } {
  db.run(sql`create table if not exists test_result (job_id text not null, n integer not null, primary key (job_id, n))`);
  const insert = db.$client.prepare('insert or ignore into test_result (job_id, n) values (?, ?)');
  const sliceMs = new Map<string, number[]>();
  const sink = defineJobSink({
    kind: 'test-count',
    parts: (p) => (p as { parts?: number }).parts ?? 1,
    onResults(items, _tx, job) {
      const t0 = performance.now();
      for (const it of items) {
        insert.run(job.id, (it as { n: number }).n);
        if (opts.busyUs) {
          const until = performance.now() + opts.busyUs / 1000;
          while (performance.now() < until) { /* busy: a costly row */ }
        }
      }
      const list = sliceMs.get(job.id) ?? [];
      list.push(performance.now() - t0);
      sliceMs.set(job.id, list);
      opts.onStore?.(job.id, items.length);
    },
    summarize: (parts) => ({
      counted: parts.reduce((a: number, p) => a + ((p as { counted?: number } | null)?.counted ?? 0), 0),
      found: parts.reduce((a: number, p) => a + ((p as { found?: number } | null)?.found ?? 0), 0),
      parts: parts.length,
    }),
  });
  return {
    sink,
    stored: {
      count: (jobId) => (db.$client.prepare('select count(*) as n from test_result where job_id = ?').get(jobId) as { n: number }).n,
      sliceMs,
    },
  };
}

export interface JobsFixture {
  dir: string;
  db: Db;
  jobs: Jobs;
  stored: Stored;
  /** a second job system on the same database, as the next server process would start */
  restart(): Promise<Jobs>;
  close(): Promise<void>;
}

export function jobsFixture(o: { env?: Record<string, string>; busyUs?: number; graceMs?: number; onStore?: (jobId: string, n: number) => void; pulse?: RequestPulse } = {}): JobsFixture {
  const dir = mkdtempSync(join(tmpdir(), 'sw-jobs-'));
  const db = openDatabase(join(dir, 'jobs.db'));
  const { sink, stored } = countSink(db, { ...(o.busyUs ? { busyUs: o.busyUs } : {}), ...(o.onStore ? { onStore: o.onStore } : {}) });
  const env = jobEnvFrom(o.env ?? {});
  const make = () => createJobs({ db, kinds: jobKindNames, sinks: [sink], env, graceMs: o.graceMs ?? 1000, ...(o.pulse ? { pulse: o.pulse } : {}) });
  const f: JobsFixture = {
    dir,
    db,
    jobs: make(),
    stored,
    async restart() {
      await f.jobs.close();
      f.jobs = make();
      await f.jobs.ready();
      return f.jobs;
    },
    async close() {
      await f.jobs.close();
      closeDatabase(db);
      rmSync(dir, { recursive: true, force: true });
    },
  };
  return f;
}

export const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

/** Poll until `test` holds (default 20 s). */
export async function until(test: () => boolean, timeoutMs = 20_000, what = 'condition'): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  while (!test()) {
    if (Date.now() > deadline) throw new Error(`timed out waiting for ${what}`);
    await sleep(20);
  }
}
