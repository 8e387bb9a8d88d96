// Intake benchmark (`npm run bench`): seed 50,000 tilings into a fresh stock, then drive
// GET /api/stock (with filters) and GET /api/stock/:id at a fixed 200 requests per second
// over loopback (open loop: a request is started every 5 ms whether or not the last one
// has answered) and report the latency percentiles. Target (issue 6): p95 < 50 ms.
// BENCH_QUICK=1 seeds 5,000 and runs 5 s per scenario; BENCH_RATE=N changes the rate.
import http from 'node:http';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { AddressInfo } from 'node:net';
import { createApp } from '../server/app';
import { buildDeps } from '../server/compose';
import { closeDatabase, openDatabase } from '../server/platform/db/client';
import { loadEnv } from '../server/platform/env';
import { seedBulkStock } from '../server/areas/intake/demo-seed';
import { mulberry32 } from '../shared/tiling/prng';

const quick = process.env.BENCH_QUICK === '1';
const N = quick ? 5_000 : 50_000;
const RATE = Number(process.env.BENCH_RATE ?? 200);
const SECONDS = quick ? 5 : 10;

function percentile(sorted: number[], p: number): number {
  if (sorted.length === 0) return NaN;
  return sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)]!;
}

async function run(): Promise<void> {
  const dir = mkdtempSync(join(tmpdir(), 'sw-bench-intake-'));
  const env = loadEnv({ NODE_ENV: 'production', DATA_DIR: dir, LOG_LEVEL: 'warn', AUTH_SECRET: 'bench-secret-bench-secret-bench-secret-01', PUBLIC_URL: 'http://localhost:3000' });
  const db = openDatabase(join(dir, 'bench.db'));
  const deps = buildDeps({ env, db, demo: false, secret: env.AUTH_SECRET ?? '', smtp: { url: 'smtp://127.0.0.1:9', localFake: true }, signInLimit: { window: 60, max: 1000 } });
  const t0 = Date.now();
  const created = seedBulkStock(deps, N);
  const seedMs = Date.now() - t0;
  const app = createApp(deps);
  const server = http.createServer(app);
  server.keepAliveTimeout = 60_000; // longer than the run, so the client's kept-alive sockets are never reset
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', () => r()));
  const port = (server.address() as AddressInfo).port;
  const base = `http://127.0.0.1:${port}`;
  await deps.auth.api.createUser({ body: { email: 'bench-editor@test.squarewright.test', password: 'bench-password-123', name: 'Bench', role: 'editor' } });
  const signIn = await fetch(`${base}/api/auth/sign-in/email`, { method: 'POST', headers: { 'content-type': 'application/json', origin: env.PUBLIC_URL }, body: JSON.stringify({ email: 'bench-editor@test.squarewright.test', password: 'bench-password-123' }) });
  const cookie = (signIn.headers.getSetCookie?.() ?? []).map((c) => c.split(';')[0]).join('; ');
  if (!signIn.ok || !cookie) throw new Error(`bench sign-in failed: ${signIn.status}`);
  const agent = new http.Agent({ keepAlive: true, maxSockets: 64 });

  function get(path: string): Promise<{ ms: number; status: number }> {
    const start = process.hrtime.bigint();
    return new Promise((resolve, reject) => {
      const req = http.get({ host: '127.0.0.1', port, path, agent, headers: { cookie, accept: 'application/json' } }, (res) => {
        res.resume();
        res.on('end', () => resolve({ ms: Number(process.hrtime.bigint() - start) / 1e6, status: res.statusCode ?? 0 }));
      });
      req.on('error', (e) => (e && (e as NodeJS.ErrnoException).code === 'ECONNRESET' ? resolve({ ms: Number(process.hrtime.bigint() - start) / 1e6, status: 0 }) : reject(e)));
    });
  }

  // a fixed pseudo-random sequence (seed 6) so runs are comparable
  const rnd = mulberry32(6);
  const filters = [
    () => `/api/stock?orderMin=${20 + Math.floor(rnd() * 8)}&orderMax=${28 + Math.floor(rnd() * 8)}&page=${1 + Math.floor(rnd() * 20)}`,
    () => `/api/stock?provenance=foundry&sort=-width&page=${1 + Math.floor(rnd() * 50)}`,
    () => `/api/stock?perfect=true&simple=true&used=unused&sort=order`,
    () => `/api/stock?widthMin=${Math.floor(rnd() * 500000)}&heightMax=400000&sort=-createdAt&pageSize=50`,
    () => `/api/stock?square=false&orderMin=30&page=${1 + Math.floor(rnd() * 10)}`,
  ];
  const scenarios: [string, () => string][] = [
    ['GET /api/stock (filters)', () => filters[Math.floor(rnd() * filters.length)]!()],
    ['GET /api/stock/:id', () => `/api/stock/${1 + Math.floor(rnd() * created)}`],
  ];

  console.log(`\nintake: seeded ${created.toLocaleString('en-GB')} stock tilings in ${(seedMs / 1000).toFixed(1)} s`);
  console.log(`| route | requests | rate (req/s) | p50 ms | p95 ms | p99 ms | max ms | non-200 | CPU ms/request |`);
  console.log(`|---|---|---|---|---|---|---|---|---|`);
  let failed = false;
  for (const [name, path] of scenarios) {
    for (let i = 0; i < 50; i++) await get(path()); // warm-up
    const lat: number[] = [];
    let bad = 0;
    const total = RATE * SECONDS;
    const started = Date.now();
    const cpu0 = process.cpuUsage();
    const pending: Promise<void>[] = [];
    for (let i = 0; i < total; i++) {
      const due = started + (i * 1000) / RATE;
      const wait = due - Date.now();
      if (wait > 0) await new Promise((r) => setTimeout(r, wait));
      pending.push(get(path()).then((r) => {
        lat.push(r.ms);
        if (r.status !== 200) bad++;
      }));
    }
    await Promise.all(pending);
    const secs = (Date.now() - started) / 1000;
    const cpu = process.cpuUsage(cpu0);
    const cpuPerReq = (cpu.user + cpu.system) / 1000 / lat.length;
    lat.sort((a, b) => a - b);
    const p95 = percentile(lat, 95);
    if (!(p95 < 50) || bad > 0) failed = true;
    console.log(`| ${name} | ${lat.length} | ${(lat.length / secs).toFixed(0)} | ${percentile(lat, 50).toFixed(1)} | ${p95.toFixed(1)} | ${percentile(lat, 99).toFixed(1)} | ${lat[lat.length - 1]!.toFixed(1)} | ${bad} | ${cpuPerReq.toFixed(2)} |`);
  }
  const [l1, l5] = (await import('node:os')).loadavg();
  console.log(`(load average ${l1!.toFixed(1)} / ${l5!.toFixed(1)} over 1 / 5 min; CPU time includes the load generator, same process)`);
  console.log(failed ? 'intake: TARGET MISSED (p95 < 50 ms, all 200)' : 'intake: p95 < 50 ms on both routes');
  agent.destroy();
  await new Promise<void>((r) => server.close(() => r()));
  await deps.mail.stop();
  closeDatabase(db);
  rmSync(dir, { recursive: true, force: true });
  if (failed) process.exitCode = 1;
}

await run();
