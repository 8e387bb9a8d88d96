import { z } from 'zod';
import { randomUUID } from 'node:crypto';
import { Worker } from 'node:worker_threads';
import { and, desc, eq, inArray } from 'drizzle-orm';
import type { Db } from '../db/client';
import { parseStoredJson } from '../db/stored-json';
import { job } from './schema';
import type { FromWorker, JobProgress, StopReason, ToWorker } from './types';
import { sourceBootstrap, workerSpec } from './worker-url';

// A small worker-thread pool with persisted jobs. The main thread owns the database: workers
// only compute and stream progress and results back; the submitter's sink stores results.

export type JobState = (typeof job.$inferSelect)['state'];

export interface JobRecord {
  id: string;
  kind: string;
  state: JobState;
  params: unknown;
  progress: (JobProgress & { rate?: number; etaMs?: number; elapsedMs?: number }) | null;
  summary: unknown;
  error: string | null;
  budgetMs: number | null;
  createdBy: string | null;
  createdAt: Date;
  startedAt: Date | null;
  finishedAt: Date | null;
}

/** Main-thread side of a job: stores streamed results (called inside a transaction). */
export interface JobSink {
  onResults?(items: unknown[], tx: Db): void;
  /** after the handler returned, in the same transaction as the final state */
  onFinish?(summary: unknown, tx: Db, state: 'done' | 'cancelled'): void;
}

export interface SubmitOptions {
  kind: string;
  params: unknown;
  /** extra input for the handler (not persisted) */
  input?: unknown;
  createdBy?: string | null;
  budgetMs?: number | null;
  sink?: JobSink;
  /**
   * 'interactive' (default: short jobs someone waits for, e.g. a proof) or 'bulk' (long runs,
   * e.g. the foundry). Interactive jobs go first in the queue, and when every worker is busy
   * with bulk work one extra worker is started for them, so a long run never blocks a proof.
   */
  lane?: JobLane;
}

export type JobLane = 'interactive' | 'bulk';

export interface JobRunnerOptions {
  /** the job kinds the workers can run (the composition root's list, server/job-kinds.ts) */
  kinds: ReadonlySet<string>;
  /** number of worker threads (default 1) */
  size?: number;
  /** grace after cancel / budget before the worker is terminated (default 5 s) */
  graceMs?: number;
}

interface Slot {
  worker: Worker;
  busy: ActiveJob | null;
}

interface ActiveJob {
  id: string;
  lane: JobLane;
  flag: Int32Array;
  sink: JobSink | undefined;
  budgetMs: number | null;
  startedAt: number;
  phase: string | undefined;
  phaseStart: number;
  killTimer: NodeJS.Timeout | null;
  budgetTimer: NodeJS.Timeout | null;
}

interface Queued {
  id: string;
  lane: JobLane;
  kind: string;
  params: unknown;
  input: unknown;
  budgetMs: number | null;
  sink: JobSink | undefined;
}

const FINAL: JobState[] = ['done', 'cancelled', 'failed', 'interrupted'];

export class JobRunner {
  private slots: Slot[] = [];
  private queue: Queued[] = [];
  private waiters = new Map<string, ((r: JobRecord) => void)[]>();
  private closed = false;
  private readonly size: number;
  private readonly graceMs: number;

  private readonly kinds: ReadonlySet<string>;

  constructor(private readonly db: Db, opts: JobRunnerOptions) {
    this.kinds = opts.kinds;
    this.size = Math.max(1, Math.floor(opts.size ?? 1));
    this.graceMs = opts.graceMs ?? 5000;
  }

  /** At start-up: jobs left queued or running by a previous process become interrupted. */
  recoverInterrupted(): number {
    const rows = this.db
      .update(job)
      .set({ state: 'interrupted', finishedAt: new Date(), error: 'the server stopped while this job was queued or running' })
      .where(inArray(job.state, ['queued', 'running']))
      .returning({ id: job.id })
      .all();
    return rows.length;
  }

  submit(opts: SubmitOptions): string {
    if (this.closed) throw new Error('job runner is closed');
    if (!this.kinds.has(opts.kind)) throw new Error(`unknown job kind '${opts.kind}'`);
    const id = randomUUID();
    const budgetMs = opts.budgetMs ?? null;
    this.db
      .insert(job)
      .values({ id, kind: opts.kind, params: JSON.stringify(opts.params), state: 'queued', budgetMs, createdBy: opts.createdBy ?? null })
      .run();
    const lane = opts.lane ?? 'interactive';
    const entry: Queued = { id, lane, kind: opts.kind, params: opts.params, input: opts.input ?? null, budgetMs, sink: opts.sink };
    if (lane === 'interactive') {
      // ahead of every queued bulk job, behind earlier interactive ones
      const at = this.queue.findIndex((q) => q.lane === 'bulk');
      if (at < 0) this.queue.push(entry);
      else this.queue.splice(at, 0, entry);
    } else this.queue.push(entry);
    this.pump();
    return id;
  }

  /** Request cancellation; true when the job was queued or running. */
  cancel(id: string): boolean {
    const qi = this.queue.findIndex((q) => q.id === id);
    if (qi >= 0) {
      const [q] = this.queue.splice(qi, 1);
      this.db.transaction((tx) => {
        q!.sink?.onFinish?.(null, tx as unknown as Db, 'cancelled');
        tx.update(job).set({ state: 'cancelled', cancelRequested: true, finishedAt: new Date() }).where(eq(job.id, id)).run();
      });
      this.notify(id);
      return true;
    }
    const slot = this.slots.find((s) => s.busy?.id === id);
    if (!slot || !slot.busy) return false;
    const a = slot.busy;
    Atomics.store(a.flag, 0, 1);
    this.db.update(job).set({ cancelRequested: true }).where(eq(job.id, id)).run();
    this.armKill(slot, 'cancelled', 'cancelled');
    return true;
  }

  get(id: string): JobRecord | null {
    const row = this.db.select().from(job).where(eq(job.id, id)).get();
    return row ? toRecord(row) : null;
  }

  list(kind?: string, limit = 100): JobRecord[] {
    const q = this.db.select().from(job);
    const rows = (kind ? q.where(eq(job.kind, kind)) : q).orderBy(desc(job.createdAt), desc(job.id)).limit(limit).all();
    return rows.map(toRecord);
  }

  /** Ids of the jobs this runner has queued or running in a worker right now. */
  active(): string[] {
    return [...this.queue.map((q) => q.id), ...this.slots.flatMap((s) => (s.busy ? [s.busy.id] : []))];
  }

  /** Resolves once the job reaches a final state. */
  wait(id: string): Promise<JobRecord> {
    const r = this.get(id);
    if (!r) return Promise.reject(new Error(`no job ${id}`));
    if (FINAL.includes(r.state)) return Promise.resolve(r);
    return new Promise((resolve) => {
      const list = this.waiters.get(id) ?? [];
      list.push(resolve);
      this.waiters.set(id, list);
    });
  }

  /** Stop all workers; running jobs are marked interrupted (as after a restart). */
  async close(): Promise<void> {
    this.closed = true;
    const ids = [...this.queue.map((q) => q.id), ...this.slots.flatMap((s) => (s.busy ? [s.busy.id] : []))];
    this.queue = [];
    for (const s of this.slots) {
      if (s.busy) { clearTimers(s.busy); s.busy = null; }
    }
    await Promise.all(this.slots.map((s) => s.worker.terminate()));
    this.slots = [];
    if (ids.length > 0 && this.db.$client.open) {
      this.db
        .update(job)
        .set({ state: 'interrupted', finishedAt: new Date(), error: 'the server stopped while this job was queued or running' })
        .where(and(inArray(job.id, ids), inArray(job.state, ['queued', 'running'])))
        .run();
    }
    for (const id of ids) this.notify(id);
  }

  private spawn(): Slot {
    const spec = workerSpec();
    const worker = new Worker(spec.source ? sourceBootstrap(spec.url) : spec.url);
    const slot: Slot = { worker, busy: null };
    worker.on('message', (m: FromWorker) => this.onMessage(slot, m));
    worker.on('error', (e) => this.onCrash(slot, e instanceof Error ? e.message : String(e)));
    worker.on('exit', (code) => {
      if (slot.busy) this.onCrash(slot, `worker exited with code ${code}`);
      slot.busy = null;
      this.slots = this.slots.filter((s) => s !== slot);
      if (!this.closed) this.pump();
    });
    worker.unref();
    this.slots.push(slot);
    return slot;
  }

  private pump(): void {
    if (this.closed) return;
    while (this.queue.length > 0) {
      const next = this.queue[0]!;
      let slot = this.slots.find((s) => s.busy === null);
      if (!slot && this.slots.length < this.size) slot = this.spawn();
      if (!slot && next.lane === 'interactive' && this.slots.length === this.size && this.slots.every((s) => s.busy?.lane === 'bulk')) {
        slot = this.spawn(); // the one extra worker for interactive work
      }
      if (!slot) return;
      this.queue.shift();
      this.start(slot, next);
    }
  }

  private start(slot: Slot, q: Queued): void {
    const sab = new SharedArrayBuffer(4);
    const now = Date.now();
    const a: ActiveJob = {
      id: q.id, lane: q.lane, flag: new Int32Array(sab), sink: q.sink, budgetMs: q.budgetMs, startedAt: now,
      phase: undefined, phaseStart: now, killTimer: null, budgetTimer: null,
    };
    slot.busy = a;
    this.db.update(job).set({ state: 'running', startedAt: new Date(now) }).where(eq(job.id, q.id)).run();
    const msg: ToWorker = { type: 'run', jobId: q.id, kind: q.kind, params: q.params, input: q.input, budgetMs: q.budgetMs, flag: sab };
    slot.worker.ref();
    slot.worker.postMessage(msg);
  }

  /** If the handler does not return within the grace period, terminate its worker. */
  private armKill(slot: Slot, state: 'cancelled' | 'failed', error: string): void {
    const a = slot.busy;
    if (!a || a.killTimer) return;
    a.killTimer = setTimeout(() => {
      if (slot.busy !== a) return;
      // retire this worker before finish() hands the slot another job
      this.slots = this.slots.filter((s) => s !== slot);
      slot.busy = null;
      void slot.worker.terminate();
      this.finishJob(a, state, null, state === 'failed' ? error : null);
    }, this.graceMs);
  }

  private onMessage(slot: Slot, m: FromWorker): void {
    const a = slot.busy;
    if (!a || a.id !== m.jobId) return;
    if (m.type === 'started') {
      // the budget counts from when the worker starts the handler (a fresh worker boots first)
      if (a.budgetMs !== null && !a.budgetTimer) {
        a.budgetTimer = setTimeout(() => this.armKill(slot, 'failed', 'time budget exceeded'), a.budgetMs);
      }
    } else if (m.type === 'results') {
      if (a.sink?.onResults) {
        const items = m.items;
        this.db.transaction((tx) => a.sink!.onResults!(items, tx as unknown as Db));
      }
    } else if (m.type === 'progress') {
      const now = Date.now();
      if (m.progress.phase !== a.phase) { a.phase = m.progress.phase; a.phaseStart = now; }
      const elapsed = Math.max(1, now - a.phaseStart);
      const rate = (m.progress.done * 1000) / elapsed;
      const etaMs = m.progress.total !== undefined && rate > 0 ? Math.round(((m.progress.total - m.progress.done) / rate) * 1000) : undefined;
      const p = { ...m.progress, rate: Math.round(rate * 10) / 10, etaMs, elapsedMs: now - a.startedAt };
      this.db.update(job).set({ progress: JSON.stringify(p) }).where(eq(job.id, a.id)).run();
    } else if (m.type === 'done') {
      const state = m.stopped === 'cancel' ? 'cancelled' : 'done';
      this.finish(slot, state, m.summary, null, m.stopped);
    } else {
      this.finish(slot, 'failed', null, m.error);
    }
  }

  private onCrash(slot: Slot, error: string): void {
    if (!slot.busy) return;
    this.finish(slot, 'failed', null, error);
  }

  private finish(slot: Slot, state: 'done' | 'cancelled' | 'failed', summary: unknown, error: string | null, stopped?: StopReason | null): void {
    const a = slot.busy;
    if (!a) return;
    slot.busy = null;
    slot.worker.unref();
    if (this.slots.length > this.size) {
      // the extra interactive worker (or any surplus) goes away when idle
      this.slots = this.slots.filter((s) => s !== slot);
      void slot.worker.terminate();
    }
    this.finishJob(a, state, summary, error, stopped);
  }

  private finishJob(a: ActiveJob, state: 'done' | 'cancelled' | 'failed', summary: unknown, error: string | null, stopped?: StopReason | null): void {
    clearTimers(a);
    if (this.db.$client.open) {
      this.db.transaction((tx) => {
        if (state !== 'failed') a.sink?.onFinish?.(summary, tx as unknown as Db, state);
        const s = stopped === 'budget' && summary !== null && typeof summary === 'object' ? { ...summary, budgetExceeded: true } : summary;
        tx.update(job)
          .set({ state, summary: s === null || s === undefined ? null : JSON.stringify(s), error, finishedAt: new Date() })
          // never overwrite a job another process already marked interrupted
          .where(and(eq(job.id, a.id), eq(job.state, 'running')))
          .run();
      });
    }
    this.notify(a.id);
    this.pump();
  }

  private notify(id: string): void {
    const list = this.waiters.get(id);
    if (!list) return;
    this.waiters.delete(id);
    const r = this.db.$client.open ? this.get(id) : null;
    if (r) for (const f of list) f(r);
  }
}

function clearTimers(a: ActiveJob): void {
  if (a.killTimer) clearTimeout(a.killTimer);
  if (a.budgetTimer) clearTimeout(a.budgetTimer);
  a.killTimer = null;
  a.budgetTimer = null;
}

/** Stored progress as the runner wrote it: done/total/found/phase plus rate, time left and elapsed. */
const storedProgressSchema = z.object({
  done: z.number(),
  total: z.number().optional(),
  found: z.number().optional(),
  phase: z.string().optional(),
  rate: z.number().optional(),
  etaMs: z.number().optional(),
  elapsedMs: z.number().optional(),
});

/** A stored JSON column of the job table; a row that does not parse names the job and column. */
const column = <T>(id: string, name: string, text: string | null, schema: z.ZodType<T>): T | null => parseStoredJson(schema, text, { table: 'job', rowId: id, column: name });

function toRecord(row: typeof job.$inferSelect): JobRecord {
  return {
    id: row.id,
    kind: row.kind,
    state: row.state,
    // params and summary belong to the job's kind, which parses them with its own schema
    params: column(row.id, 'params', row.params, z.unknown()),
    progress: column(row.id, 'progress', row.progress, storedProgressSchema),
    summary: column(row.id, 'summary', row.summary, z.unknown()),
    error: row.error,
    budgetMs: row.budgetMs,
    createdBy: row.createdBy,
    createdAt: row.createdAt,
    startedAt: row.startedAt,
    finishedAt: row.finishedAt,
  };
}
