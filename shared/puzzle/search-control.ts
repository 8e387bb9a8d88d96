/**
 * Budgets, cancellation and progress for the engine's searches. Everything is plain data
 * and callbacks so that a search can run inside a worker thread: the worker passes a
 * `shouldStop` that reads a shared flag, and `onProgress` posts a message.
 */
export interface SearchBudget {
  /** Stop after this many search nodes (default: no limit). */
  maxNodes?: number;
  /** Stop after this many milliseconds of wall time (default: no limit). */
  maxMs?: number;
  /** Clock in milliseconds (default: performance.now, else Date.now). */
  now?: () => number;
}

export interface SearchControl {
  budget?: SearchBudget;
  /** Cancellation: polled every few hundred nodes; returning true stops the search. */
  shouldStop?: () => boolean;
  /** Called with the node count every few thousand nodes and once at the end. */
  onProgress?: (nodes: number) => void;
}

/** Why a search stopped before it was complete. */
export type StopReason = 'max-nodes' | 'max-ms' | 'cancelled';

/** Thrown inside a search to unwind the recursion; never escapes the engine. */
export class SearchStopped extends Error {
  readonly reason: StopReason;
  constructor(reason: StopReason) {
    super(`search stopped: ${reason}`);
    this.name = 'SearchStopped';
    this.reason = reason;
  }
}

export function defaultClock(): () => number {
  const perf = (globalThis as { performance?: { now(): number } }).performance;
  return perf ? () => perf.now() : () => Date.now();
}

/**
 * A node counter that enforces a budget. `tick()` is called once per search node and
 * throws SearchStopped when the budget is spent or the caller cancelled.
 */
export class NodeMeter {
  nodes = 0;
  readonly startedAt: number;
  private readonly now: () => number;
  private readonly maxNodes: number;
  private readonly deadline: number;
  private readonly shouldStop: (() => boolean) | undefined;
  private readonly onProgress: ((nodes: number) => void) | undefined;
  private nextCheck: number;
  private nextReport = 4096;

  constructor(control: SearchControl = {}) {
    this.now = control.budget?.now ?? defaultClock();
    this.startedAt = this.now();
    this.maxNodes = control.budget?.maxNodes ?? Number.POSITIVE_INFINITY;
    this.deadline = this.startedAt + (control.budget?.maxMs ?? Number.POSITIVE_INFINITY);
    this.shouldStop = control.shouldStop;
    this.onProgress = control.onProgress;
    this.nextCheck = Math.min(256, this.maxNodes + 1);
  }

  tick(): void {
    this.nodes += 1;
    if (this.nodes >= this.nextCheck) this.check();
  }

  elapsed(): number {
    return this.now() - this.startedAt;
  }

  /** Report the final count (call once when the search ends, complete or not). */
  finish(): void {
    this.onProgress?.(this.nodes);
  }

  private check(): void {
    this.nextCheck = Math.min(this.nodes + 256, this.maxNodes + 1);
    if (this.nodes > this.maxNodes) throw new SearchStopped('max-nodes');
    if (this.now() > this.deadline) throw new SearchStopped('max-ms');
    if (this.shouldStop?.()) throw new SearchStopped('cancelled');
    if (this.nodes >= this.nextReport) {
      this.nextReport = this.nodes + 4096;
      this.onProgress?.(this.nodes);
    }
  }
}
