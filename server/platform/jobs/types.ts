// The contract between the job system and a job kind's worker half. A job kind's worker half is
// one module exporting `handler` (made with defineJob) plus one line in server/job-kinds.ts. The
// handler runs in a worker thread, in the server process or in `npm run worker` on another
// machine: it must not touch the database or DATA_DIR. It reports progress, emits result items
// (sent back to the server, where the kind's sink stores them) and returns a JSON summary (for a
// compute kind: the value the awaiting request gets).

export interface JobProgress {
  /** units done in the current phase */
  done: number;
  /** units in the current phase, when known */
  total?: number;
  /** results found so far */
  found?: number;
  /** short phase name, e.g. 'graphs solved' */
  phase?: string;
}

export type StopReason = 'cancel' | 'budget';

/** One part of a job split into parts (e.g. a foundry run's shards): index 0..count-1. */
export interface JobPart {
  index: number;
  count: number;
}

export interface JobContext<P> {
  params: P;
  /** extra input the server passed (recomputed from the database when a job is resumed) */
  input: unknown;
  /** the part of the job this worker runs; null for a job that is not split */
  part: JobPart | null;
  /** true once the job was cancelled or its time budget ran out: return soon. */
  shouldStop(): boolean;
  /** why shouldStop() is true (null while running normally) */
  stopReason(): StopReason | null;
  /** cheap to call often; forwarded at most every 250 ms */
  progress(p: JobProgress): void;
  /** one result item (JSON-serialisable), batched and streamed to the server */
  emit(item: unknown): void;
}

export interface JobHandler<P = unknown, S = unknown> {
  kind: string;
  /** validate raw parameters (zod); throw on bad input */
  parseParams(raw: unknown): P;
  run(ctx: JobContext<P>): S | Promise<S>;
}

export function defineJob<P, S>(h: JobHandler<P, S>): JobHandler<P, S> {
  return h;
}

// Messages between a thread pool and one of its worker threads.
export type ToWorker = {
  type: 'run';
  taskId: string;
  kind: string;
  params: unknown;
  input: unknown;
  part: JobPart | null;
  budgetMs: number | null;
  /** Int32Array view: [0] = 1 when cancelled */
  flag: SharedArrayBuffer;
};

export type FromWorker =
  | { type: 'started'; taskId: string }
  | { type: 'progress'; taskId: string; progress: JobProgress }
  | { type: 'results'; taskId: string; items: unknown[] }
  | { type: 'done'; taskId: string; summary: unknown; stopped: StopReason | null }
  | { type: 'failed'; taskId: string; error: string };

/** A job thread sends results in batches of at most this many items (or every 250 ms; server/worker-entry.ts). */
export const BATCH_ITEMS = 200;
/**
 * Batches sent but not yet stored before the thread waits (flow control): storing runs on the
 * request thread and gives way to requests, so a fast search would otherwise pile up its
 * results in the server's memory (an order-18 run: 120,000 tilings, hundreds of MB, and long
 * garbage-collection pauses on the thread that answers requests).
 */
export const MAX_UNSTORED_BATCHES = 10;
