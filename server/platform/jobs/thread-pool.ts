import { Worker } from 'node:worker_threads';
import type { FromWorker, JobPart, JobProgress, StopReason, ToWorker } from './types';
import { sourceBootstrap, workerSpec } from './worker-url';

// A pool of worker threads that run job handlers (server/worker-entry.ts). No database here:
// the pool only computes and reports through the task's callbacks. The server's thread mode
// (./local-jobs.ts) and the worker process (./worker-process.ts) both run their tasks on one.

export type JobLane = 'interactive' | 'bulk';

export interface PoolTask {
  /** unique per task (e.g. `${jobId}:${part}`) */
  id: string;
  kind: string;
  params: unknown;
  input: unknown;
  part: JobPart | null;
  budgetMs: number | null;
  lane: JobLane;
}

export interface PoolCallbacks {
  started?(): void;
  progress?(p: JobProgress): void;
  /** a batch of results; call `stored` once it is stored (or dropped): the thread waits when too many batches are unstored */
  results?(items: unknown[], stored: () => void): void;
  done(summary: unknown, stopped: StopReason | null): void;
  failed(error: string): void;
}

export interface ThreadPoolOptions {
  /** threads for queued work (default 1); interactive work may use one more while all are on bulk work */
  size?: number;
  /** after cancel or budget: how long a handler may take to return before its thread is ended (default 1.5 s) */
  graceMs?: number;
  /** nice value of the threads (Linux: per thread), default 10: requests come first */
  nice?: number;
  /** the extra interactive thread is ended after this long idle (default 60 s: a loaded PDF renderer stays warm) */
  extraIdleMs?: number;
}

interface Slot {
  worker: Worker;
  busy: Running | null;
  /** the one thread beyond `size`, for interactive work only */
  extra: boolean;
  idleTimer: NodeJS.Timeout | null;
}

interface Running {
  task: PoolTask;
  cb: PoolCallbacks;
  flag: Int32Array;
  killTimer: NodeJS.Timeout | null;
  budgetTimer: NodeJS.Timeout | null;
  settled: boolean;
}

interface Waiting {
  task: PoolTask;
  cb: PoolCallbacks;
}

export class ThreadPool {
  private slots: Slot[] = [];
  private queue: Waiting[] = [];
  private closed = false;
  readonly size: number;
  private readonly graceMs: number;
  private readonly nice: number;
  private readonly extraIdleMs: number;

  constructor(opts: ThreadPoolOptions = {}) {
    this.size = Math.max(1, Math.floor(opts.size ?? 1));
    this.graceMs = opts.graceMs ?? 1500;
    this.nice = opts.nice ?? 10;
    this.extraIdleMs = opts.extraIdleMs ?? 60_000;
  }

  /** Queue a task: interactive tasks ahead of bulk ones. */
  run(task: PoolTask, cb: PoolCallbacks): void {
    if (this.closed) throw new Error('thread pool is closed');
    const w = { task, cb };
    if (task.lane === 'interactive') {
      const at = this.queue.findIndex((q) => q.task.lane === 'bulk');
      if (at < 0) this.queue.push(w);
      else this.queue.splice(at, 0, w);
    } else this.queue.push(w);
    this.pump();
  }

  /**
   * Stop a task: a queued one is dropped (its callbacks are not called); a running one is told
   * to stop (its handler polls shouldStop) and, if it has not returned within the grace period,
   * its thread is ended and `done(null, 'cancel')` reported. True when the task was found.
   */
  cancel(taskId: string): boolean {
    const qi = this.queue.findIndex((q) => q.task.id === taskId);
    if (qi >= 0) {
      this.queue.splice(qi, 1);
      return true;
    }
    const slot = this.slots.find((s) => s.busy?.task.id === taskId);
    if (!slot?.busy) return false;
    Atomics.store(slot.busy.flag, 0, 1);
    this.armKill(slot, () => slot.busy?.cb.done(null, 'cancel'));
    return true;
  }

  /** Ids of the tasks queued or running. */
  tasks(): string[] {
    return [...this.queue.map((q) => q.task.id), ...this.slots.flatMap((s) => (s.busy ? [s.busy.task.id] : []))];
  }

  /** Threads running a task now. */
  busy(): number {
    return this.slots.filter((s) => s.busy).length;
  }

  async close(): Promise<void> {
    this.closed = true;
    this.queue = [];
    for (const s of this.slots) {
      if (s.busy) clearTimers(s.busy);
      if (s.idleTimer) clearTimeout(s.idleTimer);
    }
    const all = this.slots;
    this.slots = [];
    await Promise.all(all.map((s) => s.worker.terminate()));
  }

  private spawn(extra: boolean): Slot {
    const spec = workerSpec();
    const worker = new Worker(spec.source ? sourceBootstrap(spec.url) : spec.url, { workerData: { nice: this.nice } });
    const slot: Slot = { worker, busy: null, extra, idleTimer: null };
    worker.on('message', (m: FromWorker) => this.onMessage(slot, m));
    worker.on('error', (e) => this.settle(slot, (r) => r.cb.failed(e instanceof Error ? e.message : String(e))));
    worker.on('exit', (code) => {
      this.settle(slot, (r) => r.cb.failed(`the job's thread exited with code ${code}`));
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
      const interactive = next.task.lane === 'interactive';
      let slot = this.slots.find((s) => s.busy === null && !s.extra) ?? (interactive ? this.slots.find((s) => s.busy === null && s.extra) : undefined);
      if (!slot && this.slots.filter((s) => !s.extra).length < this.size) slot = this.spawn(false);
      // the one extra thread for interactive work while every thread is on bulk work
      if (!slot && interactive && !this.slots.some((s) => s.extra) && this.slots.every((s) => s.busy?.task.lane === 'bulk')) slot = this.spawn(true);
      if (!slot) return;
      this.queue.shift();
      if (slot.idleTimer) {
        clearTimeout(slot.idleTimer);
        slot.idleTimer = null;
      }
      this.start(slot, next);
    }
  }

  private start(slot: Slot, w: Waiting): void {
    // [0]: stop (1 = cancel); [1]: result batches stored so far (the thread waits on it, see worker-entry.ts)
    const sab = new SharedArrayBuffer(8);
    const r: Running = { task: w.task, cb: w.cb, flag: new Int32Array(sab), killTimer: null, budgetTimer: null, settled: false };
    slot.busy = r;
    const t = w.task;
    const msg: ToWorker = { type: 'run', taskId: t.id, kind: t.kind, params: t.params, input: t.input, part: t.part, budgetMs: t.budgetMs, flag: sab };
    slot.worker.ref();
    slot.worker.postMessage(msg);
  }

  /** If the handler does not return within the grace period, end its thread and report `onKill`. */
  private armKill(slot: Slot, onKill: () => void): void {
    const r = slot.busy;
    if (!r || r.killTimer) return;
    r.killTimer = setTimeout(() => {
      if (slot.busy !== r) return;
      // retire this thread before the callback can hand the pool more work
      this.slots = this.slots.filter((s) => s !== slot);
      onKill();
      this.settle(slot, () => undefined);
      void slot.worker.terminate();
      this.pump();
    }, this.graceMs);
  }

  private onMessage(slot: Slot, m: FromWorker): void {
    const r = slot.busy;
    if (!r || r.task.id !== m.taskId) return;
    if (m.type === 'started') {
      r.cb.started?.();
      // the budget counts from when the handler starts (a fresh thread boots first)
      if (r.task.budgetMs !== null && !r.budgetTimer) {
        r.budgetTimer = setTimeout(() => this.armKill(slot, () => r.cb.done(null, 'budget')), r.task.budgetMs);
      }
    } else if (m.type === 'results') {
      const flag = r.flag;
      const stored = () => {
        Atomics.add(flag, 1, 1);
        Atomics.notify(flag, 1);
      };
      if (r.cb.results) r.cb.results(m.items, stored);
      else stored();
    }
    else if (m.type === 'progress') r.cb.progress?.(m.progress);
    else if (m.type === 'done') this.settle(slot, (x) => x.cb.done(m.summary, m.stopped));
    else this.settle(slot, (x) => x.cb.failed(m.error));
  }

  /** The task on this slot ends (once): free the slot, call back, run the next task. */
  private settle(slot: Slot, call: (r: Running) => void): void {
    const r = slot.busy;
    if (!r || r.settled) return;
    r.settled = true;
    clearTimers(r);
    slot.busy = null;
    slot.worker.unref();
    if (slot.extra && this.slots.includes(slot)) {
      // the extra interactive thread goes away after a while idle (kept warm for the next render)
      slot.idleTimer = setTimeout(() => {
        if (slot.busy) return;
        this.slots = this.slots.filter((s) => s !== slot);
        void slot.worker.terminate();
      }, this.extraIdleMs);
      slot.idleTimer.unref();
    }
    call(r);
    this.pump();
  }
}

function clearTimers(r: Running): void {
  if (r.killTimer) clearTimeout(r.killTimer);
  if (r.budgetTimer) clearTimeout(r.budgetTimer);
  r.killTimer = null;
  r.budgetTimer = null;
}
