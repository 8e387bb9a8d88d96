import { Worker } from 'node:worker_threads';
import type { StockListQuery } from '../../../shared/contracts/stock';
import { sourceBootstrap, workerSpec } from '../../platform/jobs/worker-url';

// The stock list reader (issue 14): a thread of its own, with its own read-only connection to
// the database file (WAL: it reads what the request thread has committed, never waiting for
// it), that reads a page of the stock list and writes it as JSON text. The request thread then
// only routes, checks the session and sends the text: a list page's queries, counts and JSON
// (1-4 ms each, most of the request thread's time at 120 pages a second) run beside it, so
// storing a foundry run's results or an export no longer queue the lists, nor the lists the
// rest. The thread runs at normal priority (the job threads yield to it). Started by the server
// for a database file (server/bootstrap.ts); without it (tests, an in-memory database) the
// request thread reads the page itself (./stock.ts stockListJson).

export type ListReaderAsk = { id: number; query: StockListQuery };
export type ListReaderAnswer = { id: number; body: string } | { id: number; error: string };

export class StockListReader {
  private readonly worker: Worker;
  private readonly pending = new Map<number, { resolve: (body: string) => void; reject: (e: Error) => void }>();
  private seq = 0;
  private dead: Error | null = null;
  /** resolves once the thread has opened the database */
  readonly ready: Promise<void>;

  constructor(file: string) {
    const spec = workerSpec({ source: new URL('./list-reader-thread.ts', import.meta.url), bundle: 'stock-list-reader' });
    this.worker = new Worker(spec.source ? sourceBootstrap(spec.url) : spec.url, { workerData: { file } });
    let opened: () => void = () => undefined;
    this.ready = new Promise<void>((resolve) => (opened = resolve));
    this.worker.on('message', (a: ListReaderAnswer) => {
      if (a.id === 0) {
        opened();
        return;
      }
      const p = this.pending.get(a.id);
      if (!p) return;
      this.pending.delete(a.id);
      if ('error' in a) p.reject(new Error(a.error));
      else p.resolve(a.body);
    });
    const fail = (e: Error) => {
      this.dead ??= e;
      opened();
      for (const p of this.pending.values()) p.reject(e);
      this.pending.clear();
    };
    this.worker.on('error', fail);
    this.worker.on('exit', (code) => fail(new Error(`the stock list reader stopped (exit code ${code})`)));
    // an idle reader does not keep the process alive
    this.worker.unref();
  }

  /** False once the thread has failed or been closed (the request thread then reads pages itself). */
  get alive(): boolean {
    return this.dead === null;
  }

  /** One page of the stock list as JSON text (the StockList contract). */
  list(query: StockListQuery): Promise<string> {
    if (this.dead) return Promise.reject(this.dead);
    const id = ++this.seq;
    return new Promise<string>((resolve, reject) => {
      this.pending.set(id, { resolve, reject });
      this.worker.postMessage({ id, query } satisfies ListReaderAsk);
    });
  }

  async close(): Promise<void> {
    this.dead ??= new Error('the stock list reader is closed');
    await this.worker.terminate();
  }
}
