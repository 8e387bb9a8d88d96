// Worker-thread entry of the job pool: runs one job at a time on request.
import { parentPort } from 'node:worker_threads';
import { jobKinds } from './job-kinds';
import type { FromWorker, JobHandler, JobProgress, StopReason, ToWorker } from './platform/jobs/types';

const port = parentPort;
if (!port) throw new Error('worker-entry must run in a worker thread');

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
  const flush = (force: boolean) => {
    const now = Date.now();
    if (!force && now - lastSent < 250) return;
    lastSent = now;
    if (pending.length > 0) {
      send({ type: 'results', jobId: msg.jobId, items: pending });
      pending = [];
    }
    if (lastProgress) send({ type: 'progress', jobId: msg.jobId, progress: lastProgress });
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
    send({ type: 'started', jobId: msg.jobId });
    const summary = await h.run({
      params,
      input: msg.input,
      shouldStop,
      stopReason: () => reason,
      progress(p) {
        lastProgress = p;
        if ((++reports & 15) === 0) flush(false);
      },
      emit(item) {
        pending.push(item);
        if (pending.length >= 500) flush(true);
      },
    });
    flush(true);
    send({ type: 'done', jobId: msg.jobId, summary: summary ?? null, stopped: reason });
  } catch (e) {
    flush(true);
    send({ type: 'failed', jobId: msg.jobId, error: e instanceof Error ? e.message : String(e) });
  }
}

port.on('message', (msg: ToWorker) => {
  if (msg.type === 'run') void run(msg);
});
