import type { Db, DbOrTx } from '../db/client';
import type { JobLane } from './thread-pool';
import type { job } from './schema';

// THE job port (decision 032): every area submits heavy work through `deps.jobs`. Two
// implementations behind it (./runtime.ts picks one): worker threads in the server process
// (the default) and BullMQ on Redis when REDIS_URL is set (workers in `npm run worker`
// processes, on this machine or others). Either way the server alone writes the database: a
// job kind's worker half computes (server/areas/<area>/<kind>-job.ts, listed in
// server/job-kinds.ts) and its sink, on the server, stores what comes back.

export type { JobLane } from './thread-pool';
export type JobState = (typeof job.$inferSelect)['state'];
export type FinalState = 'done' | 'cancelled' | 'failed' | 'interrupted';

/** A job's progress as stored: the current phase with rate and time left, and how much is stored. */
export interface StoredProgress {
  phase?: string;
  /** units done in the current phase (all parts together) */
  done: number;
  total?: number;
  /** results found so far */
  found?: number;
  /** units per second in the current phase */
  rate?: number;
  /** time left, ms: the search's and the storing's, whichever ends later */
  etaMs?: number;
  elapsedMs?: number;
  /** results stored by the server so far / received from the workers so far */
  stored?: number;
  received?: number;
  /** parts finished of all parts (a job split into parts) */
  parts?: { done: number; count: number };
}

export interface JobRecord {
  id: string;
  kind: string;
  state: JobState;
  params: unknown;
  progress: StoredProgress | null;
  summary: unknown;
  error: string | null;
  budgetMs: number | null;
  createdBy: string | null;
  createdAt: Date;
  startedAt: Date | null;
  finishedAt: Date | null;
  /** can this job be run again from where it stopped ('resume') or from the start ('restart')? */
  retry: { resume: boolean; restart: boolean };
}

export interface SubmitOptions {
  kind: string;
  /** JSON; stored with the job */
  params: unknown;
  /** extra input for the worker half (JSON; not stored in the database). Default: the sink's input(params, db). */
  input?: unknown;
  createdBy?: string | null;
  budgetMs?: number | null;
  /** default: the sink's lane, else 'interactive' */
  lane?: JobLane;
}

export interface ComputeOptions {
  /** give up (reject) after this long; default 60 s */
  timeoutMs?: number;
}

export interface Jobs {
  /** 'threads': worker threads in this process; 'redis': BullMQ on Redis */
  readonly mode: 'threads' | 'redis';
  /** Queue a stored job (its row exists when this returns); returns its id at once. */
  submit(opts: SubmitOptions): string;
  /** Cancel a queued or running job; true if it was. When this returns, nothing more is stored for it. */
  cancel(id: string): boolean;
  /** Run an interrupted, failed or cancelled job again under the same id: 'resume' keeps its finished parts, 'restart' starts over. */
  retry(id: string, how: 'resume' | 'restart'): void;
  get(id: string): JobRecord | null;
  list(kind?: string, limit?: number): JobRecord[];
  /** Ids of the jobs queued or running now. */
  active(): string[];
  /** Resolves once the job reaches a final state. */
  wait(id: string): Promise<JobRecord>;
  /**
   * Heavy work a request awaits (PDF renders, PNGs): runs the kind's handler on a worker and
   * resolves with its return value. Nothing is stored; the request thread is free meanwhile.
   */
  compute<R>(kind: string, params: unknown, opts?: ComputeOptions): Promise<R>;
  /** Stop (tests, shutdown). Threads: running jobs become interrupted. Redis: they go on in the workers. */
  close(): Promise<void>;
  /** Resolves once the queues are connected and an earlier run's jobs are taken back (thread mode: at once). */
  ready(): Promise<void>;
  /** Redis mode: how many workers sent a heartbeat lately; null in thread mode. */
  workerCount(): Promise<number | null>;
}

/** What a sink is told about the job whose results it stores. */
export interface SinkJob {
  id: string;
  params: unknown;
  createdBy: string | null;
}

/** The server half of a job kind: where its results go. Listed in server/compose.ts. */
export interface JobSink {
  kind: string;
  /** default 'interactive' */
  lane?: JobLane;
  /** split a job into this many parts (each worker gets ctx.part); default 1 */
  parts?(params: unknown): number;
  /** what the worker half needs from the database, read when the job starts (and again when it is resumed) */
  input?(params: unknown, db: Db): unknown;
  /** false when the job cannot run again (its input is gone, e.g. an uploaded file); default true */
  retryable?: boolean;
  /**
   * Store results, inside a transaction. Batches are small (the runner sizes them to a few ms
   * and lets requests in between). Must be idempotent: with Redis a batch may come twice.
   */
  onResults?(items: unknown[], tx: DbOrTx, job: SinkJob): void;
  /** Combine the parts' summaries (default: the only one, or { parts: [...] }). */
  summarize?(parts: unknown[]): unknown;
  /** In the transaction that writes the final state. */
  onFinish?(summary: unknown, tx: DbOrTx, state: FinalState, job: SinkJob): void;
}

export function defineJobSink(s: JobSink): JobSink {
  return s;
}
