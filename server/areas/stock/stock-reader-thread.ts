// The stock reader's thread (./stock-reader.ts): its own read-only connection to the database
// file, answering one ask at a time: a list page as JSON text, a filter's count, an export's
// next page as the file's text. No writes here.
import Database from 'better-sqlite3';
import { parentPort, workerData } from 'node:worker_threads';
import { countStockIn } from './stock-filter';
import { exportPage, listStockPage } from './stock';
import type { StockReaderAnswer, StockReaderAsk } from './stock-reader';

const port = parentPort;
if (!port) throw new Error('stock-reader-thread must run in a worker thread');
const { file } = workerData as { file: string };
const client = new Database(file, { readonly: true, fileMustExist: true });
client.pragma('busy_timeout = 5000');

function answer(m: StockReaderAsk): unknown {
  switch (m.kind) {
    case 'list':
      return JSON.stringify(listStockPage(client, m.query));
    case 'count':
      return countStockIn(client, m.filter);
    case 'export':
      return exportPage(client, m.filter, m.after, m.n, m.format);
  }
}

function reply(m: StockReaderAsk): void {
  let a: StockReaderAnswer;
  try {
    a = { id: m.id, value: answer(m) };
  } catch (e) {
    a = { id: m.id, error: e instanceof Error ? e.message : String(e) };
  }
  port!.postMessage(a);
}

// people's pages and counts before export pages: one ask a turn of this thread's event loop, so
// asks that arrived meanwhile are queued first and a list page waits behind at most one export page
const urgent: StockReaderAsk[] = [];
const later: StockReaderAsk[] = [];
let draining = false;
function drain(): void {
  const m = urgent.shift() ?? later.shift();
  if (!m) {
    draining = false;
    return;
  }
  reply(m);
  setImmediate(drain);
}
port.on('message', (m: StockReaderAsk) => {
  (m.kind === 'export' ? later : urgent).push(m);
  if (!draining) {
    draining = true;
    setImmediate(drain);
  }
});
