// The load generator of the load bench (bench/load.ts forks it for each case): autocannon in a
// process of its own, doing nothing else, so its own event loop never delays the answers it
// times (the parent reads the CSV export and sends the upload meanwhile). It answers
//   { type: 'drive', base, cookie, seeded, seconds } -> { type: 'connected' } once every simulated
//   user has started (about a second in), then { type: 'driven', rows, driver }
// where driver is its own event-loop delay (p99, max) and CPU time over the case.
import { monitorEventLoopDelay } from 'node:perf_hooks';
import autocannon from 'autocannon';
import { mulberry32 } from '../shared/tiling/prng';
import { stockListShapes } from './load-shapes';

function percentile(sorted: number[], p: number): number {
  if (sorted.length === 0) return NaN;
  return sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)]!;
}

// a fixed pseudo-random sequence (seed 14) so runs are comparable
const rnd = mulberry32(14);
const filters = stockListShapes.map((shape) => () => shape(rnd));

interface Row { route: string; n: number; p50: number; p95: number; p99: number; max: number; bad: number }

/**
 * 200 requests a second, spread over the second as independent users would send them, for
 * SECONDS; latency of every answer. autocannon's rate limit lets each connection send its
 * whole quota for the second at once, at the same tick for every connection, so one instance
 * with 12 connections at 120/s is a burst of 120 requests at the start of each second (it
 * measured the queue behind that burst: p50 ~30 ms on an idle server answering in 2 ms). So
 * each route is driven by rate/2 autocannon instances of one connection at 2 requests a second,
 * started evenly spread over the first second.
 */
const PER_CONNECTION = 2;
/** autocannon instances started so far: when all are, the parent is told ('connected') */
let connected = 0;
let connectedAt = Infinity;
const slow: string[] = [];
const t0 = performance.now();
async function drive(base: string, cookie: string, seeded: number, SECONDS: number): Promise<Row[]> {
  const routes: [string, number, () => string][] = [
    ['GET /api/stock (filters)', 120, () => filters[Math.floor(rnd() * filters.length)]!()],
    ['GET /api/stock/:id', 60, () => `/api/stock/${1 + Math.floor(rnd() * seeded)}`],
    ['GET /api/health', 20, () => '/api/health'],
  ];
  const users = routes.reduce((n, [, rate]) => n + rate / PER_CONNECTION, 0);
  let started = 0;
  const results = routes.map(([route, rate, path]) => {
    const lat: number[] = [];
    let bad = 0;
    const runs = Array.from({ length: rate / PER_CONNECTION }, () => {
      const delay = (1000 * started++) / users;
      return new Promise<void>((resolve) => setTimeout(resolve, delay)).then(async () => {
        const inst = autocannon({
          url: base,
          connections: 1,
          overallRate: PER_CONNECTION,
          duration: SECONDS,
          timeout: 30,
          headers: { cookie, accept: 'application/json' },
          requests: [{ method: 'GET', setupRequest: (req) => ({ ...req, path: path() }) }],
        });
        if (++connected === users) {
          connectedAt = performance.now();
          process.send?.({ type: 'connected' });
        }
        inst.on('response', (_client: unknown, status: number, _bytes: number, ms: number) => {
          // counted from the first request sent after every simulated user is connected (about a
          // second in): the first requests of new connections wait for the connection itself
          if (performance.now() - ms < connectedAt) return;
          lat.push(ms);
          if (status !== 200) bad++;
          if (process.env.BENCH_SLOW && ms > 100) slow.push(`${((performance.now() - t0) / 1000).toFixed(2)}s ${route} ${ms.toFixed(0)}ms`);
        });
        const r = await inst;
        bad += r.errors + r.timeouts;
      });
    });
    return Promise.all(runs).then((): Row => {
      lat.sort((a, b) => a - b);
      return { route, n: lat.length, p50: percentile(lat, 50), p95: percentile(lat, 95), p99: percentile(lat, 99), max: lat[lat.length - 1] ?? NaN, bad };
    });
  });
  return Promise.all(results);
}


process.on('message', (m: { type: string; base?: string; cookie?: string; seeded?: number; seconds?: number }) => {
  if (m.type === 'stop') process.exit(0);
  if (m.type !== 'drive') return;
  const delay = monitorEventLoopDelay({ resolution: 10 });
  delay.enable();
  const cpu = process.cpuUsage();
  drive(m.base!, m.cookie!, m.seeded!, m.seconds!)
    .then((rows) => {
      delay.disable();
      if (process.env.BENCH_SLOW) console.log(slow.join('\n'));
      const c = process.cpuUsage(cpu);
      process.send?.({ type: 'driven', rows, driver: { loopP99Ms: delay.percentile(99) / 1e6, loopMaxMs: delay.max / 1e6, cpuMs: (c.user + c.system) / 1000 } });
    })
    .catch((e: unknown) => {
      console.error(e);
      process.exit(1);
    });
});
