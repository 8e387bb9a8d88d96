// Puzzle engine benchmark (`npm run bench`): Assembly on every catalogue set of orders 9 to 13
// next to a general exact-cover solver (dancing-links, Knuth's DLX) and our plain reference
// solver on the same inputs in the same run; the 112 square; seeded random sets of orders 21
// to 25; squares 1..24 in 70 x 70; Deduction givens at order 25. Targets (issue 4): >= 100x
// faster than the general solver on the catalogue sets, the 112 square proved unique in
// < 100 ms, 1..24 in 70 x 70 settled as none in < 1 s, Deduction givens in < 50 ms at order 25.
// Times are CPU milliseconds of this process (process.cpuUsage; sub-millisecond runs are at
// the timer's resolution), since the machine is shared; wall time is printed where it matters.
import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { DancingLinks } from 'dancing-links';
import { parseTiling } from '../shared/tiling/index';
import type { Tiling } from '../shared/tiling/index';
import { randomTilings } from '../shared/foundry/index';
import { chooseGivens, deductionBoard, solveAssembly } from '../shared/puzzle/index';
import { referenceAssemble } from '../tests/shared/puzzle/reference-solver';

const now = () => performance.now();
const fmt = (ms: number) => (ms < 10 ? ms.toFixed(2) : ms.toFixed(0));
const median = (a: number[]) => { const s = [...a].sort((x, y) => x - y); return s[Math.floor(s.length / 2)] ?? 0; };
let failures = 0;
const fail = (msg: string) => { failures++; console.log(`  FAILED: ${msg}`); };

/** CPU time of this process in ms: the fair measure on a machine shared with other jobs. */
function cpu(): number {
  const u = process.cpuUsage();
  return (u.user + u.system) / 1000;
}

/** `ms` is CPU time (the targets are CPU figures, as in engine.md 9); `wall` is wall time. */
function time<T>(f: () => T): { value: T; ms: number; wall: number } {
  const t0 = now();
  const c0 = cpu();
  const value = f();
  return { value, ms: cpu() - c0, wall: now() - t0 };
}

/** Exact cover rows of a squares-in-a-frame problem: one per piece per position. Null if too big. */
function dlxCount(W: number, H: number, pieces: number[], maxOnes: number): { count: number; ones: number } | { tooLarge: number } {
  let ones = 0;
  for (const s of pieces) ones += (W - s + 1) * (H - s + 1) * (s * s + 1);
  if (ones > maxOnes) return { tooLarge: ones };
  const solver = new DancingLinks<number>().createSolver({ columns: W * H + pieces.length });
  pieces.forEach((s, p) => {
    for (let y = 0; y + s <= H; y++) for (let x = 0; x + s <= W; x++) {
      const cols: number[] = [];
      for (let yy = y; yy < y + s; yy++) for (let xx = x; xx < x + s; xx++) cols.push(yy * W + xx);
      cols.push(W * H + p);
      solver.addSparseConstraint(p, cols);
    }
  });
  return { count: solver.findAll().length, ones };
}

const sizes = (t: Tiling) => t.squares.map((q) => q.s);
// DLX holds one node per matrix entry; beyond this many entries it would need hundreds of MB
// on a shared machine (raise with BENCH_DLX_ONES to compare more sets).
const MAX_DLX_ONES = Number(process.env.BENCH_DLX_ONES ?? 4_000_000);

// warm the JIT up on a small case so the first measured run is not the compile
solveAssembly({ width: 33, height: 32, pieces: [18, 15, 7, 8, 14, 4, 10, 1, 9] }, { mode: 'count' });

console.log('puzzle: Assembly on the catalogue sets (fast vs reference solver vs dancing-links DLX; all counts must agree)');
for (const order of [9, 10, 11, 12, 13]) {
  const lines = readFileSync(new URL(`../tests/fixtures/puzzle/o${order}spsr.bkp`, import.meta.url), 'utf8').split('\n').filter((l) => l.trim());
  const fast: number[] = [];
  let refMs = 0;
  let refSets = 0;
  let dlxMs = 0;
  let dlxFastMs = 0;
  let dlxSets = 0;
  let dlxSkipped = 0;
  let fastOnRef = 0;
  let nonUnique = 0;
  for (const code of lines) {
    const t = parseTiling(code);
    const f = time(() => solveAssembly({ width: t.W, height: t.H, pieces: sizes(t) }, { mode: 'count' }));
    fast.push(f.ms);
    if (f.value.verdict !== 'unique') nonUnique++;
    if (order <= 12) {
      const r = time(() => referenceAssemble(t.W, t.H, sizes(t)));
      refMs += r.ms;
      fastOnRef += f.ms;
      refSets++;
      if (r.value.length !== f.value.rawSolutions) fail(`${code}: reference ${r.value.length} raw, fast ${String(f.value.rawSolutions)}`);
    }
    const d = time(() => dlxCount(t.W, t.H, sizes(t), MAX_DLX_ONES));
    if ('tooLarge' in d.value) dlxSkipped++;
    else {
      dlxMs += d.ms;
      dlxFastMs += f.ms;
      dlxSets++;
      if (d.value.count !== f.value.rawSolutions) fail(`${code}: DLX ${d.value.count} raw, fast ${String(f.value.rawSolutions)}`);
    }
  }
  const total = fast.reduce((a, b) => a + b, 0);
  const parts = [
    `  order ${order}: ${lines.length} sets, ${nonUnique} not unique; fast total ${fmt(total)} ms (median ${fmt(median(fast))}, max ${fmt(Math.max(...fast))})`,
    refSets > 0 ? `reference ${fmt(refMs)} ms (ratio ${(refMs / fastOnRef).toFixed(0)}x)` : 'reference not run (order 13)',
    dlxSets > 0 ? `DLX ${fmt(dlxMs)} ms on ${dlxSets} sets (ratio ${(dlxMs / dlxFastMs).toFixed(0)}x)` : 'DLX: no set small enough',
  ];
  if (dlxSkipped > 0) parts.push(`DLX skipped ${dlxSkipped} sets with more than ${MAX_DLX_ONES} matrix entries (memory)`);
  console.log(parts.join('; '));
}

// OEIS A014530; Duijvestijn 1978
const SQUARE_112 = parseTiling('21 112 112 (50,35,27)(8,19)(15,17,11)(6,24)(29,25,9,2)(7,18)(16)(42)(4,37)(33)');
{
  const runs = [0, 1, 2, 3, 4].map(() => time(() => solveAssembly({ width: 112, height: 112, pieces: sizes(SQUARE_112) })));
  const r = runs[0]!.value;
  const ms = median(runs.map((x) => x.ms));
  if (r.verdict !== 'unique') fail('112 square not unique');
  // the reference is run for real, in a child process capped in time and memory (BENCH_DLX_CAP_S,
  // default 20 s wall; 1 GB heap): when it does not finish, the ratio is a lower bound "> N x"
  const capS = Number(process.env.BENCH_DLX_CAP_S ?? 20);
  const script = fileURLToPath(new URL('./dlx-reference.mjs', import.meta.url));
  const w0 = now();
  const p = spawnSync(process.execPath, ['--max-old-space-size=1024', script, '112', '112', sizes(SQUARE_112).join(',')], { encoding: 'utf8', timeout: capS * 1000, maxBuffer: 1 << 26 });
  const wall = now() - w0;
  const lines = (p.stdout ?? '').trim().split('\n');
  const done = lines.find((l) => l.startsWith('count '));
  const lastRows = [...lines].reverse().find((l) => l.startsWith('rows ')) ?? 'rows 0 of ?';
  let dlx: string;
  if (done) {
    const [, count, , dms] = done.split(' ');
    dlx = `DLX ${count} raw solutions (the symmetries of one square) in ${fmt(Number(dms))} ms CPU, ${(Number(dms) / ms).toFixed(0)}x`;
  } else {
    const why = p.error && (p.error as NodeJS.ErrnoException).code === 'ETIMEDOUT' ? `stopped at the cap of ${capS} s` : `ended without an answer (${p.signal ?? `exit ${p.status}`}: out of its 1 GB heap)`;
    const [, added, , total] = lastRows.split(' ');
    const stage = added === total ? `searching (its exact-cover matrix built: ${added} placements)` : `still building its exact-cover matrix (${added} of ${total} placements)`;
    // ours: the larger of its CPU and wall medians, so the bound is not flattered by the timer
    const oursMs = Math.max(ms, median(runs.map((x) => x.wall)));
    dlx = `DLX ${why} after ${fmt(wall)} ms wall, ${stage}: > ${Math.floor(wall / Math.max(oursMs, 0.01)).toLocaleString('en')}x`;
  }
  console.log(`puzzle: 112 x 112 order 21 (OEIS A014530): ${r.verdict}, ${r.nodes} nodes, median ${fmt(ms)} ms CPU of 5 (wall ${fmt(median(runs.map((x) => x.wall)))} ms; target < 100 ms)${ms >= 100 ? ' MISSED' : ''}; ${dlx}`);
}

{
  const pieces = Array.from({ length: 24 }, (_, i) => i + 1);
  const r = time(() => solveAssembly({ width: 70, height: 70, pieces }));
  if (r.value.verdict !== 'none') fail('1..24 in 70 x 70 not none');
  const d = dlxCount(70, 70, pieces, MAX_DLX_ONES);
  console.log(`puzzle: squares 1..24 in 70 x 70 (MathWorld): ${r.value.verdict} (complete ${r.value.complete}), ${r.value.nodes} nodes, ${fmt(r.ms)} ms CPU (wall ${fmt(r.wall)} ms; target < 1 s)${r.ms >= 1000 ? ' MISSED' : ''}; DLX: ${'tooLarge' in d ? `not run (${d.tooLarge.toLocaleString('en')} entries)` : `${d.count}`}`);
}

console.log('puzzle: seeded random simple perfect sets (foundry randomTilings, seed 4), 6 per order');
const randomByOrder = new Map<number, Tiling[]>();
for (const order of [21, 22, 23, 24, 25]) {
  const found: Tiling[] = [];
  randomTilings({ count: 6, orderMin: order, orderMax: order, seed: 4 + order, onFound: (f) => found.push(f.tiling) });
  randomByOrder.set(order, found);
  const ms: number[] = [];
  const verdicts = new Map<string, number>();
  let maxSide = 0;
  for (const t of found) {
    const r = time(() => solveAssembly({ width: t.W, height: t.H, pieces: sizes(t) }, { budget: { maxMs: 10_000 } }));
    ms.push(r.ms);
    verdicts.set(r.value.verdict, (verdicts.get(r.value.verdict) ?? 0) + 1);
    maxSide = Math.max(maxSide, t.W, t.H);
  }
  const t0 = found[0];
  const d = t0 ? dlxCount(t0.W, t0.H, sizes(t0), MAX_DLX_ONES) : null;
  console.log(`  order ${order}: ${[...verdicts].map(([v, c]) => `${c} ${v}`).join(', ')}; median ${fmt(median(ms))} ms, max ${fmt(Math.max(...ms))} ms; sides up to ${maxSide}; DLX: ${d && 'tooLarge' in d ? `cannot hold them (first set: ${d.tooLarge.toLocaleString('en')} entries)` : 'ran'}`);
}

// Assembly as the sets grow: seeded random simple perfect sets of orders 10 to 30 (frames up to
// 10^6, the Assembly limit; random sets of higher orders exceed it), median CPU time of up to 4
// per order and the growth exponent (least squares on log-log); the general reference
// (dancing-links) cannot hold sets past order 10, so only ours is fitted.
{
  const orders = [10, 15, 20, 25, 30];
  const med: number[] = [];
  const rows: string[] = [];
  for (const order of orders) {
    const found: Tiling[] = [];
    randomTilings({ count: 12, orderMin: order, orderMax: order, seed: 90 + order, onFound: (f) => found.push(f.tiling) });
    const ms = found.filter((t) => t.W <= 1e6 && t.H <= 1e6).slice(0, 4).map((t) => time(() => solveAssembly({ width: t.W, height: t.H, pieces: sizes(t) }, { budget: { maxMs: 10_000 } })).ms);
    med.push(Math.max(median(ms), 0.01));
    rows.push(`${order}: ${fmt(median(ms))} ms`);
  }
  const lx = orders.map(Math.log);
  const ly = med.map(Math.log);
  const mx = lx.reduce((a, b) => a + b, 0) / lx.length;
  const my = ly.reduce((a, b) => a + b, 0) / ly.length;
  let num = 0;
  let den = 0;
  lx.forEach((x, i) => { num += (x - mx) * (ly[i]! - my); den += (x - mx) ** 2; });
  console.log(`puzzle: Assembly by order (median CPU of 4 seeded random sets): ${rows.join('; ')}; growth exponent ${(num / den).toFixed(2)}`);
}

console.log('puzzle: Deduction, fewest givens (16 seeded restarts + bounded exact search) on the order-25 random sets');
for (const [level, showFrame] of [[2, false], [3, false], [4, false], [Number.POSITIVE_INFINITY, false], [Number.POSITIVE_INFINITY, true]] as const) {
  const ms: number[] = [];
  const counts: number[] = [];
  let proved = 0;
  const sets = randomByOrder.get(25) ?? [];
  if (sets[0]) chooseGivens(deductionBoard(sets[0]), { level, showFrame }, { seed: 2 }); // JIT warm-up, not measured
  for (const t of sets) {
    const board = deductionBoard(t);
    const r = time(() => chooseGivens(board, { level, showFrame }, { seed: 1 }));
    ms.push(r.ms);
    counts.push(r.value.givens.length);
    if (r.value.minimal === 'proved') proved++;
  }
  const worst = Math.max(...ms);
  console.log(`  level ${Number.isFinite(level) ? level : 'closure'}${showFrame ? ', frame shown' : ''}: givens ${Math.min(...counts)}-${Math.max(...counts)} (${proved}/${counts.length} proved minimum); median ${fmt(median(ms))} ms, max ${fmt(worst)} ms (target < 50 ms)${worst >= 50 ? ' MISSED' : ''}`);
}

{
  const board = deductionBoard(SQUARE_112);
  const r = time(() => chooseGivens(board, { level: Number.POSITIVE_INFINITY, showFrame: false }, { seed: 1 }));
  console.log(`puzzle: Deduction on the 112 square at the closure: ${r.value.givens.length} givens (${r.value.minimal}), ${fmt(r.ms)} ms`);
}

if (failures > 0) {
  console.log(`puzzle: ${failures} check(s) FAILED`);
  process.exitCode = 1;
}
