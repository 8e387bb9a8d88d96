// Worker-thread entry of the job thread pool (server/platform/jobs/thread-pool.ts): runs one job
// (or one part of a job) at a time on request. Used by the server's threads and by the worker
// process (`npm run worker`). No database here: results go back as messages.
import { setPriority } from 'node:os';
import { parentPort, workerData } from 'node:worker_threads';
import { jobKinds } from './job-kinds';
import { BATCH_ITEMS, MAX_UNSTORED_BATCHES, type FromWorker, type JobHandler, type JobProgress, type StopReason, type ToWorker } from './platform/jobs/types';

const port = parentPort;
if (!port) throw new Error('worker-entry must run in a worker thread');

// On Linux the nice value belongs to the thread: a job thread yields the cores to the thread
// that answers requests (decision 032). Elsewhere this may set the whole process; harmless.
const nice = (workerData as { nice?: number } | null)?.nice ?? 0;
if (nice > 0) {
  try {
    setPriority(nice);
  } catch {
    // not permitted here: run at normal priority
  }
}

function send(m: FromWorker): void {
  port!.postMessage(m);
}


async function run(msg: ToWorker): Promise<void> {
  const flag = new Int32Array(msg.flag);
  const deadline = msg.budgetMs === null ? Infinity : Date.now() + msg.budgetMs;
  let reason: StopReason | null = null;
  let pending: unknown[] = [];
  let lastProgress: JobProgress | null = null;
  let lastSent = 0;
  let polls = 0;
  let reports = 0;
  let batchesSent = 0;
  // wait (blocking this thread: its search is synchronous) until storing catches up, or a stop
  const awaitStoring = () => {
    for (;;) {
      const stored = Atomics.load(flag, 1);
      if (batchesSent - stored < MAX_UNSTORED_BATCHES || shouldStop()) return;
      Atomics.wait(flag, 1, stored, 100);
    }
  };
  const flush = (force: boolean) => {
    const now = Date.now();
    if (!force && now - lastSent < 250) return;
    lastSent = now;
    if (pending.length > 0) {
      awaitStoring();
      send({ type: 'results', taskId: msg.taskId, items: pending });
      batchesSent++;
      pending = [];
    }
    if (lastProgress) send({ type: 'progress', taskId: msg.taskId, progress: lastProgress });
  };
  const shouldStop = () => {
    if (reason) return true;
    if (Atomics.load(flag, 0) === 1) reason = 'cancel';
    else if ((++polls & 15) === 0 && Date.now() > deadline) reason = 'budget';
    return reason !== null;
  };
  try {
    const loader = jobKinds[msg.kind];
    if (!loader) throw new Error(`unknown job kind '${msg.kind}'`);
    const { handler } = await loader();
    const h = handler as unknown as JobHandler<unknown, unknown>;
    const params = h.parseParams(msg.params);
    send({ type: 'started', taskId: msg.taskId });
    const summary = await h.run({
      params,
      input: msg.input,
      part: msg.part,
      shouldStop,
      stopReason: () => reason,
      progress(p) {
        lastProgress = p;
        if ((++reports & 15) === 0) flush(false);
      },
      emit(item) {
        pending.push(item);
        if (pending.length >= BATCH_ITEMS) flush(true);
        else if ((pending.length & 15) === 0) flush(false);
      },
    });
    flush(true);
    send({ type: 'done', taskId: msg.taskId, summary: summary ?? null, stopped: reason });
  } catch (e) {
    flush(true);
    send({ type: 'failed', taskId: msg.taskId, error: e instanceof Error ? e.message : String(e) });
  }
}

port.on('message', (msg: ToWorker) => {
  if (msg.type === 'run') void run(msg);
});
