// The stock list reader's thread (./list-reader.ts): its own read-only connection to the
// database file, answering one list page at a time as JSON text. No writes here.
import Database from 'better-sqlite3';
import { parentPort, workerData } from 'node:worker_threads';
import type { StockListQuery } from '../../../shared/contracts/stock';
import { listStockPage } from './stock';
import type { ListReaderAnswer, ListReaderAsk } from './list-reader';

const port = parentPort;
if (!port) throw new Error('list-reader-thread must run in a worker thread');
const { file } = workerData as { file: string };
const client = new Database(file, { readonly: true, fileMustExist: true });
client.pragma('busy_timeout = 5000');

port.on('message', (m: ListReaderAsk) => {
  let answer: ListReaderAnswer;
  try {
    answer = { id: m.id, body: JSON.stringify(listStockPage(client, m.query as StockListQuery)) };
  } catch (e) {
    answer = { id: m.id, error: e instanceof Error ? e.message : String(e) };
  }
  port.postMessage(answer);
});
port.postMessage({ id: 0, body: 'ready' } satisfies ListReaderAnswer);
