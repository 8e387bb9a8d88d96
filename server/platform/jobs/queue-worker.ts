import { randomUUID } from 'node:crypto';
import { hostname } from 'node:os';
import { Queue, Worker, type Job } from 'bullmq';
import { Redis } from 'ioredis';
import { cancelKey, computeDataSchema, partDataSchema, QUEUE, workerKey, type ResultEvent } from './queue-names';
import { ThreadPool } from './thread-pool';
import type { JobProgress, StopReason } from './types';

// A worker of the Redis mode (decision 032): takes parts of jobs and compute requests from the
// queues and runs them on its own thread pool; sends every event back through the results
// queue. It never opens the database and reads nothing from DATA_DIR: `npm run worker` runs one
// on any machine that reaches Redis; the server runs one itself only when JOB_WORKERS asks.
//
// A worker that dies mid-part holds a lock that expires (lockMs): another worker's stalled
// check puts the part back and it runs again there, from its start (its results are stored
// idempotently). Cancel: the server sets a key this worker polls for the parts it runs.

export interface QueueWorkerOptions {
  redisUrl: string;
  prefix: string;
  /** threads for parts (bulk lane); one more runs interactive work */
  threads: number;
  /** a part's lock; a dead worker's part runs again this long after its last renewal (default 15 s) */
  lockMs?: number;
  /** the threads' nice value (default 10) */
  nice?: number;
  log?: (line: string) => void;
}

const CANCEL_POLL_MS = 250;

export class QueueWorker {
  readonly id = `${hostname()}:${process.pid}:${randomUUID().slice(0, 8)}`;
  private readonly pool: ThreadPool;
  private readonly redis: Redis;
  private readonly results: Queue;
  private readonly workers: Worker[] = [];
  private readonly running = new Map<string, string>(); // taskId -> jobId
  private poll: NodeJS.Timeout | null = null;
  private beat: NodeJS.Timeout | null = null;
  private closed = false;

  constructor(private readonly o: QueueWorkerOptions) {
    this.pool = new ThreadPool({ size: o.threads, nice: o.nice ?? 10 });
    const connection = { url: o.redisUrl, maxRetriesPerRequest: null };
    this.redis = new Redis(o.redisUrl, { maxRetriesPerRequest: null, lazyConnect: false });
    this.results = new Queue(QUEUE.results, { connection, prefix: o.prefix });
    const lockDuration = o.lockMs ?? 15_000;
    const common = { connection, prefix: o.prefix, lockDuration, stalledInterval: Math.max(500, Math.floor(lockDuration / 2)), maxStalledCount: 3 };
    this.workers.push(new Worker(QUEUE.bulk, (job) => this.process(job), { ...common, concurrency: o.threads }));
    this.workers.push(new Worker(QUEUE.interactive, (job) => this.process(job), { ...common, concurrency: 1 }));
    for (const w of this.workers) w.on('error', (e) => this.o.log?.(`worker: ${e.message}`));
    this.poll = setInterval(() => void this.pollCancels(), CANCEL_POLL_MS);
    this.beat = setInterval(() => void this.heartbeat(), 5_000);
    void this.heartbeat();
  }

  /** Ready when the queues are connected. */
  async ready(): Promise<void> {
    await Promise.all(this.workers.map((w) => w.waitUntilReady()));
  }

  async close(): Promise<void> {
    if (this.closed) return;
    this.closed = true;
    if (this.poll) clearInterval(this.poll);
    if (this.beat) clearInterval(this.beat);
    await this.redis.del(workerKey(this.o.prefix, this.id)).catch(() => undefined);
    // force: do not wait for running parts (they stall and run again elsewhere)
    await Promise.all(this.workers.map((w) => w.close(true)));
    await this.pool.close();
    await this.results.close();
    this.redis.disconnect();
  }

  private async heartbeat(): Promise<void> {
    if (this.closed) return;
    await this.redis.set(workerKey(this.o.prefix, this.id), JSON.stringify({ threads: this.o.threads, busy: this.pool.busy() }), 'EX', 15).catch(() => undefined);
  }

  private async pollCancels(): Promise<void> {
    if (this.running.size === 0 || this.closed) return;
    const entries = [...this.running.entries()];
    const jobIds = [...new Set(entries.map(([, j]) => j))];
    let flags: (string | null)[];
    try {
      flags = await this.redis.mget(jobIds.map((j) => cancelKey(this.o.prefix, j)));
    } catch {
      return;
    }
    const cancelled = new Set(jobIds.filter((_, i) => flags[i] !== null));
    for (const [taskId, jobId] of entries) if (cancelled.has(jobId)) this.pool.cancel(taskId);
  }

  private process(job: Job): Promise<unknown> {
    if (job.name === 'compute') return this.compute(job);
    return this.runPart(job);
  }

  private compute(job: Job): Promise<unknown> {
    const d = computeDataSchema.parse(job.data);
    return new Promise((resolve, reject) => {
      this.pool.run(
        { id: `compute:${job.id}`, kind: d.kind, params: d.params, input: null, part: null, budgetMs: null, lane: 'interactive' },
        { done: (value) => resolve(value), failed: (error) => reject(new Error(error)) },
      );
    });
  }

  private async runPart(job: Job): Promise<unknown> {
    const d = partDataSchema.parse(job.data);
    const idx = d.part?.index ?? 0;
    if (await this.redis.exists(cancelKey(this.o.prefix, d.jobId))) return { skipped: 'cancelled' };
    const taskId = `${d.jobId}:${idx}:${randomUUID().slice(0, 8)}`;
    // events go out in order, one results job each
    let chain: Promise<unknown> = Promise.resolve();
    const send = (event: ResultEvent['event']) => {
      const data: ResultEvent = { jobId: d.jobId, idx, event };
      chain = chain.then(() => this.results.add('event', data, { removeOnComplete: true, removeOnFail: 1000 }));
      return chain;
    };
    const outcome = await new Promise<{ summary: unknown; stopped: StopReason | null } | { error: string }>((resolve) => {
      this.running.set(taskId, d.jobId);
      this.pool.run(
        { id: taskId, kind: d.kind, params: d.params, input: d.input, part: d.part, budgetMs: d.budgetMs, lane: job.queueName.endsWith(QUEUE.bulk) ? 'bulk' : 'interactive' },
        {
          started: () => void send({ type: 'started' }),
          progress: (progress: JobProgress) => void send({ type: 'progress', progress }),
          // the thread goes on once the batch is in the queue (it waits when too many are not)
          results: (items, stored) => void send({ type: 'results', items }).finally(stored),
          done: (summary, stopped) => resolve({ summary, stopped }),
          failed: (error) => resolve({ error }),
        },
      );
    });
    this.running.delete(taskId);
    // the part is over only when the server has every event of it
    if ('error' in outcome) await send({ type: 'failed', error: outcome.error });
    else await send({ type: 'done', summary: outcome.summary ?? null, stopped: outcome.stopped });
    return { done: true };
  }
}
