// Tiling engine benchmark (`npm run bench`, about 30 s): accepting codes (the whole pipeline a
// user runs: acceptCode = parse, decode, verify, classify with sub-rectangles, canonical code;
// and `cli verify`'s line, which adds the spanning-tree count) at orders 10, 20 and 30 next to
// the cost of merely reading the same numbers; the whole c-net -> tiling solve next to mathjs
// solving the same linear systems with fractions, 10 to 160 squares (seeded random c-nets up
// to 40 squares, compound tilings by composition above: random nets' sides pass 2^31 there),
// growth exponents by least squares on log-log; a 996-vertex network and a random one of
// 1,000 vertices. Cold = the first call in this process; warm = the rate after warm-up.
// Times are CPU time of this process (the machine is shared); wall in brackets.
import { all, create } from 'mathjs';
import { verifyLine } from '../server/cli/tiling';
import { stackedTiling } from '../tests/shared/tiling/helpers';
import {
  acceptCode,
  edgesOf,
  smithDiagram,
  type Tiling,
  mulberry32,
  parseTiling,
  randomCNet,
  solvePlaneNetwork,
  toBouwkamp,
  type PlaneGraph,
} from '../shared/tiling/index';

const math = create(all!, { number: 'Fraction' });

function cpuMs(): number {
  const u = process.cpuUsage();
  return (u.user + u.system) / 1000;
}

/** Runs f over the items for about `ms` milliseconds of CPU time; returns operations per second. */
function rate<T>(items: readonly T[], f: (x: T) => unknown, ms = 400): { perSec: number; wallPerSec: number } {
  // warm-up (the JIT's optimising tiers), the same for ours and the references: every item up to 200
  // and at least 150 ms of CPU; the first call of the process is measured separately (cold)
  const cw = cpuMs();
  for (let i = 0; i < Math.min(items.length, 200) || cpuMs() - cw < 150; i++) f(items[i % items.length]!);
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
let missed = 0;
const verdict = (ok: boolean) => {
  if (!ok) missed++;
  return ok ? 'met' : 'MISSED';
};
/** Slope of log y against log x (least squares): the growth exponent. */
function exponent(xs: number[], ys: number[]): number {
  const lx = xs.map(Math.log);
  const ly = ys.map(Math.log);
  const mx = lx.reduce((a, b) => a + b, 0) / lx.length;
  const my = ly.reduce((a, b) => a + b, 0) / ly.length;
  let num = 0;
  let den = 0;
  for (let i = 0; i < lx.length; i++) {
    num += (lx[i]! - mx) * (ly[i]! - my);
    den += (lx[i]! - mx) ** 2;
  }
  return num / den;
}
function cold<T>(f: () => T): number {
  const t = cpuMs();
  f();
  return cpuMs() - t;
}

console.log('tiling: accepting codes (codes/s, CPU time; wall in brackets); reference: reading the same numbers');
const nets: Record<number, Net[]> = {};
for (const order of [10, 20, 30]) {
  const { codes, nets: ns } = corpus(order, 400, 1000 + order);
  nets[order] = ns;
  const coldAccept = cold(() => acceptCode(codes[0]!));
  const read = rate(codes, readNumbers);
  const full = rate(codes, (c) => acceptCode(c));
  const cli = rate(codes, (c) => verifyLine(c, 1));
  const ratio = read.perSec / full.perSec;
  let target = '';
  if (order === 30) target = ` (target >= 100,000/s: ${verdict(full.perSec >= 100_000)}; <= 5x reading: ${verdict(ratio <= 5)})`;
  const cliTarget = order === 20 ? ` (target >= 50,000/s: ${verdict(cli.perSec >= 50_000)})` : '';
  console.log(
    `  order ${order} (${codes.length} codes): read ${fmt(read.perSec)} [${fmt(read.wallPerSec)}]; accept (parse, verify, classify, canonical) ${fmt(full.perSec)} [${fmt(full.wallPerSec)}], ` +
      `${ratio.toFixed(1)}x reading${target}; cli verify line (+ spanning trees) ${fmt(cli.perSec)} [${fmt(cli.wallPerSec)}]${cliTarget}; cold first accept ${coldAccept.toFixed(2)} ms`,
  );
}

/** The reduced Laplacian system of a c-net and pole, as mathjs fractions. */
function mathjsSystem(n: Net) {
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
  return { A: math.matrix(L.map((r) => r.map((x) => math.fraction(x)))), b: keep.map((v) => [math.fraction(v === n.p ? 1 : 0)]) };
}
const netOf = (t: Tiling): Net => {
  const d = smithDiagram(t);
  return { g: d.graph, p: d.pole.from, q: d.pole.to };
};

console.log('tiling: whole c-net -> tiling (solvePlaneNetwork: checks, solve, layout, decode check) vs mathjs lusolve on fractions (the linear solve only)');
const sizes: number[] = [];
const oursUs: number[] = [];
const theirsUs: number[] = [];
const base20 = corpus(20, 8, 77).nets.map((n) => solvePlaneNetwork(n.g, n)).flatMap((r) => (r.ok ? [r.tiling] : []));
for (const squares of [10, 20, 40, 80, 160]) {
  let ns: Net[];
  let how: string;
  if (squares <= 40) {
    ns = (nets[squares] ?? corpus(squares, 60, 2000 + squares).nets).slice(0, 60);
    how = 'random c-nets';
  } else {
    ns = base20.map((t) => netOf(stackedTiling(t, squares / 20)));
    how = `${squares / 20} stacked 20-square rectangles`;
  }
  const coldMs = cold(() => solvePlaneNetwork(ns[0]!.g, ns[0]!));
  const ours = rate(ns, (n) => solvePlaneNetwork(n.g, n), 300);
  const systems = ns.slice(0, 3).map(mathjsSystem);
  const theirs = rate(systems, (s) => math.lusolve(s.A, s.b), squares >= 80 ? 1500 : 400);
  const us = 1e6 / ours.perSec;
  const them = 1e6 / theirs.perSec;
  sizes.push(squares);
  oursUs.push(us);
  theirsUs.push(them);
  console.log(
    `  ${squares} squares (${how}, ${ns[0]!.g.n} vertices): ours ${us.toFixed(1)} us [wall ${(1e6 / ours.wallPerSec).toFixed(1)}], cold ${coldMs.toFixed(2)} ms; ` +
      `mathjs ${fmt(them)} us [wall ${fmt(1e6 / theirs.wallPerSec)}]; ${(them / us).toFixed(0)}x (target 50x: ${verdict(them / us >= 50)})`,
  );
}
// accepting codes as the tilings grow: the same sizes, codes of the solved tilings
{
  const accUs: number[] = [];
  const readUs: number[] = [];
  const rows: string[] = [];
  for (const squares of sizes) {
    const tilings = squares <= 40 ? (nets[squares] ?? corpus(squares, 60, 2000 + squares).nets).slice(0, 60).flatMap((n) => { const r = solvePlaneNetwork(n.g, n); return r.ok ? [r.tiling] : []; }) : base20.map((t) => stackedTiling(t, squares / 20));
    const codes = tilings.map((t) => toBouwkamp(t));
    const acc = 1e6 / rate(codes, (c) => acceptCode(c), 200).perSec;
    const rd = 1e6 / rate(codes, readNumbers, 100).perSec;
    accUs.push(acc);
    readUs.push(rd);
    rows.push(`${squares}: ${acc.toFixed(1)} us (${(acc / rd).toFixed(1)}x reading)`);
  }
  console.log(`  accepting a code by size: ${rows.join('; ')}; growth exponent ${exponent(sizes, accUs).toFixed(2)} (reading ${exponent(sizes, readUs).toFixed(2)})`);
}
const eo = exponent(sizes, oursUs);
const em = exponent(sizes, theirsUs);
console.log(`  growth exponent 10..160 squares: ours ${eo.toFixed(2)}, mathjs ${em.toFixed(2)} (target: no worse than mathjs: ${verdict(eo <= em)})`);
{
  const big = netOf(stackedTiling(parseTiling('9 33 32 (18,15)(7,8)(14,4)(10,1)(9)'), 199));
  const t1 = cpuMs();
  const r = solvePlaneNetwork(big.g, big);
  const ms = cpuMs() - t1;
  const rnd = randomCNet(2000, mulberry32(1000));
  const [p, q] = edgesOf(rnd)[0]!;
  const t2 = cpuMs();
  const r2 = solvePlaneNetwork(rnd, { p, q });
  const ms2 = cpuMs() - t2;
  console.log(
    `  ceiling 1,000 vertices: ${big.g.n}-vertex network (199 stacked 33 x 32, 1,791 squares) ${r.ok ? 'solved' : r.code} in ${ms.toFixed(0)} ms cold (target < 1 s: ${verdict(r.ok && ms < 1000)}); ` +
      `random c-net of ${rnd.n} vertices: ${r2.ok ? 'solved' : r2.code} in ${ms2.toFixed(0)} ms (target < 1 s: ${verdict(ms2 < 1000)})`,
  );
}
console.log(`tiling: done in ${((performance.now() - w0) / 1000).toFixed(1)} s wall, ${((cpuMs() - c0) / 1000).toFixed(1)} s CPU${missed ? `; ${missed} target(s) MISSED` : ''}`);
