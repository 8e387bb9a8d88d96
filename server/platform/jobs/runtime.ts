import { z } from 'zod';
import type { Db } from '../db/client';
import { JobRunner } from './runner';

// One job runner per database (the app's), started by the composition root (server/compose.ts)
// with the list of job kinds; starting it turns jobs left queued/running by a previous process
// into `interrupted`. After closeJobRunner, jobRunnerFor starts a fresh one with the same kinds.
// Pool size: JOB_WORKERS (default 1 on this 2-core machine), validated here.

const jobEnvSchema = z.object({
  JOB_WORKERS: z.preprocess((v) => (v === '' ? undefined : v), z.coerce.number().int().min(1).max(16).default(1)),
});

export function jobWorkersFromEnv(source: Record<string, string | undefined> = process.env): number {
  const r = jobEnvSchema.safeParse({ JOB_WORKERS: source.JOB_WORKERS });
  if (!r.success) throw new Error(`Invalid environment: JOB_WORKERS: ${r.error.issues[0]?.message ?? 'invalid'} (an integer 1..16)`);
  return r.data.JOB_WORKERS;
}

const runners = new WeakMap<Db, JobRunner>();
const kindsOf = new WeakMap<Db, ReadonlySet<string>>();

/** Start (once) the job runner of this database with the job kinds the workers can run. */
export function startJobRunner(db: Db, kinds: ReadonlySet<string>): JobRunner {
  kindsOf.set(db, kinds);
  return jobRunnerFor(db);
}

export function jobRunnerFor(db: Db): JobRunner {
  let r = runners.get(db);
  if (!r) {
    const kinds = kindsOf.get(db);
    if (!kinds) throw new Error('no job runner was started for this database (server/compose.ts starts it)');
    r = new JobRunner(db, { kinds, size: jobWorkersFromEnv() });
    r.recoverInterrupted();
    runners.set(db, r);
  }
  return r;
}

/** Stop the runner of this database (tests, shutdown): running jobs become interrupted. */
export async function closeJobRunner(db: Db): Promise<void> {
  const r = runners.get(db);
  if (!r) return;
  runners.delete(db);
  await r.close();
}
