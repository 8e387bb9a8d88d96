// One shard of an exhaustive foundry run on a worker thread (bench/foundry-sharded.ts starts
// it): runs exhaustiveTilings with the shard it is given and posts back its summary and the
// codes of the squared squares it found.
import { parentPort, workerData } from 'node:worker_threads';
import { exhaustiveTilings } from '../shared/foundry/index';

const { order, squaresOnly, index, count } = workerData as { order: number; squaresOnly: boolean; index: number; count: number };
const squares: string[] = [];
const s = exhaustiveTilings({ order, squaresOnly, shard: { index, count }, onFound: (t) => { if (t.perfect && t.square) squares.push(t.code); } });
parentPort!.postMessage({ summary: s, squares });
