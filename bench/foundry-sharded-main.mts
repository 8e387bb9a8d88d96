// `node --import tsx bench/foundry-sharded-main.mts ORDER squares|all THREADS`: one sharded
// foundry run, its summary as JSON on stdout (bench/foundry.ts runs it as a child process so
// the bench modules stay one after another).
import { shardedRun } from './foundry-sharded';

const [order, mode, threads] = process.argv.slice(2);
const r = await shardedRun(Number(order), mode === 'squares', Number(threads ?? 2));
process.stdout.write(JSON.stringify(r));
