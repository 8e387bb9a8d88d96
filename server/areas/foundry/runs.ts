import { count, desc, eq, sql } from 'drizzle-orm';
import type { Run, RunList, RunRequest, RunResults } from '../../../shared/contracts/foundry';
import { runRequestSchema, runSummarySchema } from '../../../shared/contracts/foundry';
import type { Db } from '../../platform/db/client';
import type { DbOrTx } from '../../platform/db/client';
import { connectionOf, prepared } from '../../platform/db/statements';
import type { EventSink } from '../../platform/events';
import { Conflict, NotFound } from '../../platform/http/errors';
import { defineJobSink, type JobRecord, type Jobs, type JobSink } from '../../platform/jobs/port';
import type { StockPort } from '../stock/ports';
import { foundryItemSchema, type FoundryInput } from './run-job';
import { foundryResult } from './schema';

// Foundry runs: a run is a job of kind 'foundry-run' (an exhaustive run of order 16 or more in
// SHARDS parts that workers take at once). Results stream back from the workers and the sink
// stores them, in small transactions, into the stock (provenance 'foundry', with the run's
// parameters) and into foundry_result (what this run found; idempotent by run and key).

export const FOUNDRY_KIND = 'foundry-run';
/** Parts of an exhaustive run of order SHARD_FROM or more (each builds the graphs, ~6% of the run, and solves a quarter). */
export const SHARDS = 4;
const SHARD_FROM = 16;
/** Time budgets per run [common practice: bound every background job]. */
const BUDGET_MS = { exhaustive: 30 * 60_000, random: 10 * 60_000, joining: 5 * 60_000 } as const;

/** Items streamed back from the worker are parsed (a malformed one fails the batch, naming the run). */
function parseItem(runId: string, raw: unknown) {
  const r = foundryItemSchema.safeParse(raw);
  if (!r.success) throw new Error(`foundry run ${runId}: a result from the worker is malformed: ${r.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('; ')}`);
  return r.data;
}

export function storeItems(stock: StockPort, tx: DbOrTx, runId: string, params: RunRequest, items: unknown[]): void {
  for (const raw of items) {
    const it = parseItem(runId, raw);
    // exhaustive runs list every simple tiling; only the perfect ones go into the stock unless the run asked for imperfect ones too (issue 16)
    const toStock = it.perfect || params.mode !== 'exhaustive' || params.includeImperfect;
    const s = toStock ? stock.add(tx, { tiling: it.tiling, provenance: 'foundry', params: { runId, ...params, origin: it.origin }, background: true }) : { id: null, created: false };
    // a prepared statement, not Drizzle: this runs once per result on the request thread (issue 14)
    prepared(connectionOf(tx), insertResultSql).run(
      runId,
      it.key,
      it.code,
      it.order,
      it.width,
      it.height,
      it.perfect ? 1 : 0,
      it.simple ? 1 : 0,
      it.square ? 1 : 0,
      it.maxSize,
      JSON.stringify({ ...it.origin, addedToStock: s.created }),
      s.id,
    );
  }
}

/** One foundry_result row (created_at takes its default); a key the run already stored is kept as it is. */
const insertResultSql =
  'insert into foundry_result (job_id, canonical_key, code, "order", width, height, perfect, simple, square, max_size, origin, stock_id) ' +
  'values (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?) on conflict do nothing';

function inputFor(stock: StockPort, db: Db, params: RunRequest): FoundryInput {
  if (params.mode === 'random') return { knownKeys: stock.allKeys(db) };
  if (params.mode === 'joining') return { parts: stock.perfectRectangles(db, 50_000).map((r) => ({ id: String(r.id), tiling: r.tiling })) };
  return {};
}

const SUMMED = ['graphs', 'pairs', 'zeroCurrent', 'simplePerfect', 'simpleImperfect', 'compound', 'squares'] as const;

/** An exhaustive run's summary from its shards' (their counts add up; ms is the longest shard's). */
export function mergeShardSummaries(parts: unknown[]): unknown {
  const rows = parts.filter((p): p is Record<string, unknown> => p !== null && typeof p === 'object');
  if (rows.length <= 1) return rows[0] ?? null;
  const out: Record<string, unknown> = { ...rows[0], shards: rows.length };
  for (const k of SUMMED) out[k] = rows.reduce((a, r) => a + (typeof r[k] === 'number' ? (r[k] as number) : 0), 0);
  out.ms = Math.max(...rows.map((r) => (typeof r.ms === 'number' ? r.ms : 0)));
  out.stopped = rows.some((r) => r.stopped === true);
  return out;
}

/** The server half of a foundry run (wired in server/compose.ts): its input, its shards, where its results go. */
/** The foundry run's server half; `events` gets foundry.run_finished in the transaction that ends the run. */
export function foundryRunSink(stock: StockPort, events?: EventSink): JobSink {
  const paramsOf = (raw: unknown) => runRequestSchema.parse(raw);
  return defineJobSink({
    kind: FOUNDRY_KIND,
    lane: 'bulk',
    parts: (raw) => {
      const p = paramsOf(raw);
      return p.mode === 'exhaustive' && p.order >= SHARD_FROM ? SHARDS : 1;
    },
    input: (raw, db) => inputFor(stock, db, paramsOf(raw)),
    onResults: (items, tx, job) => storeItems(stock, tx, job.id, paramsOf(job.params), items),
    summarize: mergeShardSummaries,
    onFinish: (_summary, tx, state, job) => {
      // an interrupted run goes on after a restart: it has not finished
      if (!events || state === 'interrupted') return;
      const c = counts(tx, job.id);
      events.emit(tx, 'foundry.run_finished', { run: { id: job.id, mode: paramsOf(job.params).mode, state, found: c.found, addedToStock: c.added } });
    },
  });
}

export function startRun(deps: { db: Db; jobs: Jobs }, request: RunRequest, userId: string | null): Run {
  const params = runRequestSchema.parse(request);
  const id = deps.jobs.submit({ kind: FOUNDRY_KIND, params, createdBy: userId, budgetMs: BUDGET_MS[params.mode] });
  return getRun(deps, id);
}

function counts(db: DbOrTx, id: string): { found: number; perfect: number; added: number } {
  const r = db
    .select({
      found: count(),
      perfect: sql<number>`coalesce(sum(case when ${foundryResult.perfect} then 1 else 0 end), 0)`,
      added: sql<number>`coalesce(sum(case when json_extract(${foundryResult.origin}, '$.addedToStock') then 1 else 0 end), 0)`,
    })
    .from(foundryResult)
    .where(eq(foundryResult.jobId, id))
    .get();
  return { found: r?.found ?? 0, perfect: Number(r?.perfect ?? 0), added: Number(r?.added ?? 0) };
}

function toRun(db: Db, r: JobRecord): Run {
  const c = counts(db, r.id);
  const params = runRequestSchema.safeParse(r.params);
  return {
    id: r.id,
    state: r.state,
    params: params.success ? params.data : { mode: 'joining' },
    progress: r.progress ?? null,
    summary: runSummarySchema.nullable().parse(r.summary ?? null),
    error: r.error,
    found: c.found,
    foundPerfect: c.perfect,
    foundImperfect: c.found - c.perfect,
    addedToStock: c.added,
    retry: r.retry,
    createdAt: r.createdAt.toISOString(),
    startedAt: r.startedAt?.toISOString() ?? null,
    finishedAt: r.finishedAt?.toISOString() ?? null,
  };
}

type RunDeps = { db: Db; jobs: Jobs };

export function getRun(deps: RunDeps, id: string): Run {
  const r = deps.jobs.get(id);
  if (!r || r.kind !== FOUNDRY_KIND) throw new NotFound(`foundry run ${id} does not exist`);
  return toRun(deps.db, r);
}

export function listRuns(deps: RunDeps): RunList {
  return { items: deps.jobs.list(FOUNDRY_KIND, 100).map((r) => toRun(deps.db, r)) };
}

/** Cancel: the search stops within 2 s and nothing more is stored; the run says how much it stored. */
export function cancelRun(deps: RunDeps, id: string): Run {
  const r = getRun(deps, id);
  if (r.state !== 'queued' && r.state !== 'running') throw new Conflict(`foundry run ${id} is ${r.state}, not queued or running`);
  deps.jobs.cancel(id);
  return getRun(deps, id);
}

/** An interrupted, failed or cancelled run again: 'resume' keeps its finished shards, 'restart' starts over. */
export function retryRun(deps: RunDeps, id: string, how: 'resume' | 'restart'): Run {
  const r = getRun(deps, id);
  if (r.state !== 'interrupted' && r.state !== 'failed' && r.state !== 'cancelled') throw new Conflict(`foundry run ${id} is ${r.state}; only an interrupted, failed or cancelled run can run again`);
  deps.jobs.retry(id, how);
  return getRun(deps, id);
}

export function runResults(deps: RunDeps, id: string, page: number, pageSize: number): RunResults {
  const { db } = deps;
  getRun(deps, id);
  const rows = db
    .select()
    .from(foundryResult)
    .where(eq(foundryResult.jobId, id))
    .orderBy(foundryResult.order, foundryResult.maxSize, desc(foundryResult.width))
    .limit(pageSize)
    .offset((page - 1) * pageSize)
    .all();
  const total = db.select({ n: count() }).from(foundryResult).where(eq(foundryResult.jobId, id)).get()?.n ?? 0;
  return {
    total,
    items: rows.map((r) => ({
      code: r.code, canonicalKey: r.canonicalKey, order: r.order, width: r.width, height: r.height,
      perfect: r.perfect, simple: r.simple, square: r.square, maxSize: r.maxSize,
      stockId: r.stockId,
    })),
  };
}

