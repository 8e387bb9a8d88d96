// Tiling engine benchmark (`npm run bench`, about 15-25 s): verification throughput at orders
// 10, 20 and 30 next to the cost of merely reading the same numbers, and the exact Kirchhoff
// solve next to mathjs solving the same linear systems with fractions. Inputs are seeded
// random c-nets solved by the engine itself. Times are CPU time of this process (the
// machine is shared); wall-clock figures are printed beside them.
import { all, create } from 'mathjs';
import {
  canonicalCode,
  classifyTiling,
  edgesOf,
  mulberry32,
  parseTiling,
  randomCNet,
  solvePlaneNetwork,
  toBouwkamp,
  bareissSolve,
  bareissSolveNumber,
  type PlaneGraph,
} from '../shared/tiling/index';

const math = create(all!, { number: 'Fraction' });

function cpuMs(): number {
  const u = process.cpuUsage();
  return (u.user + u.system) / 1000;
}

/** Runs f over the items for about `ms` milliseconds of CPU time; returns operations per second. */
function rate<T>(items: readonly T[], f: (x: T) => unknown, ms = 400): { perSec: number; wallPerSec: number } {
  for (let i = 0; i < Math.min(items.length, 200); i++) f(items[i]!); // warm-up
  let ops = 0;
  const c0 = cpuMs();
  const w0 = performance.now();
  while (cpuMs() - c0 < ms) {
    for (let i = 0; i < items.length; i++) f(items[i]!);
    ops += items.length;
  }
  const c = cpuMs() - c0;
  const w = performance.now() - w0;
  return { perSec: (ops / c) * 1000, wallPerSec: (ops / w) * 1000 };
}

/** The reading floor: split the code into its numbers and nothing else. */
function readNumbers(code: string): number {
  let sum = 0;
  let v = 0;
  let inNum = false;
  for (let i = 0; i < code.length; i++) {
    const c = code.charCodeAt(i);
    if (c >= 48 && c <= 57) {
      v = v * 10 + (c - 48);
      inNum = true;
    } else if (inNum) {
      sum += v;
      v = 0;
      inNum = false;
    }
  }
  return sum + v;
}

interface Net {
  g: PlaneGraph;
  p: number;
  q: number;
}

function corpus(order: number, count: number, seed: number): { codes: string[]; nets: Net[] } {
  const rng = mulberry32(seed);
  const codes: string[] = [];
  const nets: Net[] = [];
  const seen = new Set<string>();
  for (let tries = 0; codes.length < count && tries < count * 20; tries++) {
    const g = randomCNet(order + 1, rng);
    const es = edgesOf(g);
    const [p, q] = es[Math.floor(rng() * es.length)]!;
    const r = solvePlaneNetwork(g, { p, q });
    if (!r.ok) continue;
    const code = toBouwkamp(r.tiling);
    nets.push({ g, p, q });
    if (seen.has(code)) continue;
    seen.add(code);
    codes.push(code);
  }
  return { codes, nets };
}

const fmt = (x: number) => Math.round(x).toLocaleString('en-US');
const w0 = performance.now();
const c0 = cpuMs();
console.log('tiling: verification throughput (codes/s, CPU time; wall in brackets)');
const targets: Record<number, number> = { 20: 40_000, 30: 15_000 };
const nets: Record<number, Net[]> = {};
for (const order of [10, 20, 30]) {
  const { codes, nets: ns } = corpus(order, 400, 1000 + order);
  nets[order] = ns;
  const read = rate(codes, readNumbers);
  const verify = rate(codes, (c) => parseTiling(c));
  const full = rate(codes, (c) => {
    const t = parseTiling(c);
    classifyTiling(t);
    return canonicalCode(t);
  });
  const target = targets[order];
  const verdict = target ? (verify.perSec >= target ? ` (target ${fmt(target)}: met)` : ` (target ${fmt(target)}: MISSED)`) : '';
  console.log(
    `  order ${order} (${codes.length} codes): read ${fmt(read.perSec)} [${fmt(read.wallPerSec)}]; ` +
      `decode+verify ${fmt(verify.perSec)} [${fmt(verify.wallPerSec)}]${verdict}, ratio to reading ${(read.perSec / verify.perSec).toFixed(1)}x; ` +
      `+ classify + canonical ${fmt(full.perSec)} [${fmt(full.wallPerSec)}], ratio ${(read.perSec / full.perSec).toFixed(1)}x`,
  );
}

console.log('tiling: exact Kirchhoff solve (one reduced-Laplacian system per c-net) vs mathjs fractions');
for (const order of [10, 20, 30]) {
  const ns = nets[order]!.slice(0, 200);
  const ours = rate(ns, (n) => solvePlaneNetwork(n.g, n));
  // mathjs: the same systems, L' x = e_p over fractions (lusolve) - the linear algebra only,
  // without the layout our figure includes
  const plain = ns.map((n) => {
    const keep = [...Array(n.g.n).keys()].filter((v) => v !== n.q);
    const pos = new Map(keep.map((v, i) => [v, i]));
    const L = keep.map(() => keep.map(() => 0));
    for (const [u, v] of edgesOf(n.g)) {
      if ((u === n.p && v === n.q) || (u === n.q && v === n.p)) continue;
      for (const [a, b] of [[u, v], [v, u]] as const) {
        const ia = pos.get(a);
        if (ia === undefined) continue;
        L[ia]![ia]! += 1;
        const ib = pos.get(b);
        if (ib !== undefined) L[ia]![ib]! -= 1;
      }
    }
    return { L, b: keep.map((v) => (v === n.p ? 1 : 0)) };
  });
  const linear = rate(plain, (s) => bareissSolveNumber(s.L, s.b) ?? bareissSolve(s.L, s.b));
  const systems = plain.slice(0, 12).map((s) => ({ A: math.matrix(s.L.map((r) => r.map((x) => math.fraction(x)))), b: s.b.map((x) => [math.fraction(x)]) }));
  const theirs = rate(systems, (s) => math.lusolve(s.A, s.b), 400);
  const usOurs = 1e6 / ours.perSec;
  const usLinear = 1e6 / linear.perSec;
  const usTheirs = 1e6 / theirs.perSec;
  const ratio = usTheirs / usLinear;
  console.log(
    `  order ${order} (${plain[0]!.L.length}x${plain[0]!.L.length} systems): exact Bareiss solve ${usLinear.toFixed(1)} us [wall ${(1e6 / linear.wallPerSec).toFixed(1)}], ` +
      `mathjs lusolve on fractions ${usTheirs.toFixed(0)} us [wall ${(1e6 / theirs.wallPerSec).toFixed(0)}], ratio ${ratio.toFixed(0)}x (target 50x: ${ratio >= 50 ? 'met' : 'MISSED'}); ` +
      `whole solvePlaneNetwork (solve + layout + re-verify) ${usOurs.toFixed(1)} us [wall ${(1e6 / ours.wallPerSec).toFixed(1)}], ${(usTheirs / usOurs).toFixed(0)}x mathjs`,
  );
}
console.log(`tiling: done in ${((performance.now() - w0) / 1000).toFixed(1)} s wall, ${((cpuMs() - c0) / 1000).toFixed(1)} s CPU`);
