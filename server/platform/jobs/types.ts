// The contract between the job runner and a job kind. A job kind is one module exporting
// `handler` (made with defineJob) plus one line in ./registry.ts. The handler runs inside a
// worker thread: it must not touch the database; it reports progress, emits result items
// (streamed back to the main thread, where the submitter's sink stores them) and returns a
// JSON summary.

export interface JobProgress {
  /** units done in the current phase */
  done: number;
  /** units in the current phase, when known */
  total?: number;
  /** results found so far */
  found?: number;
  /** short phase name, e.g. 'graphs', 'solving' */
  phase?: string;
}

export type StopReason = 'cancel' | 'budget';

export interface JobContext<P> {
  params: P;
  /** extra input the submitter passed (not persisted), e.g. data read from the database */
  input: unknown;
  /** true once the job was cancelled or its time budget ran out: return soon. */
  shouldStop(): boolean;
  /** why shouldStop() is true (null while running normally) */
  stopReason(): StopReason | null;
  /** cheap to call often; forwarded at most every 250 ms */
  progress(p: JobProgress): void;
  /** one result item (JSON-serialisable), batched and streamed to the main thread */
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

// Messages between the runner and a worker.
export type ToWorker = {
  type: 'run';
  jobId: string;
  kind: string;
  params: unknown;
  input: unknown;
  budgetMs: number | null;
  /** Int32Array view: [0] = 1 when cancelled */
  flag: SharedArrayBuffer;
};

export type FromWorker =
  | { type: 'started'; jobId: string }
  | { type: 'progress'; jobId: string; progress: JobProgress }
  | { type: 'results'; jobId: string; items: unknown[] }
  | { type: 'done'; jobId: string; summary: unknown; stopped: StopReason | null }
  | { type: 'failed'; jobId: string; error: string };
