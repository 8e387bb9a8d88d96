import { Worker } from 'node:worker_threads';
import type { StockListQuery } from '../../../shared/contracts/stock';
import { sourceBootstrap, workerSpec } from '../../platform/jobs/worker-url';
import type { StockFilter } from './stock-filter';

// The stock reader (issue 14): a thread of its own, with its own read-only connection to the
// database file (WAL: it reads what the request thread has committed, never waiting for it),
// that reads the stock's large answers: a page of the stock list as JSON text, a filter's
// count, an export's next 500 rows as the file's text. The request thread then only routes,
// checks the session and sends text: a list page's queries, count and JSON (1-4 ms each, most
// of the request thread's time at 120 pages a second) and an export's pages run beside it, so
// storing a foundry run's results no longer queues behind them, nor they behind it. The thread
// runs at normal priority (the job threads yield to it). The server starts one for its database
// file (server/bootstrap.ts); without it (most tests) the request thread reads these itself
// (./stock.ts stockListJson, ./routes.ts exports).

/** Where an export has got to: the last row sent (rows go newest first). */
export type ExportMark = { createdAt: number; id: number };
export type ExportFormat = 'csv' | 'codes';

export type StockReaderAsk = { id: number } & (
  | { kind: 'list'; query: StockListQuery }
  | { kind: 'count'; filter: StockFilter }
  | { kind: 'export'; filter: StockFilter; after: ExportMark | null; n: number; format: ExportFormat }
);
export type StockReaderAnswer = { id: number; value: unknown } | { id: number; error: string };
type Ask = StockReaderAsk extends infer A ? (A extends { id: number } ? Omit<A, 'id'> : never) : never;

/** A reader thread that stops is started again after RESTART_DELAY_MS, at most MAX_RESTARTS times a minute. */
const RESTART_DELAY_MS = 1_000;
const MAX_RESTARTS = 5;

export class StockReader {
  private worker: Worker;
  private readonly pending = new Map<number, { resolve: (value: unknown) => void; reject: (e: Error) => void }>();
  private seq = 0;
  /** why the thread is not answering (null while it runs) */
  private down: Error | null = null;
  private closed = false;
  private restarts: number[] = [];

  /** onDown: told when the thread stops unasked (the request thread reads for itself meanwhile). */
  constructor(
    private readonly file: string,
    private readonly onDown?: (e: Error, restarting: boolean) => void,
  ) {
    this.worker = this.start();
  }

  private start(): Worker {
    const spec = workerSpec({ source: new URL('./stock-reader-thread.ts', import.meta.url), bundle: 'stock-reader' });
    const worker = new Worker(spec.source ? sourceBootstrap(spec.url) : spec.url, { workerData: { file: this.file } });
    worker.on('message', (a: StockReaderAnswer) => {
      const p = this.pending.get(a.id);
      if (!p) return;
      this.pending.delete(a.id);
      if ('error' in a) p.reject(new Error(a.error));
      else p.resolve(a.value);
    });
    let failed = false;
    const fail = (e: Error) => {
      if (failed || worker !== this.worker) return;
      failed = true;
      this.down = e;
      for (const p of this.pending.values()) p.reject(e);
      this.pending.clear();
      if (this.closed) return;
      const now = Date.now();
      this.restarts = this.restarts.filter((t) => now - t < 60_000);
      const again = this.restarts.length < MAX_RESTARTS;
      this.onDown?.(e, again);
      if (!again) return;
      this.restarts.push(now);
      setTimeout(() => {
        if (this.closed) return;
        this.worker = this.start();
        this.down = null;
      }, RESTART_DELAY_MS).unref();
    };
    worker.on('error', fail);
    worker.on('exit', (code) => fail(new Error(`the stock reader stopped (exit code ${code})`)));
    // an idle reader does not keep the process alive
    worker.unref();
    return worker;
  }

  /** False while the thread is down or after close (the request thread then reads for itself). */
  get alive(): boolean {
    return this.down === null && !this.closed;
  }

  /** Tests: stop the thread as a crash would (it is started again after RESTART_DELAY_MS). */
  async crashForTests(): Promise<void> {
    await this.worker.terminate();
  }

  private ask(a: Ask): Promise<unknown> {
    if (this.closed) return Promise.reject(new Error('the stock reader is closed'));
    if (this.down) return Promise.reject(this.down);
    const id = ++this.seq;
    return new Promise<unknown>((resolve, reject) => {
      this.pending.set(id, { resolve, reject });
      this.worker.postMessage({ ...a, id } as StockReaderAsk);
    });
  }

  /** One page of the stock list as JSON text (the StockList contract). */
  async list(query: StockListQuery): Promise<string> {
    return (await this.ask({ kind: 'list', query })) as string;
  }

  /** How many stock tilings match the filter. */
  async count(filter: StockFilter): Promise<number> {
    return (await this.ask({ kind: 'count', filter })) as number;
  }

  /** An export's next n rows after `after`, as the file's text (./stock.ts exportPage). */
  async exportPage(filter: StockFilter, after: ExportMark | null, n: number, format: ExportFormat): Promise<{ text: string; count: number; after: ExportMark | null }> {
    return (await this.ask({ kind: 'export', filter, after, n, format })) as { text: string; count: number; after: ExportMark | null };
  }

  async close(): Promise<void> {
    this.closed = true;
    await this.worker.terminate();
  }
}

/**
 * Reads through the stock reader while it runs, else on the request thread (`here`); also when
 * the thread stops while the ask is out (an error of the read itself is passed on as it is).
 */
export async function readStock<T>(reader: StockReader | null | undefined, viaReader: (r: StockReader) => Promise<T>, here: () => T | Promise<T>): Promise<T> {
  if (!reader?.alive) return here();
  try {
    return await viaReader(reader);
  } catch (e) {
    if (reader.alive) throw e;
    return here();
  }
}
