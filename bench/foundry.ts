// Foundry benchmark (`npm run bench`): exhaustive orders 9..14 together, 15, 16 and 17 each,
// and the order-21 squared-square search over all 485,704 graphs with 22 edges; every count
// is checked against OEIS. Set BENCH_QUICK=1 to skip order 21 (about 5 minutes).
import { exhaustiveTilings } from '../shared/foundry/index';

// OEIS A002839 (simple perfect squared rectangles, n = 9..17) and A002881 (simple imperfect, n = 9..16).
const A002839: Record<number, number> = { 9: 2, 10: 6, 11: 22, 12: 67, 13: 213, 14: 744, 15: 2609, 16: 9016, 17: 31426 };
const A002881: Record<number, number> = { 9: 1, 10: 0, 11: 0, 12: 9, 13: 34, 14: 104, 15: 283, 16: 953 };
// OEIS A002840: 3-connected planar graphs with 22 edges; A006983: one simple perfect squared square of order 21.
const GRAPHS_22 = 485_704;

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
if (process.env.BENCH_QUICK !== '1') {
  const w0 = Date.now();
  const c0 = cpu();
  const s = exhaustiveTilings({ order: 21, squaresOnly: true });
  console.log(`foundry: order 21 squares only: ${((Date.now() - w0) / 1000).toFixed(1)} s wall, ${((cpu() - c0) / 1000).toFixed(1)} s CPU`);
  console.log(`  graphs ${check('graphs', s.graphs, GRAPHS_22)}, pairs after Gambini's filter ${s.pairs}, simple perfect squared squares ${check('squares', s.squares, 1)}`);
}
if (failures > 0) {
  console.log(`foundry: ${failures} count(s) differ from OEIS`);
  process.exitCode = 1;
}
