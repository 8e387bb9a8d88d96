// An exhaustive foundry run split into shards over worker threads (shard { index, count } of
// exhaustiveTilings, the seam the job system uses): what a foundry run does with the workers
// it is given. Used by bench/foundry.ts and by the on-demand order-22 test.
import { Worker } from 'node:worker_threads';
import { availableParallelism } from 'node:os';
import type { ExhaustiveSummary } from '../shared/foundry/index';
import { sourceBootstrap } from '../server/platform/jobs/worker-url';

export interface ShardedRun {
  graphs: number;
  pairs: number;
  simplePerfect: number;
  simpleImperfect: number;
  squares: number;
  /** canonical codes of the simple perfect squared squares found */
  squareCodes: string[];
  wallMs: number;
  /** CPU time of this process over the run (every thread: process.cpuUsage counts them all) */
  cpuMs: number;
  threads: number;
}

export async function shardedRun(order: number, squaresOnly: boolean, threads = availableParallelism()): Promise<ShardedRun> {
  const w0 = performance.now();
  const c0 = process.cpuUsage();
  const url = new URL('./foundry-shard-worker.ts', import.meta.url);
  const parts = await Promise.all(
    Array.from({ length: threads }, (_, index) =>
      new Promise<{ summary: ExhaustiveSummary; squares: string[] }>((resolve, reject) => {
        const w = new Worker(sourceBootstrap(url), { workerData: { order, squaresOnly, index, count: threads } });
        w.once('message', resolve);
        w.once('error', reject);
        w.once('exit', (code) => { if (code !== 0) reject(new Error(`shard ${index} exited with ${code}`)); });
      }),
    ),
  );
  const sum = (f: (s: ExhaustiveSummary) => number) => parts.reduce((a, p) => a + f(p.summary), 0);
  return {
    graphs: sum((s) => s.graphs),
    pairs: sum((s) => s.pairs),
    simplePerfect: sum((s) => s.simplePerfect),
    simpleImperfect: sum((s) => s.simpleImperfect),
    squares: sum((s) => s.squares),
    squareCodes: parts.flatMap((p) => p.squares).sort(),
    wallMs: performance.now() - w0,
    cpuMs: ((c) => (c.user + c.system) / 1000)(process.cpuUsage(c0)),
    threads,
  };
}
