import { randomUUID } from 'node:crypto';
import { and, asc, desc, eq, inArray, isNull, notInArray, sql } from 'drizzle-orm';
import { z } from 'zod';
import type { Db } from '../db/client';
import { parseStoredJson } from '../db/stored-json';
import type { Logger } from '../log';
import { BACKGROUND_SHARE, processPulse, type RequestPulse } from '../request-pulse';
import type { ComputeOptions, FinalState, JobRecord, Jobs, JobSink, SinkJob, StoredProgress, SubmitOptions } from './port';
import { ProgressTracker } from './progress';
import { job, jobPart } from './schema';
import type { JobLane } from './thread-pool';
import type { JobPart, JobProgress, StopReason } from './types';

// The server side of the job system, the same in both modes: the job table, the parts, the
// sinks that store results, progress, cancel, resume. Where the parts run is the
// dispatcher's business (./local-jobs.ts: threads here; ./redis-jobs.ts: BullMQ workers).
//
// Storing never holds the request thread for long: results are stored in small transactions
// sized to about SLICE_MS each, with a turn of the event loop between them (setImmediate), so
// a request waits behind at most one slice. While requests are coming in (../request-pulse.ts),
// storing takes at most STORE_SHARE of the thread's time, for all jobs (and exports) together:
// after a slice of t ms the next piece of background work starts no sooner than
// t * (1 - share) / share ms later; with no requests it stores flat out. A cancel is handled between slices: once cancel() returns
// nothing more is stored for the job.

/** Time one storing transaction aims at. */
export const SLICE_MS = 4;
/** The share of the request thread storing (with other background work) may take while people are using the server. */
export const STORE_SHARE = BACKGROUND_SHARE;

export interface PartTask {
  jobId: string;
  kind: string;
  params: unknown;
  input: unknown;
  part: JobPart | null;
  budgetMs: number | null;
  lane: JobLane;
}

export type PartEvent =
  | { type: 'started' }
  | { type: 'progress'; progress: JobProgress }
  | { type: 'results'; items: unknown[] }
  | { type: 'done'; summary: unknown; stopped: StopReason | null }
  | { type: 'failed'; error: string };

/** Where parts run. Events come back through JobHost.partEvent. */
export interface Dispatcher {
  readonly mode: 'threads' | 'redis';
  dispatch(tasks: PartTask[]): void;
  /** stop every part of this job (queued ones are dropped) */
  stop(jobId: string): void;
  compute(kind: string, params: unknown, opts: ComputeOptions): Promise<unknown>;
  close(): Promise<void>;
}

export interface JobHostOptions {
  /** the job kinds the workers can run (server/job-kinds.ts) */
  kinds: ReadonlySet<string>;
  /** the kinds' server halves (server/compose.ts) */
  sinks?: readonly JobSink[];
  log?: Logger;
  /** time one storing transaction aims at (tests make it tiny) */
  sliceMs?: number;
  /** whether requests came in lately (default: this process's, beaten by server/app.ts) */
  pulse?: RequestPulse;
}

interface Active {
  id: string;
  kind: string;
  sink: JobSink | undefined;
  job: SinkJob;
  lane: JobLane;
  budgetMs: number | null;
  partCount: number;
  partsLeft: Set<number>;
  partSummaries: Map<number, unknown>;
  tracker: ProgressTracker;
  /** events that store, in order */
  chain: Promise<void>;
  over: boolean;
  stopped: StopReason | null;
  lastWrite: number;
  writeTimer: NodeJS.Timeout | null;
  /** rows per storing transaction, adapted to SLICE_MS */
  chunk: number;
}

const FINAL: readonly string[] = ['done', 'cancelled', 'failed', 'interrupted'];
const PROGRESS_EVERY_MS = 250;

const storedProgressSchema = z.object({
  phase: z.string().optional(),
  done: z.number(),
  total: z.number().optional(),
  found: z.number().optional(),
  rate: z.number().optional(),
  etaMs: z.number().optional(),
  elapsedMs: z.number().optional(),
  stored: z.number().optional(),
  received: z.number().optional(),
  parts: z.object({ done: z.number(), count: z.number() }).optional(),
}) satisfies z.ZodType<StoredProgress>;

const nextTurn = () => new Promise<void>((r) => setImmediate(r));
const incremented = sql`${jobPart.attempts} + 1`;

export class JobHost implements Jobs {
  private dispatcher!: Dispatcher;
  private readonly running = new Map<string, Active>();
  private readonly waiters = new Map<string, ((r: JobRecord) => void)[]>();
  private readonly sinks = new Map<string, JobSink>();
  private readonly kinds: ReadonlySet<string>;
  private readonly sliceMs: number;
  private readonly pulse: RequestPulse;
  private closed = false;

  constructor(
    private readonly db: Db,
    private readonly opts: JobHostOptions,
  ) {
    this.kinds = opts.kinds;
    this.sliceMs = opts.sliceMs ?? SLICE_MS;
    this.pulse = opts.pulse ?? processPulse;
    for (const s of opts.sinks ?? []) this.sinks.set(s.kind, s);
  }

  get mode(): 'threads' | 'redis' {
    return this.dispatcher.mode;
  }

  attach(dispatcher: Dispatcher): void {
    this.dispatcher = dispatcher;
  }

  private extra: { workerCount?: () => Promise<number>; ready?: () => Promise<void>; beforeClose?: () => Promise<void> } = {};

  /** Redis mode's additions (./runtime.ts). */
  extend(e: { workerCount: () => Promise<number>; ready: () => Promise<void>; beforeClose: () => Promise<void> }): void {
    this.extra = e;
  }

  ready(): Promise<void> {
    return this.extra.ready?.() ?? Promise.resolve();
  }

  async workerCount(): Promise<number | null> {
    return this.extra.workerCount ? this.extra.workerCount() : null;
  }

  /** Thread mode, at start-up: jobs left queued or running by an earlier process become interrupted. */
  recoverInterrupted(): number {
    const rows = this.db.select({ id: job.id, kind: job.kind, params: job.params, createdBy: job.createdBy }).from(job).where(inArray(job.state, ['queued', 'running'])).all();
    for (const r of rows) {
      this.db.transaction((tx) => {
        const sink = this.sinks.get(r.kind);
        const params = this.paramsOf(r.id, r.params);
        sink?.onFinish?.(null, tx, 'interrupted', { id: r.id, params, createdBy: r.createdBy });
        tx.update(jobPart).set({ state: 'interrupted' }).where(and(eq(jobPart.jobId, r.id), inArray(jobPart.state, ['queued', 'running']))).run();
        tx.update(job)
          .set({ state: 'interrupted', finishedAt: new Date(), error: 'the server stopped while this job was queued or running' })
          .where(and(eq(job.id, r.id), inArray(job.state, ['queued', 'running'])))
          .run();
      });
    }
    return rows.length;
  }

  /**
   * Redis mode, at start-up: the jobs still queued or running go on (their parts live in Redis
   * and their events wait in the results queue). This takes them back (before the results are
   * consumed); requeueMissing then queues again the parts Redis no longer holds.
   */
  activateUnfinished(): { id: string; open: number[] }[] {
    const out: { id: string; open: number[] }[] = [];
    for (const r of this.db.select().from(job).where(inArray(job.state, ['queued', 'running'])).all()) {
      if (this.running.has(r.id)) continue;
      const parts = this.db.select({ idx: jobPart.idx, state: jobPart.state }).from(jobPart).where(eq(jobPart.jobId, r.id)).orderBy(asc(jobPart.idx)).all();
      const doneParts = new Set(parts.filter((p) => p.state === 'done').map((p) => p.idx));
      this.activate(r.id, r.kind, this.paramsOf(r.id, r.params), r.createdBy, r.budgetMs, parts.length || 1, doneParts, r.startedAt?.getTime() ?? Date.now());
      out.push({ id: r.id, open: (parts.length ? parts.map((p) => p.idx) : [0]).filter((i) => !doneParts.has(i)) });
    }
    return out;
  }

  /** Queue again the parts of taken-back jobs that `present` says the queues no longer hold (resumed, not restarted). */
  async requeueMissing(jobs: { id: string; open: number[] }[], present: (jobId: string, parts: number[]) => Promise<Set<number>>): Promise<void> {
    for (const { id, open } of jobs) {
      const a = this.running.get(id);
      if (!a || a.over) continue;
      const there = await present(id, open);
      const again = open.filter((i) => !there.has(i) && a.partsLeft.has(i));
      if (again.length > 0) this.dispatchParts(a, again);
      else if (a.partsLeft.size === 0) void this.enqueue(a, () => this.finishIfDone(a));
    }
  }

  submit(opts: SubmitOptions): string {
    if (this.closed) throw new Error('the job system is closed');
    if (!this.kinds.has(opts.kind)) throw new Error(`unknown job kind '${opts.kind}'`);
    const sink = this.sinks.get(opts.kind);
    const id = randomUUID();
    const parts = Math.max(1, Math.floor(sink?.parts?.(opts.params) ?? 1));
    const budgetMs = opts.budgetMs ?? null;
    this.db.transaction((tx) => {
      tx.insert(job).values({ id, kind: opts.kind, params: JSON.stringify(opts.params), state: 'queued', budgetMs, createdBy: opts.createdBy ?? null }).run();
      tx.insert(jobPart).values(Array.from({ length: parts }, (_, idx) => ({ jobId: id, idx }))).run();
    });
    const a = this.activate(id, opts.kind, opts.params, opts.createdBy ?? null, budgetMs, parts, new Set(), Date.now(), opts.lane);
    this.dispatchParts(a, [...a.partsLeft], opts.input);
    return id;
  }

  cancel(id: string): boolean {
    const a = this.running.get(id);
    if (!a || a.over) return false;
    this.end(a, 'cancelled', null, { cancelled: true });
    this.dispatcher.stop(id);
    return true;
  }

  retry(id: string, how: 'resume' | 'restart'): void {
    const r = this.db.select().from(job).where(eq(job.id, id)).get();
    if (!r) throw new Error(`no job ${id}`);
    if (!['interrupted', 'failed', 'cancelled'].includes(r.state)) throw new Error(`job ${id} is ${r.state}; only an interrupted, failed or cancelled job can run again`);
    const sink = this.sinks.get(r.kind);
    if (sink?.retryable === false) throw new Error(`a ${r.kind} job cannot run again`);
    const params = this.paramsOf(id, r.params);
    let parts = this.db.select({ idx: jobPart.idx, state: jobPart.state }).from(jobPart).where(eq(jobPart.jobId, id)).orderBy(asc(jobPart.idx)).all();
    if (parts.length === 0) parts = [{ idx: 0, state: 'interrupted' }];
    const keep = how === 'resume' ? new Set(parts.filter((p) => p.state === 'done').map((p) => p.idx)) : new Set<number>();
    this.db.transaction((tx) => {
      tx.update(job).set({ state: 'queued', error: null, summary: null, progress: null, cancelRequested: false, finishedAt: null, startedAt: null }).where(eq(job.id, id)).run();
      // a resumed job keeps its finished parts (with their summaries); the others start again
      const again = { state: 'queued' as const, summary: null, error: null, startedAt: null, finishedAt: null };
      if (keep.size > 0) tx.update(jobPart).set(again).where(and(eq(jobPart.jobId, id), notInArray(jobPart.idx, [...keep]))).run();
      else tx.update(jobPart).set(again).where(eq(jobPart.jobId, id)).run();
      if (parts.length === 1 && parts[0]!.state === 'interrupted') tx.insert(jobPart).values({ jobId: id, idx: 0 }).onConflictDoNothing().run();
    });
    const a = this.activate(id, r.kind, params, r.createdBy, r.budgetMs, parts.length, keep, Date.now());
    this.dispatchParts(a, [...a.partsLeft]);
  }

  get(id: string): JobRecord | null {
    const row = this.db.select().from(job).where(eq(job.id, id)).get();
    return row ? this.toRecord(row) : null;
  }

  list(kind?: string, limit = 100): JobRecord[] {
    const q = this.db.select().from(job);
    const rows = (kind ? q.where(eq(job.kind, kind)) : q).orderBy(desc(job.createdAt), desc(job.id)).limit(limit).all();
    return rows.map((r) => this.toRecord(r));
  }

  active(): string[] {
    return [...this.running.keys()];
  }

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

  compute<R>(kind: string, params: unknown, opts: ComputeOptions = {}): Promise<R> {
    if (this.closed) return Promise.reject(new Error('the job system is closed'));
    if (!this.kinds.has(kind)) return Promise.reject(new Error(`unknown job kind '${kind}'`));
    return this.dispatcher.compute(kind, params, opts) as Promise<R>;
  }

  /** Thread mode: running jobs become interrupted. Redis mode: they stay queued or running (the workers go on). */
  async close(): Promise<void> {
    if (this.closed) return;
    this.closed = true;
    await this.extra.beforeClose?.();
    const interrupt = this.dispatcher.mode === 'threads';
    for (const a of this.running.values()) {
      if (a.over) continue;
      if (interrupt && this.db.$client.open) this.end(a, 'interrupted', 'the server stopped while this job was queued or running');
      else a.over = true;
    }
    this.running.clear();
    await this.dispatcher.close();
  }

  /** An event from a part running somewhere. Resolves once it is handled (results: stored). */
  partEvent(jobId: string, idx: number, ev: PartEvent): Promise<void> {
    const a = this.running.get(jobId);
    if (!a || a.over || !a.partsLeft.has(idx)) return Promise.resolve();
    const now = Date.now();
    switch (ev.type) {
      case 'started':
        this.db.transaction((tx) => {
          tx.update(jobPart).set({ state: 'running', startedAt: new Date(now), attempts: incremented }).where(and(eq(jobPart.jobId, jobId), eq(jobPart.idx, idx))).run();
          tx.update(job).set({ state: 'running' }).where(and(eq(job.id, jobId), eq(job.state, 'queued'))).run();
          tx.update(job).set({ startedAt: new Date(now) }).where(and(eq(job.id, jobId), isNull(job.startedAt))).run();
        });
        a.tracker.restartPart(idx);
        return Promise.resolve();
      case 'progress':
        a.tracker.report(idx, ev.progress, now);
        this.writeProgress(a, false);
        return Promise.resolve();
      case 'results':
        a.tracker.addReceived(ev.items.length);
        return this.enqueue(a, () => this.store(a, ev.items));
      case 'done':
        // the search of this part is over now; its results may still be in the storing queue
        if (ev.stopped !== 'cancel') a.tracker.finishPart(idx);
        this.writeProgress(a, false);
        return this.enqueue(a, () => this.partDone(a, idx, ev.summary, ev.stopped));
      case 'failed':
        return this.enqueue(a, () => {
          if (!a.over) {
            this.end(a, 'failed', a.partCount > 1 ? `part ${idx + 1} of ${a.partCount}: ${ev.error}` : ev.error);
            this.dispatcher.stop(a.id);
          }
        });
    }
  }

  /** The job's input for its worker half (the sink reads it from the database). */
  inputFor(kind: string, params: unknown): unknown {
    const sink = this.sinks.get(kind);
    return sink?.input ? sink.input(params, this.db) : null;
  }

  // ---- inside --------------------------------------------------------------------------------

  private activate(id: string, kind: string, params: unknown, createdBy: string | null, budgetMs: number | null, partCount: number, done: Set<number>, startedAt: number, lane?: JobLane): Active {
    const sink = this.sinks.get(kind);
    const a: Active = {
      id, kind, sink, job: { id, params, createdBy }, lane: lane ?? sink?.lane ?? 'interactive', budgetMs, partCount,
      partsLeft: new Set(Array.from({ length: partCount }, (_, i) => i).filter((i) => !done.has(i))),
      partSummaries: new Map(),
      tracker: new ProgressTracker(partCount, startedAt, done),
      chain: Promise.resolve(), over: false, stopped: null, lastWrite: 0, writeTimer: null, chunk: 16,
    };
    this.running.set(id, a);
    return a;
  }

  private dispatchParts(a: Active, idxs: number[], input?: unknown): void {
    if (idxs.length === 0) {
      void this.enqueue(a, () => this.finishIfDone(a));
      return;
    }
    let inp: unknown;
    try {
      inp = input !== undefined ? input : this.inputFor(a.kind, a.job.params);
    } catch (e) {
      this.end(a, 'failed', `could not prepare the job's input: ${(e as Error).message}`);
      return;
    }
    this.dispatcher.dispatch(
      idxs.map((idx) => ({
        jobId: a.id, kind: a.kind, params: a.job.params, input: inp, budgetMs: a.budgetMs, lane: a.lane,
        part: a.partCount > 1 ? { index: idx, count: a.partCount } : null,
      })),
    );
  }

  private enqueue(a: Active, step: () => void | Promise<void>): Promise<void> {
    const next = a.chain.then(async () => {
      if (a.over) return;
      try {
        await step();
      } catch (e) {
        if (a.over || !this.db.$client.open) return;
        this.opts.log?.error(`job ${a.id} (${a.kind}): ${(e as Error).message}`);
        this.end(a, 'failed', (e as Error).message);
        this.dispatcher.stop(a.id);
      }
    });
    a.chain = next;
    return next;
  }

  /** Store a batch in slices of about SLICE_MS, yielding to requests between them. */
  private async store(a: Active, items: unknown[]): Promise<void> {
    const onResults = a.sink?.onResults;
    if (!onResults) {
      a.tracker.addStored(items.length, Date.now());
      return;
    }
    let i = 0;
    while (i < items.length) {
      // people first: wait for background work's turn (shared by every job and export), checking cancel after
      await this.pulse.backgroundTurn();
      if (a.over || this.closed) return;
      const n = Math.min(items.length - i, a.chunk);
      const slice = items.slice(i, i + n);
      const t0 = performance.now();
      this.db.transaction((tx) => onResults(slice, tx, a.job));
      const t1 = performance.now();
      const dt = t1 - t0;
      this.pulse.backgroundDone(dt, STORE_SHARE, t1);
      i += n;
      a.tracker.addStored(n, Date.now());
      // the next slice's size from this one's time per row, kept near sliceMs
      const per = dt / n;
      a.chunk = Math.max(1, Math.min(2000, Math.floor(this.sliceMs / Math.max(per, 0.0005))));
      this.writeProgress(a, false);
      await nextTurn();
    }
  }

  private partDone(a: Active, idx: number, summary: unknown, stopped: StopReason | null): void {
    if (stopped === 'cancel') return; // the job was cancelled (and ended) already
    if (stopped === 'budget') a.stopped = 'budget';
    a.partsLeft.delete(idx);
    a.partSummaries.set(idx, summary);
    a.tracker.finishPart(idx);
    this.db
      .update(jobPart)
      .set({ state: 'done', summary: summary === undefined || summary === null ? null : JSON.stringify(summary), finishedAt: new Date() })
      .where(and(eq(jobPart.jobId, a.id), eq(jobPart.idx, idx)))
      .run();
    this.finishIfDone(a);
  }

  private finishIfDone(a: Active): void {
    if (a.over) return;
    if (a.partsLeft.size > 0) {
      this.writeProgress(a, true);
      return;
    }
    this.end(a, 'done', null);
  }

  private summaryOf(a: Active): unknown {
    // the summaries of the finished parts, including those finished before a resume
    const stored = new Map(
      this.db.select({ idx: jobPart.idx, summary: jobPart.summary }).from(jobPart).where(eq(jobPart.jobId, a.id)).all().map((p) => [p.idx, p.summary] as const),
    );
    const parts: unknown[] = [];
    for (let i = 0; i < a.partCount; i++) {
      if (a.partSummaries.has(i)) parts.push(a.partSummaries.get(i));
      else {
        const text = stored.get(i);
        if (text) parts.push(parseStoredJson(z.unknown(), text, { table: 'job_part', rowId: `${a.id}/${i}`, column: 'summary' }));
      }
    }
    if (a.sink?.summarize) return a.sink.summarize(parts);
    if (a.partCount === 1) return parts[0] ?? null;
    return { parts };
  }

  /** The job's final state, written once, with the sink's onFinish in the same transaction. */
  private end(a: Active, state: FinalState, error: string | null, extra: Record<string, unknown> = {}): void {
    if (a.over) return;
    a.over = true;
    if (a.writeTimer) clearTimeout(a.writeTimer);
    this.running.delete(a.id);
    if (this.db.$client.open) {
      const progress = a.tracker.view(Date.now());
      // the sink gets the kind's own summary; the job's row adds how much was stored
      const summary = state === 'done' || state === 'cancelled' ? this.summaryOf(a) : null;
      const counts = { stored: a.tracker.stored, received: a.tracker.received, ...extra, ...(a.stopped === 'budget' ? { budgetExceeded: true } : {}) };
      const row = summary !== null && typeof summary === 'object' && !Array.isArray(summary) ? { ...summary, ...counts } : { ...(summary === null ? {} : { value: summary }), ...counts };
      this.db.transaction((tx) => {
        a.sink?.onFinish?.(summary, tx, state, a.job);
        tx.update(jobPart).set({ state: state === 'done' ? 'done' : state, finishedAt: new Date() }).where(and(eq(jobPart.jobId, a.id), inArray(jobPart.state, ['queued', 'running']))).run();
        tx.update(job)
          .set({ state, summary: JSON.stringify(row), error, progress: JSON.stringify(progress), finishedAt: new Date(), ...(state === 'cancelled' ? { cancelRequested: true } : {}) })
          // never overwrite a job another process already finished
          .where(and(eq(job.id, a.id), inArray(job.state, ['queued', 'running'])))
          .run();
      });
    }
    this.notify(a.id);
  }

  private writeProgress(a: Active, force: boolean): void {
    if (a.over) return;
    const now = Date.now();
    if (!force && now - a.lastWrite < PROGRESS_EVERY_MS) {
      a.writeTimer ??= setTimeout(() => {
        a.writeTimer = null;
        this.writeProgress(a, true);
      }, PROGRESS_EVERY_MS);
      return;
    }
    a.lastWrite = now;
    if (!this.db.$client.open) return;
    this.db.update(job).set({ progress: JSON.stringify(a.tracker.view(now)) }).where(eq(job.id, a.id)).run();
  }

  private notify(id: string): void {
    const list = this.waiters.get(id);
    if (!list) return;
    this.waiters.delete(id);
    const r = this.db.$client.open ? this.get(id) : null;
    if (r) for (const f of list) f(r);
  }

  private paramsOf(id: string, text: string): unknown {
    return parseStoredJson(z.unknown(), text, { table: 'job', rowId: id, column: 'params' });
  }

  private toRecord(row: typeof job.$inferSelect): JobRecord {
    const sink = this.sinks.get(row.kind);
    const retryable = sink?.retryable !== false && ['interrupted', 'failed', 'cancelled'].includes(row.state);
    return {
      id: row.id,
      kind: row.kind,
      state: row.state,
      // params and summary belong to the job's kind, which parses them with its own schema
      params: parseStoredJson(z.unknown(), row.params, { table: 'job', rowId: row.id, column: 'params' }),
      progress: parseStoredJson(storedProgressSchema, row.progress, { table: 'job', rowId: row.id, column: 'progress' }),
      summary: parseStoredJson(z.unknown(), row.summary, { table: 'job', rowId: row.id, column: 'summary' }),
      error: row.error,
      budgetMs: row.budgetMs,
      createdBy: row.createdBy,
      createdAt: row.createdAt,
      startedAt: row.startedAt,
      finishedAt: row.finishedAt,
      retry: { resume: retryable, restart: retryable },
    };
  }
}
