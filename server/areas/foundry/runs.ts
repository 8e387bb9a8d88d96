import { count, desc, eq, sql } from 'drizzle-orm';
import type { Run, RunList, RunRequest, RunResults } from '../../../shared/contracts/foundry';
import { runRequestSchema, runSummarySchema } from '../../../shared/contracts/foundry';
import type { Db } from '../../platform/db/client';
import type { DbOrTx } from '../../platform/db/client';
import { Conflict, NotFound } from '../../platform/http/errors';
import type { JobRecord, JobRunner } from '../../platform/jobs/runner';
import type { StockPort } from '../stock/ports';
import { foundryItemSchema, type FoundryInput } from './run-job';
import { foundryResult } from './schema';

// Foundry runs: a run is a job of kind 'foundry-run'. Results stream back from the worker and
// go, in one transaction per batch, into the stock (provenance 'foundry', with the run's
// parameters) and into foundry_result (what this run found).

export const FOUNDRY_KIND = 'foundry-run';
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
    const s = stock.add(tx, { tiling: it.tiling, provenance: 'foundry', params: { runId, ...params, origin: it.origin } });
    tx.insert(foundryResult)
      .values({
        jobId: runId,
        canonicalKey: it.key,
        code: it.code,
        order: it.order,
        width: it.width,
        height: it.height,
        perfect: it.perfect,
        simple: it.simple,
        square: it.square,
        maxSize: it.maxSize,
        origin: JSON.stringify({ ...it.origin, addedToStock: s.created }),
        stockId: s.id,
      })
      .onConflictDoNothing()
      .run();
  }
}

function inputFor(stock: StockPort, db: Db, params: RunRequest): FoundryInput {
  if (params.mode === 'random') return { knownKeys: stock.allKeys(db) };
  if (params.mode === 'joining') return { parts: stock.perfectRectangles(db, 50_000).map((r) => ({ id: String(r.id), tiling: r.tiling })) };
  return {};
}

export function startRun(deps: { db: Db; stock: StockPort }, runner: JobRunner, request: RunRequest, userId: string | null): Run {
  const { db } = deps;
  const params = runRequestSchema.parse(request);
  const id = runner.submit({
    kind: FOUNDRY_KIND,
    params,
    input: inputFor(deps.stock, db, params),
    createdBy: userId,
    budgetMs: BUDGET_MS[params.mode],
    lane: 'bulk',
    sink: { onResults: (items, tx) => storeItems(deps.stock, tx, id, params, items) },
  });
  return getRun(db, runner, id);
}

function counts(db: Db, id: string): { found: number; added: number } {
  const r = db
    .select({
      found: count(),
      added: sql<number>`coalesce(sum(case when json_extract(${foundryResult.origin}, '$.addedToStock') then 1 else 0 end), 0)`,
    })
    .from(foundryResult)
    .where(eq(foundryResult.jobId, id))
    .get();
  return { found: r?.found ?? 0, added: Number(r?.added ?? 0) };
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
    addedToStock: c.added,
    createdAt: r.createdAt.toISOString(),
    startedAt: r.startedAt?.toISOString() ?? null,
    finishedAt: r.finishedAt?.toISOString() ?? null,
  };
}

export function getRun(db: Db, runner: JobRunner, id: string): Run {
  const r = runner.get(id);
  if (!r || r.kind !== FOUNDRY_KIND) throw new NotFound(`foundry run ${id} does not exist`);
  return toRun(db, r);
}

export function listRuns(db: Db, runner: JobRunner): RunList {
  return { items: runner.list(FOUNDRY_KIND, 100).map((r) => toRun(db, r)) };
}

export function cancelRun(db: Db, runner: JobRunner, id: string): Run {
  const r = getRun(db, runner, id);
  if (r.state !== 'queued' && r.state !== 'running') throw new Conflict(`foundry run ${id} is ${r.state}, not queued or running`);
  runner.cancel(id);
  return getRun(db, runner, id);
}

export function runResults(db: Db, runner: JobRunner, id: string, page: number, pageSize: number): RunResults {
  getRun(db, runner, id);
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

