// Foundry benchmark (`npm run bench`): exhaustive orders 9..14 together, 15, 16 and 17 each on
// one thread; then runs split into shards over worker threads as a foundry run uses the workers
// it is given (bench/foundry-sharded.ts): exhaustive 18 (target < 10 s wall) and 19 (< 60 s),
// the order-21 squared-square search over all 485,704 graphs with 22 edges (< 60 s) and the
// order-22 one over 1,645,576 graphs with 23 edges (exactly 8 squares, < 5 min). Every count is
// checked against OEIS. Wall time depends on the machine's load: the load average is printed.
// Set BENCH_QUICK=1 to stop after order 18.
import { spawnSync } from 'node:child_process';
import { loadavg } from 'node:os';
import { fileURLToPath } from 'node:url';
import { exhaustiveTilings } from '../shared/foundry/index';
import type { ShardedRun } from './foundry-sharded';

// OEIS A002839 (simple perfect squared rectangles, n = 9..17) and A002881 (simple imperfect, n = 9..16).
const A002839: Record<number, number> = { 9: 2, 10: 6, 11: 22, 12: 67, 13: 213, 14: 744, 15: 2609, 16: 9016, 17: 31426, 18: 110381, 19: 390223 };
// A002881 for 17..19 from memory of the entry (our reference facts list it to n = 14)
const A002881: Record<number, number> = { 9: 1, 10: 0, 11: 0, 12: 9, 13: 34, 14: 104, 15: 283, 16: 953, 17: 3029, 18: 9513, 19: 30359 };
// A002840 (3-connected plane graphs by edges) for 19, 20 and 23 edges (23: from memory of the entry)
const GRAPHS: Record<number, number> = { 19: 13384, 20: 43708, 22: 485_704, 23: 1_645_576 };

function cpu(): number {
  const u = process.cpuUsage();
  return (u.user + u.system) / 1000;
}

let failures = 0;
function check(what: string, got: number, want: number | undefined): string {
  if (want === undefined) return `${got}`;
  if (got !== want) {
    failures++;
    return `${got} (EXPECTED ${want})`;
  }
  return `${got} = OEIS`;
}

function orders(from: number, to: number): void {
  const w0 = Date.now();
  const c0 = cpu();
  const rows: string[] = [];
  for (let n = from; n <= to; n++) {
    const s = exhaustiveTilings({ order: n });
    rows.push(`  order ${n}: ${s.graphs} graphs, ${s.pairs} pairs, simple perfect ${check('spsr', s.simplePerfect, A002839[n])}, simple imperfect ${check('sisr', s.simpleImperfect, A002881[n])}`);
  }
  console.log(`foundry: orders ${from}..${to}: ${((Date.now() - w0) / 1000).toFixed(2)} s wall, ${((cpu() - c0) / 1000).toFixed(2)} s CPU`);
  for (const r of rows) console.log(r);
}

orders(9, 14);
orders(15, 15);
orders(16, 16);
orders(17, 17);

const load = () => loadavg().map((x) => x.toFixed(1)).join(', ');
function sharded(order: number, squares: boolean, targetS: number): ShardedRun {
  const main = fileURLToPath(new URL('./foundry-sharded-main.mts', import.meta.url));
  const before = load();
  const p = spawnSync(process.execPath, ['--import', 'tsx', main, String(order), squares ? 'squares' : 'all', '2'], { encoding: 'utf8', maxBuffer: 1 << 26 });
  if (p.status !== 0) throw new Error(`sharded run of order ${order} failed: ${p.stderr}`);
  const r = JSON.parse(p.stdout) as ShardedRun;
  const s = r.wallMs / 1000;
  const met = s < targetS;
  if (!met) failures++;
  console.log(
    `foundry: order ${order}${squares ? ' squares only' : ''} on ${r.threads} worker threads: ${s.toFixed(1)} s wall (target < ${targetS} s: ${met ? 'met' : 'MISSED'}), ` +
      `${(r.cpuMs / 1000).toFixed(1)} s CPU (the process, all threads); load average ${before} before, ${load()} after`,
  );
  return r;
}
{
  const r = sharded(18, false, 10);
  console.log(`  graphs ${r.graphs}, simple perfect ${check('', r.simplePerfect, A002839[18])}, simple imperfect ${check('', r.simpleImperfect, A002881[18])}`);
}
if (process.env.BENCH_QUICK !== '1') {
  const r19 = sharded(19, false, 60);
  console.log(`  graphs ${check('', r19.graphs, GRAPHS[20])}, simple perfect ${check('', r19.simplePerfect, A002839[19])}, simple imperfect ${check('', r19.simpleImperfect, A002881[19])}`);
  const r21 = sharded(21, true, 60);
  console.log(`  graphs ${check('', r21.graphs, GRAPHS[22])}, pairs after Gambini's filter ${r21.pairs}, simple perfect squared squares ${check('', r21.squares, 1)}: ${r21.squareCodes.join('; ')}`);
  const r22 = sharded(22, true, 300);
  const sides = r22.squareCodes.map((c) => Number(c.split(' ')[1])).sort((a, b) => a - b);
  console.log(`  graphs ${check('', r22.graphs, GRAPHS[23])}, pairs after Gambini's filter ${r22.pairs}, simple perfect squared squares ${check('', r22.squares, 8)} (A006983), sides ${sides.join(', ')}`);
}
if (failures > 0) {
  console.log(`foundry: ${failures} count(s) differing from OEIS or target(s) missed (wall times: see the load average)`);
  process.exitCode = 1;
}
