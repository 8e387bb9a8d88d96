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

export class StockReader {
  private readonly worker: Worker;
  private readonly pending = new Map<number, { resolve: (value: unknown) => void; reject: (e: Error) => void }>();
  private seq = 0;
  private dead: Error | null = null;
  /** resolves once the thread has opened the database (or failed) */
  readonly ready: Promise<void>;

  constructor(file: string) {
    const spec = workerSpec({ source: new URL('./stock-reader-thread.ts', import.meta.url), bundle: 'stock-reader' });
    this.worker = new Worker(spec.source ? sourceBootstrap(spec.url) : spec.url, { workerData: { file } });
    let opened: () => void = () => undefined;
    this.ready = new Promise<void>((resolve) => (opened = resolve));
    this.worker.on('message', (a: StockReaderAnswer) => {
      if (a.id === 0) {
        opened();
        return;
      }
      const p = this.pending.get(a.id);
      if (!p) return;
      this.pending.delete(a.id);
      if ('error' in a) p.reject(new Error(a.error));
      else p.resolve(a.value);
    });
    const fail = (e: Error) => {
      this.dead ??= e;
      opened();
      for (const p of this.pending.values()) p.reject(e);
      this.pending.clear();
    };
    this.worker.on('error', fail);
    this.worker.on('exit', (code) => fail(new Error(`the stock reader stopped (exit code ${code})`)));
    // an idle reader does not keep the process alive
    this.worker.unref();
  }

  /** False once the thread has failed or been closed (the request thread then reads for itself). */
  get alive(): boolean {
    return this.dead === null;
  }

  private ask(a: Ask): Promise<unknown> {
    if (this.dead) return Promise.reject(this.dead);
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
    this.dead ??= new Error('the stock reader is closed');
    await this.worker.terminate();
  }
}
