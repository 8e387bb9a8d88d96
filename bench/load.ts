// Load bench (`npm run bench -- load`): does heavy work stall the desk? The server runs in its
// own process (bench/load-server.ts, production mode, job threads as `npm start` has them) with
// 50,000 tilings in stock; the load generator is autocannon in a third process doing nothing else (bench/load-driver.ts; this one sends the upload and reads the export). 200 requests a
// second for 30 s: 120/s on the stock list (five filter shapes, random pages, so not only cached
// answers), 60/s on stock details (random ids), 20/s on /api/health; first idle, then WHILE
// - a 5 MB upload of long codes (1,300 lines of ~1,900 squares each) is checked and stored,
// - an exhaustive order-18 foundry run goes on (search in shards, then storing its results),
// - a 12-puzzle A4 proof is rendered (on a job worker, as the proof route does),
// - 100,000 CSV rows are exported (the whole stock, twice in a row).
// The load generator counts answers to requests sent once every simulated user is connected
// (about a second in: a new connection's first request waits for the connection, up to 2 s
// when the server is busy), and the heavy work starts at that moment.
// Prints p50/p95/p99/max per route and case, the server's CPU time per request (all its
// threads) and its main thread's busy time per request. Target under the heavy work: p95 < 50 ms,
// p99 < 100 ms, max < 250 ms. BENCH_QUICK=1: 5,000 tilings and 10 s per case. BENCH_SERVER_PROF=<dir>
// writes the server's CPU profiles (V8 .cpuprofile, one a thread) into <dir>; BENCH_TRACE_GC=1
// runs the server with --trace-gc; BENCH_SLOW=1 has the load generator list every answer over
// 100 ms with its time into the case (slow answers that come together point at a pause).
import { fork, type ChildProcess } from 'node:child_process';
import { loadavg } from 'node:os';
import { fileURLToPath } from 'node:url';
import { longCodeFile } from '../tests/fixtures/long-codes';
import { mulberry32 } from '../shared/tiling/prng';
import { stockListShapes } from './load-shapes';

const quick = process.env.BENCH_QUICK === '1';
const STOCK = Number(process.env.BENCH_STOCK ?? (quick ? 5_000 : 50_000));
const SECONDS = Number(process.env.BENCH_SECONDS ?? (quick ? 10 : 30));
const ORIGIN = 'http://localhost:3000';
// every filter shape once (fixed parameters)
const warmUp = stockListShapes.map((shape) => shape(mulberry32(1)));

type Msg = { type: string } & Record<string, unknown>;

function ask<T extends Msg>(child: ChildProcess, m: Msg, answer: string): Promise<T> {
  return new Promise((resolve) => {
    const on = (r: Msg) => {
      if (r.type !== answer) return;
      child.off('message', on);
      resolve(r as T);
    };
    child.on('message', on);
    child.send(m);
  });
}


interface Row { route: string; n: number; p50: number; p95: number; p99: number; max: number; bad: number }
type DriverLoop = { loopP99Ms: number; loopMaxMs: number; cpuMs: number };

/** One case of load from the load generator's own process (./load-driver.ts): rows per route and the generator's own event-loop delay. */
async function drive(base: string, cookie: string, seeded: number, onConnected?: () => void): Promise<{ rows: Row[]; driver: DriverLoop }> {
  const child = fork(fileURLToPath(new URL('./load-driver.ts', import.meta.url)), [], { stdio: ['ignore', 'inherit', 'inherit', 'ipc'] });
  const exited = new Promise<number | null>((r) => child.on('exit', (code) => r(code)));
  child.on('message', (m: Msg) => {
    if (m.type === 'connected') onConnected?.();
  });
  const done = await Promise.race([
    ask<Msg & { rows: Row[]; driver: DriverLoop }>(child, { type: 'drive', base, cookie, seeded, seconds: SECONDS }, 'driven'),
    exited.then((c) => {
      throw new Error(`load bench: the load generator exited (${c}) before it was done`);
    }),
  ]);
  child.send({ type: 'stop' });
  await exited;
  return { rows: done.rows, driver: done.driver };
}

async function signIn(base: string, email: string): Promise<string> {
  const r = await fetch(`${base}/api/auth/sign-in/email`, { method: 'POST', headers: { 'content-type': 'application/json', origin: ORIGIN }, body: JSON.stringify({ email, password: 'bench-password-123' }) });
  const cookie = (r.headers.getSetCookie?.() ?? []).map((c) => c.split(';')[0]).join('; ');
  if (!r.ok || !cookie) throw new Error(`load bench: sign-in of ${email} failed (${r.status})`);
  return cookie;
}

const f1 = (x: number) => (Number.isFinite(x) ? x.toFixed(1) : '–');

async function main() {
  const child = fork(fileURLToPath(new URL('./load-server.ts', import.meta.url)), [], {
    env: { ...process.env, BENCH_STOCK: String(STOCK) },
    stdio: ['ignore', 'inherit', 'inherit', 'ipc'],
    // BENCH_SERVER_PROF=<dir>: the server's V8 CPU profiles (one a thread) are written there
    ...(process.env.BENCH_SERVER_PROF ? { execArgv: [...process.execArgv, '--cpu-prof', `--cpu-prof-dir=${process.env.BENCH_SERVER_PROF}`] } : process.env.BENCH_TRACE_GC ? { execArgv: [...process.execArgv, '--trace-gc'] } : {}),
  });
  const exited = new Promise<number | null>((r) => child.on('exit', (code) => r(code)));
  const ready = await Promise.race([ask<Msg & { port: number; seeded: number; seedMs: number; mode: string }>(child, { type: 'hello' }, 'ready'), exited.then((c) => { throw new Error(`load bench: the server exited (${c}) before it was ready`); })]);
  const base = `http://127.0.0.1:${ready.port}`;
  console.log(`\nload: server in its own process (pid ${child.pid}, jobs: ${ready.mode}); ${ready.seeded.toLocaleString('en-GB')} tilings seeded in ${(ready.seedMs / 1000).toFixed(1)} s; ${SECONDS} s per case at 200 req/s`);
  const editor = await signIn(base, 'bench-editor@test.squarewright.test');
  const setter = await signIn(base, 'bench-setter@test.squarewright.test');
  // warm-up: every filter shape once, a few details
  for (let i = 0; i < 40; i++) await fetch(`${base}${i % 2 ? warmUp[i % warmUp.length]! : `/api/stock/${1 + (i * 97) % ready.seeded}`}`, { headers: { cookie: editor } });

  type Usage = Msg & { cpuMs: number; mainBusyMs: number; wallMs: number; loopP99Ms: number; loopMaxMs: number; serverP95Ms: number; serverP99Ms: number; serverMaxMs: number };
  await ask<Usage>(child, { type: 'mark' }, 'usage');
  const idleLoad = loadavg()[0]!;
  const idleRun = await drive(base, editor, ready.seeded);
  const idle = idleRun.rows;
  const idleUse = await ask<Usage>(child, { type: 'mark' }, 'usage');

  // the heavy work, all started at once as soon as every simulated user is connected (about a
  // second into the case), so that it meets a server already under the request load
  const file = longCodeFile(5 * 1024 * 1024 - 1024);
  const lines = file.split('\n').filter(Boolean).length;
  const heavyLog: string[] = [];
  let t0 = performance.now();
  const since = () => `${((performance.now() - t0) / 1000).toFixed(1)} s`;
  const form = new FormData();
  form.append('file', new Blob([file], { type: 'text/plain' }), 'long-codes.txt');
  let upload: Promise<string> = Promise.resolve('');
  let run: Promise<string> = Promise.resolve('');
  let render: Promise<unknown> = Promise.resolve();
  let exportRows: Promise<void> = Promise.resolve();
  const startHeavy = () => {
    t0 = performance.now();
    upload = fetch(`${base}/api/submissions/upload`, { method: 'POST', headers: { cookie: setter, origin: ORIGIN }, body: form }).then(async (r) => {
      heavyLog.push(`upload of ${(file.length / 1024 / 1024).toFixed(2)} MB (${lines.toLocaleString('en-GB')} lines) answered ${r.status} after ${since()}`);
      return ((await r.json()) as { id: string }).id;
    });
    run = fetch(`${base}/api/foundry/runs`, { method: 'POST', headers: { cookie: editor, origin: ORIGIN, 'content-type': 'application/json' }, body: JSON.stringify({ mode: 'exhaustive', order: 18 }) }).then(async (r) => {
      heavyLog.push(`foundry run (exhaustive, order 18) answered ${r.status} after ${since()}`);
      return ((await r.json()) as { id: string }).id;
    });
    render = ask<Msg & { ms: number; pages: number }>(child, { type: 'render' }, 'rendered').then((r) => heavyLog.push(`12-puzzle proof rendered on a job worker in ${(r.ms / 1000).toFixed(1)} s (${r.pages} pages)`));
    exportRows = (async () => {
      let rows = 0;
      let n = 0;
      while (rows < 100_000) {
        const r = await fetch(`${base}/api/stock/export.csv`, { headers: { cookie: editor } });
        // counted chunk by chunk as it streams (the load generator runs in its own process)
        let lines = 0;
        for await (const chunk of r.body ?? []) for (let i = (chunk as Uint8Array).indexOf(10); i >= 0; i = (chunk as Uint8Array).indexOf(10, i + 1)) lines++;
        rows += lines - 1; // the header line
        n++;
      }
      heavyLog.push(`${rows.toLocaleString('en-GB')} CSV rows exported (${n} exports of the whole stock) by ${since()}`);
    })();
  };
  const heavyRun = await drive(base, editor, ready.seeded, startHeavy);
  const heavy = heavyRun.rows;
  const heavyUse = await ask<Usage>(child, { type: 'mark' }, 'usage');
  const heavyLoad = loadavg()[0]!;
  await Promise.all([upload, run, render, exportRows]);
  const jobs = await ask<Msg & { jobs: { kind: string; state: string; progress: { phase?: string; done: number; total?: number; stored?: number } | null }[] }>(child, { type: 'jobs' }, 'jobs');
  for (const j of jobs.jobs.filter((x) => x.kind === 'foundry-run' || x.kind === 'intake-upload')) {
    const p = j.progress;
    heavyLog.push(`at the end of the heavy case: ${j.kind} ${j.state}${p ? `, ${p.done.toLocaleString('en-GB')}${p.total !== undefined ? ` of ${p.total.toLocaleString('en-GB')}` : ''} ${p.phase ?? ''}${p.stored !== undefined ? `, ${p.stored.toLocaleString('en-GB')} stored` : ''}` : ''}`);
  }

  console.log(`| route | case | requests | p50 ms | p95 ms | p99 ms | max ms | not 200 |`);
  console.log(`|---|---|---|---|---|---|---|---|`);
  for (let i = 0; i < idle.length; i++) {
    for (const [name, r] of [['idle', idle[i]!], ['heavy work', heavy[i]!]] as const) {
      console.log(`| ${r.route} | ${name} | ${r.n} | ${f1(r.p50)} | ${f1(r.p95)} | ${f1(r.p99)} | ${f1(r.max)} | ${r.bad} |`);
    }
  }
  const per = (u: Usage, rows: Row[]) => {
    const n = rows.reduce((a, r) => a + r.n, 0);
    return `server CPU ${(u.cpuMs / n).toFixed(2)} ms/request (all threads), main thread busy ${(u.mainBusyMs / n).toFixed(2)} ms/request (${((100 * u.mainBusyMs) / u.wallMs).toFixed(0)}% of the time), event-loop delay p99 ${u.loopP99Ms.toFixed(0)} ms, max ${u.loopMaxMs.toFixed(0)} ms; inside the server (arrival in JavaScript to last byte, the driven GETs) p95 ${f1(u.serverP95Ms)}, p99 ${f1(u.serverP99Ms)}, max ${f1(u.serverMaxMs)} ms`;
  };
  const gen = (d: DriverLoop) => `load generator (its own process): CPU ${(d.cpuMs / 1000).toFixed(1)} s, event-loop delay p99 ${d.loopP99Ms.toFixed(0)} ms, max ${d.loopMaxMs.toFixed(0)} ms`;
  console.log(`idle: ${per(idleUse, idle)}; ${gen(idleRun.driver)}; load average ${idleLoad.toFixed(1)}`);
  console.log(`heavy work: ${per(heavyUse, heavy)}; ${gen(heavyRun.driver)}; load average ${heavyLoad.toFixed(1)}`);
  for (const l of heavyLog) console.log(`  ${l}`);
  const missed = heavy.filter((r) => !(r.p95 < 50 && r.p99 < 100 && r.max < 250) || r.bad > 0);
  console.log(missed.length ? `load: TARGET MISSED under heavy work on ${missed.map((r) => r.route).join(', ')} (p95 < 50, p99 < 100, max < 250 ms, all 200)` : 'load: under heavy work every route kept p95 < 50 ms, p99 < 100 ms, max < 250 ms');
  child.send({ type: 'stop' });
  await exited;
  if (missed.length) process.exitCode = 1;
}

await main();
