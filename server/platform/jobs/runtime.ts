import { z } from 'zod';
import type { Db } from '../db/client';
import type { Logger } from '../log';
import type { RequestPulse } from '../request-pulse';
import { JobHost } from './host';
import { ThreadDispatcher } from './local-jobs';
import type { Jobs, JobSink } from './port';
import { QueueWorker } from './queue-worker';
import { RedisDispatcher } from './redis-jobs';

// The job system of the app, built once by the composition root (server/compose.ts) as
// `deps.jobs` (decision 032):
// - no REDIS_URL: worker threads in this process (JOB_WORKERS of them, default 1); jobs left
//   queued or running by an earlier process become interrupted (and may be resumed);
// - REDIS_URL: BullMQ on Redis; `npm run worker` processes run the work; this server runs none
//   unless JOB_WORKERS is set, and stores what the workers send back. Jobs go on across a restart.

const emptyToUndefined = (v: unknown) => (v === '' ? undefined : v);

export const jobEnvSchema = z.object({
  REDIS_URL: z.preprocess(emptyToUndefined, z.url({ error: 'must be a redis:// or rediss:// URL' }).refine((v) => /^rediss?:\/\//.test(v), 'must start with redis:// or rediss://').optional()),
  JOB_WORKERS: z.preprocess(emptyToUndefined, z.coerce.number().int().min(0).max(16).optional()),
  JOB_QUEUE_PREFIX: z.preprocess(emptyToUndefined, z.string().regex(/^[A-Za-z0-9_.-]{1,64}$/, 'letters, digits, _ . - (at most 64)').default('squarewright')),
  /** Redis mode: a part's lock in ms; a dead worker's part runs again this long after its last renewal */
  JOB_LOCK_MS: z.preprocess(emptyToUndefined, z.coerce.number().int().min(500).max(600_000).default(15_000)),
});
export type JobEnv = z.infer<typeof jobEnvSchema>;

export function jobEnvFrom(source: Record<string, string | undefined> = process.env): JobEnv {
  const r = jobEnvSchema.safeParse(source);
  if (!r.success) {
    const i = r.error.issues[0];
    throw new Error(`Invalid environment: ${String(i?.path[0] ?? '')}: ${i?.message ?? 'invalid'}`);
  }
  return r.data;
}

/** Threads of this process for jobs: JOB_WORKERS, default 1 without Redis and 0 with it. */
export function jobWorkersFromEnv(source: Record<string, string | undefined> = process.env): number {
  const e = jobEnvFrom(source);
  const n = e.JOB_WORKERS ?? (e.REDIS_URL ? 0 : 1);
  if (!e.REDIS_URL && n < 1) throw new Error('Invalid environment: JOB_WORKERS: must be at least 1 without REDIS_URL (an integer 1..16)');
  return n;
}

export interface CreateJobsOptions {
  db: Db;
  /** the job kinds' names (server/job-kinds.ts) */
  kinds: ReadonlySet<string>;
  /** the kinds' server halves (server/compose.ts) */
  sinks: readonly JobSink[];
  env: JobEnv;
  log?: Logger;
  /** thread pool: grace after cancel (default 1.5 s) */
  graceMs?: number;
  /** time one storing transaction aims at (default 4 ms) */
  sliceMs?: number;
  /** whether requests came in lately (default: the process's, ../request-pulse.ts) */
  pulse?: RequestPulse;
}

export function createJobs(o: CreateJobsOptions): Jobs {
  const host = new JobHost(o.db, { kinds: o.kinds, sinks: o.sinks, ...(o.log ? { log: o.log } : {}), ...(o.sliceMs ? { sliceMs: o.sliceMs } : {}), ...(o.pulse ? { pulse: o.pulse } : {}) });
  const threads = o.env.JOB_WORKERS ?? (o.env.REDIS_URL ? 0 : 1);
  if (!o.env.REDIS_URL) {
    host.attach(new ThreadDispatcher(host, { size: Math.max(1, threads), ...(o.graceMs ? { graceMs: o.graceMs } : {}) }));
    host.recoverInterrupted();
    return host;
  }
  const redisUrl = o.env.REDIS_URL;
  const prefix = o.env.JOB_QUEUE_PREFIX;
  const taken = host.activateUnfinished();
  const dispatcher = new RedisDispatcher(host, { redisUrl, prefix, ...(o.log ? { log: o.log } : {}) });
  host.attach(dispatcher);
  const local = threads > 0 ? new QueueWorker({ redisUrl, prefix, threads, lockMs: o.env.JOB_LOCK_MS, log: (l) => o.log?.warn(l) }) : null;
  const readyPromise = (async () => {
    await dispatcher.ready();
    await local?.ready();
    await host.requeueMissing(taken, (id, parts) => dispatcher.present(id, parts));
  })();
  readyPromise.catch((e: Error) => o.log?.error(`jobs: Redis at ${redactUrl(redisUrl)}: ${e.message}`));
  host.extend({
    workerCount: () => dispatcher.workers(),
    ready: () => readyPromise,
    beforeClose: async () => {
      await local?.close();
    },
  });
  return host;
}

/** A Redis URL without its password, for messages. */
export function redactUrl(url: string): string {
  return url.replace(/\/\/([^:@/]*):[^@/]*@/, '//$1:***@');
}
