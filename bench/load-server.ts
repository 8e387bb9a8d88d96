// The server of the load bench (bench/load.ts starts it with fork(): its own process, so the
// load generator never shares its event loop). A production-mode app on a fresh DATA_DIR with
// BENCH_STOCK tilings (default 50,000), job threads as `npm start` has them (JOB_WORKERS
// default). It answers the parent over IPC:
//   { type: 'mark' }    -> { type: 'usage', cpuMs, mainBusyMs, wallMs, loopP99Ms, loopMaxMs, serverP95Ms, serverP99Ms, serverMaxMs } since the last mark
//                          (process CPU of all its threads; main-thread busy time from the event
//                          loop's utilisation; server* = time of each GET inside the server but the export's)
//   { type: 'render' }  -> a 12-puzzle A4 proof rendered on a job worker, as the proof route does
//                          -> { type: 'rendered', ms, pages, bytes }
//   { type: 'jobs' }    -> { type: 'jobs', jobs: [{ kind, state, progress }] }
//   { type: 'stop' }    -> cancels what runs, closes, exits
import http from 'node:http';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { monitorEventLoopDelay, performance } from 'node:perf_hooks';
import type { AddressInfo } from 'node:net';
import { createApp } from '../server/app';
import { buildDeps } from '../server/compose';
import { closeDatabase, openDatabase } from '../server/platform/db/client';
import { loadEnv } from '../server/platform/env';
import { seedBulkStock } from '../server/areas/intake/demo-seed';
import { StockReader } from '../server/areas/stock/index';
import { renderOnWorker } from '../server/areas/print/index';
import { benchEdition } from './load-edition';

const N = Number(process.env.BENCH_STOCK ?? 50_000);
const send = (m: unknown) => process.send?.(m);

const dir = mkdtempSync(join(tmpdir(), 'sw-bench-load-'));
const env = loadEnv({
  NODE_ENV: 'production',
  DATA_DIR: dir,
  LOG_LEVEL: 'warn',
  AUTH_SECRET: 'bench-secret-bench-secret-bench-secret-01',
  PUBLIC_URL: 'http://localhost:3000',
  JOB_WORKERS: process.env.JOB_WORKERS ?? '2',
});
const db = openDatabase(join(dir, 'squarewright.db'));
// the stock list's reader thread, as the server has it (server/bootstrap.ts); BENCH_NO_STOCK_READER=1: without
const stockReader = process.env.BENCH_NO_STOCK_READER === '1' ? null : new StockReader(join(dir, 'squarewright.db'));
const deps = buildDeps({ stockReader, env, db, demo: false, secret: env.AUTH_SECRET ?? '', smtp: { url: 'smtp://127.0.0.1:9', localFake: true }, signInLimit: { window: 60, max: 1000 } });
await deps.jobs.ready();
const t0 = Date.now();
const seeded = seedBulkStock(deps, N);
const seedMs = Date.now() - t0;
for (const [email, role] of [['bench-editor@test.squarewright.test', 'editor'], ['bench-setter@test.squarewright.test', 'setter']] as const) {
  await deps.auth.api.createUser({ body: { email, password: 'bench-password-123', name: `Bench ${role}`, role } });
}
const app = createApp(deps);
// the server's own view of each request: from its arrival in JavaScript to the last byte handed
// to the socket (what the load generator measures beyond this is queueing before the request
// was read, in the kernel and in the generator itself)
let inServer: number[] = [];
const server = http.createServer((req, res) => {
  const t0 = performance.now();
  // the driven routes only (not the export, the upload or the run being started)
  if (req.method === 'GET' && !req.url?.startsWith('/api/stock/export')) res.on('finish', () => inServer.push(performance.now() - t0));
  app(req, res);
});
server.keepAliveTimeout = 120_000;
await new Promise<void>((r) => server.listen(0, '127.0.0.1', () => r()));
// the renderer loaded on a job thread first, as the production server does a few seconds after start
// the edition's data made once (a proof route reads it from the database; not measured here)
const edition = benchEdition();
await renderOnWorker(deps.jobs, edition, { stamp: 'PROOF', proofVersion: 1 });

let cpu = process.cpuUsage();
let elu = performance.eventLoopUtilization();
let at = performance.now();
// how late the event loop ran its timers: one long synchronous piece of work shows as a high max
const delay = monitorEventLoopDelay({ resolution: 10 });
delay.enable();

process.on('message', (m: { type: string }) => {
  void (async () => {
    if (m.type === 'mark') {
      const c = process.cpuUsage(cpu);
      const e = performance.eventLoopUtilization(elu);
      const now = performance.now();
      const sorted = inServer.sort((a, b) => a - b);
      const pct = (p: number) => (sorted.length ? sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)]! : NaN);
      send({ type: 'usage', cpuMs: (c.user + c.system) / 1000, mainBusyMs: e.active, wallMs: now - at, loopP99Ms: delay.percentile(99) / 1e6, loopMaxMs: delay.max / 1e6, serverP95Ms: pct(95), serverP99Ms: pct(99), serverMaxMs: sorted[sorted.length - 1] ?? NaN });
      inServer = [];
      delay.reset();
      cpu = process.cpuUsage();
      elu = performance.eventLoopUtilization();
      at = now;
    } else if (m.type === 'render') {
      const s = performance.now();
      const r = await renderOnWorker(deps.jobs, edition, { stamp: 'PROOF', proofVersion: 1 });
      send({ type: 'rendered', ms: performance.now() - s, pages: r.pages, bytes: r.pdf.length });
    } else if (m.type === 'jobs') {
      send({ type: 'jobs', jobs: deps.jobs.list(undefined, 20).map((j) => ({ id: j.id, kind: j.kind, state: j.state, progress: j.progress })) });
    } else if (m.type === 'stop') {
      for (const id of deps.jobs.active()) deps.jobs.cancel(id);
      await deps.jobs.close();
      await stockReader?.close();
      await new Promise<void>((r) => server.close(() => r()));
      server.closeAllConnections();
      await deps.mail.stop();
      closeDatabase(db);
      rmSync(dir, { recursive: true, force: true });
      process.exit(0);
    }
  })().catch((e: unknown) => {
    console.error(e);
    process.exit(1);
  });
});

send({ type: 'ready', port: (server.address() as AddressInfo).port, seeded, seedMs, mode: deps.jobs.mode });
