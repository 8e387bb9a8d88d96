import { Queue, QueueEvents, Worker, type Job } from 'bullmq';
import { Redis } from 'ioredis';
import type { Logger } from '../log';
import type { Dispatcher, JobHost, PartTask } from './host';
import type { ComputeOptions } from './port';
import { cancelKey, parsePartQueueId, partQueueId, QUEUE, resultEventSchema, workerKey, type PartData } from './queue-names';

// Redis mode (decision 032): parts of jobs go to BullMQ queues; workers (`npm run worker`, or
// this process when JOB_WORKERS asks) run them and send their events back through the results
// queue, which this server alone consumes: it stores results (the only writer of SQLite). The
// queues outlive the server: after a restart it consumes what the workers sent meanwhile and
// queues again the parts Redis no longer holds (resumed, not restarted).

export interface RedisDispatcherOptions {
  redisUrl: string;
  prefix: string;
  log?: Logger;
}

const PRIORITY = { interactive: 1, bulk: 10 } as const;

export class RedisDispatcher implements Dispatcher {
  readonly mode = 'redis' as const;
  private readonly queues: Record<'bulk' | 'interactive', Queue>;
  private readonly redis: Redis;
  private readonly consumer: Worker;
  private readonly events: QueueEvents[];
  private readonly interactiveEvents: QueueEvents;
  private closed = false;

  constructor(
    private readonly host: JobHost,
    private readonly o: RedisDispatcherOptions,
  ) {
    const connection = { url: o.redisUrl, maxRetriesPerRequest: null };
    this.redis = new Redis(o.redisUrl, { maxRetriesPerRequest: null });
    this.queues = {
      bulk: new Queue(QUEUE.bulk, { connection, prefix: o.prefix }),
      interactive: new Queue(QUEUE.interactive, { connection, prefix: o.prefix }),
    };
    // one consumer, one event at a time: a job's events are stored in the order they were sent
    this.consumer = new Worker(QUEUE.results, (job) => this.consume(job), { connection, prefix: o.prefix, concurrency: 1, lockDuration: 60_000 });
    this.consumer.on('error', (e) => o.log?.warn(`jobs: results queue: ${e.message}`));
    // a part that failed in the queue itself (e.g. its worker died too often) fails its job
    this.events = (['bulk', 'interactive'] as const).map((name) => {
      const ev = new QueueEvents(QUEUE[name], { connection, prefix: o.prefix });
      ev.on('failed', ({ jobId, failedReason }) => {
        const p = parsePartQueueId(jobId);
        if (p) void this.host.partEvent(p.jobId, p.idx, { type: 'failed', error: `the queue gave up on it: ${failedReason}` });
      });
      return ev;
    });
    this.interactiveEvents = this.events[1]!;
  }

  async ready(): Promise<void> {
    await Promise.all([this.consumer.waitUntilReady(), ...this.events.map((e) => e.waitUntilReady()), this.queues.bulk.waitUntilReady(), this.queues.interactive.waitUntilReady()]);
  }

  dispatch(tasks: PartTask[]): void {
    for (const t of tasks) {
      const idx = t.part?.index ?? 0;
      const data: PartData = { jobId: t.jobId, kind: t.kind, params: t.params, input: t.input, part: t.part, budgetMs: t.budgetMs };
      const q = this.queues[t.lane];
      void q
        .add(t.kind, data, { jobId: partQueueId(t.jobId, idx), priority: PRIORITY[t.lane], removeOnComplete: { age: 3600 }, removeOnFail: { age: 24 * 3600 } })
        .catch((e: Error) => void this.host.partEvent(t.jobId, idx, { type: 'failed', error: `could not queue it: ${e.message}` }));
    }
  }

  stop(jobId: string): void {
    // workers poll this key for the parts they run; parts still waiting are taken out
    void this.redis.set(cancelKey(this.o.prefix, jobId), '1', 'EX', 7 * 24 * 3600).catch(() => undefined);
    void (async () => {
      for (const q of Object.values(this.queues)) {
        for (const j of await q.getJobs(['waiting', 'prioritized', 'delayed'])) {
          if (parsePartQueueId(j.id)?.jobId === jobId) await j.remove().catch(() => undefined);
        }
      }
    })().catch(() => undefined);
  }

  async compute(kind: string, params: unknown, opts: ComputeOptions): Promise<unknown> {
    const job = await this.queues.interactive.add('compute', { kind, params }, { priority: PRIORITY.interactive, removeOnComplete: { age: 60 }, removeOnFail: { age: 600 } });
    return job.waitUntilFinished(this.interactiveEvents, opts.timeoutMs ?? 60_000);
  }

  /** Which of these parts of a job the queues still hold; parts that failed there fail the job. */
  async present(jobId: string, parts: number[]): Promise<Set<number>> {
    const out = new Set<number>();
    for (const idx of parts) {
      for (const q of Object.values(this.queues)) {
        const j = await q.getJob(partQueueId(jobId, idx));
        if (!j) continue;
        const state = await j.getState();
        if (state === 'failed') void this.host.partEvent(jobId, idx, { type: 'failed', error: j.failedReason || 'failed in the queue' });
        out.add(idx);
        break;
      }
    }
    return out;
  }

  /** Workers whose heartbeat is fresh (health page). */
  async workers(): Promise<number> {
    const keys = await this.redis.keys(workerKey(this.o.prefix, '*'));
    return keys.length;
  }

  private async consume(job: Job): Promise<void> {
    const r = resultEventSchema.safeParse(job.data);
    if (!r.success) {
      this.o.log?.warn(`jobs: a results event that does not read was dropped (${r.error.issues[0]?.message})`);
      return;
    }
    await this.host.partEvent(r.data.jobId, r.data.idx, r.data.event);
  }

  async close(): Promise<void> {
    if (this.closed) return;
    this.closed = true;
    await this.consumer.close();
    await Promise.all(this.events.map((e) => e.close()));
    await Promise.all(Object.values(this.queues).map((q) => q.close()));
    this.redis.disconnect();
  }
}
