// Storing bench (`npm run bench -- store`): what one foundry result costs the request thread
// when the job host stores it (issue 14: storing runs there, in slices that yield between
// them). Every distinct simple tiling of order 16 (OEIS A002839 + A002881: 9,016 + 953 = 9,969)
// found by the engine in this process, then stored into a fresh database through the foundry's
// own storeItems in transactions of 200, as the host does: stock row (verification, canonical
// form, duplicate and scaled-copy lookups, insert) and foundry_result row. Prints results/s and
// microseconds a result; the reference is a bare insert of the same rows' codes into a table of
// one text column, measured in the same run (what SQLite itself needs to write a row).
import { mkdtempSync, rmSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { storeItems } from '../server/areas/foundry/runs';
import { buildDeps } from '../server/compose';
import { closeDatabase, openDatabase } from '../server/platform/db/client';
import { loadEnv } from '../server/platform/env';
import { exhaustiveTilings } from '../shared/foundry/index';

const dir = mkdtempSync(join(tmpdir(), 'sw-bench-store-'));
const env = loadEnv({ NODE_ENV: 'production', DATA_DIR: dir, LOG_LEVEL: 'warn', AUTH_SECRET: 'bench-secret-bench-secret-bench-secret-01', PUBLIC_URL: 'http://localhost:3000', JOB_WORKERS: '1' });
const db = openDatabase(join(dir, 'squarewright.db'));
const deps = buildDeps({ env, db, demo: false, secret: env.AUTH_SECRET ?? '', smtp: { url: 'smtp://127.0.0.1:9', localFake: true }, signInLimit: { window: 60, max: 1000 } });
await deps.jobs.ready();

const items: unknown[] = [];
// as the worker sends them: plain data through structured clone
exhaustiveTilings({ order: 16, onFound: (ft) => void items.push(structuredClone({ ...ft, origin: { bench: true } })) });
// a finished order-9 run to store them under (foundry_result rows belong to a job)
const runId = deps.jobs.submit({ kind: 'foundry-run', params: { mode: 'exhaustive', order: 9 }, createdBy: null, budgetMs: 60_000 });
for (let i = 0; i < 600 && deps.jobs.get(runId)?.state !== 'done'; i++) await new Promise((r) => setTimeout(r, 50));
const params = { mode: 'exhaustive' as const, order: 16, squaresOnly: false, includeImperfect: false };
const load0 = loadavg()[0]!;

let t0 = performance.now();
for (let i = 0; i < items.length; i += 200) db.transaction((tx) => storeItems(deps.stock, tx, runId, params, items.slice(i, i + 200)));
const ours = performance.now() - t0;

const raw = db.$client;
raw.exec('create table bench_rows (code text not null)');
const insert = raw.prepare('insert into bench_rows (code) values (?)');
const codes = items.map((x) => (x as { code: string }).code);
t0 = performance.now();
for (let i = 0; i < codes.length; i += 200) raw.transaction(() => { for (const c of codes.slice(i, i + 200)) insert.run(c); })();
const bare = performance.now() - t0;

const us = (ms: number) => ((1000 * ms) / items.length).toFixed(0);
console.log(`\nstore: ${items.length.toLocaleString('en-GB')} order-16 results (A002839 + A002881 = 9,969), transactions of 200, load average ${load0.toFixed(1)}`);
console.log('| what | results/s | us a result | ratio to the bare insert |');
console.log('|---|---|---|---|');
console.log(`| storeItems (stock row + foundry_result row) | ${Math.round((1000 * items.length) / ours).toLocaleString('en-GB')} | ${us(ours)} | ${(ours / bare).toFixed(0)}x |`);
console.log(`| bare insert of the code (reference) | ${Math.round((1000 * items.length) / bare).toLocaleString('en-GB')} | ${us(bare)} | 1x |`);
await deps.jobs.close();
closeDatabase(db);
rmSync(dir, { recursive: true, force: true });
