import { randomUUID } from 'node:crypto';
import type { Dispatcher, JobHost, PartTask } from './host';
import type { ComputeOptions } from './port';
import { ThreadPool, type ThreadPoolOptions } from './thread-pool';

// Thread mode (the default): the parts of every job run on a pool of worker threads in this
// process; their events go straight to the host.

export class ThreadDispatcher implements Dispatcher {
  readonly mode = 'threads' as const;
  private readonly pool: ThreadPool;
  /** task ids per job */
  private readonly tasks = new Map<string, Set<string>>();

  constructor(
    private readonly host: JobHost,
    opts: ThreadPoolOptions,
  ) {
    this.pool = new ThreadPool(opts);
  }

  dispatch(tasks: PartTask[]): void {
    for (const t of tasks) {
      const idx = t.part?.index ?? 0;
      const taskId = `${t.jobId}:${idx}`;
      const set = this.tasks.get(t.jobId) ?? new Set();
      set.add(taskId);
      this.tasks.set(t.jobId, set);
      const forget = () => {
        set.delete(taskId);
        if (set.size === 0) this.tasks.delete(t.jobId);
      };
      this.pool.run(
        { id: taskId, kind: t.kind, params: t.params, input: t.input, part: t.part, budgetMs: t.budgetMs, lane: t.lane },
        {
          started: () => void this.host.partEvent(t.jobId, idx, { type: 'started' }),
          progress: (progress) => void this.host.partEvent(t.jobId, idx, { type: 'progress', progress }),
          // the thread is told when a batch is stored, so it never runs far ahead of storing
          results: (items, stored) => void this.host.partEvent(t.jobId, idx, { type: 'results', items }).finally(stored),
          done: (summary, stopped) => {
            forget();
            void this.host.partEvent(t.jobId, idx, { type: 'done', summary, stopped });
          },
          failed: (error) => {
            forget();
            void this.host.partEvent(t.jobId, idx, { type: 'failed', error });
          },
        },
      );
    }
  }

  stop(jobId: string): void {
    for (const taskId of this.tasks.get(jobId) ?? []) this.pool.cancel(taskId);
    this.tasks.delete(jobId);
  }

  compute(kind: string, params: unknown, opts: ComputeOptions): Promise<unknown> {
    const id = `compute:${randomUUID()}`;
    return new Promise((resolve, reject) => {
      const timer = setTimeout(() => {
        this.pool.cancel(id);
        reject(new Error(`${kind}: no answer within ${opts.timeoutMs ?? 60_000} ms`));
      }, opts.timeoutMs ?? 60_000);
      this.pool.run(
        { id, kind, params, input: null, part: null, budgetMs: null, lane: 'interactive' },
        {
          done: (value) => {
            clearTimeout(timer);
            resolve(value);
          },
          failed: (error) => {
            clearTimeout(timer);
            reject(new Error(error));
          },
        },
      );
    });
  }

  close(): Promise<void> {
    return this.pool.close();
  }
}
