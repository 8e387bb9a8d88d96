import { and, asc, count, desc, eq, ne, sql, type SQL } from 'drizzle-orm';
import { connectionOf, prepared } from '../../platform/db/statements';
import type { SessionUser } from '../../../shared/contracts/auth';
import {
  type PuzzleCreate,
  type PuzzleDetail,
  type PuzzleJob,
  type PuzzleLevel,
  type PuzzleList,
  type PuzzleListQuery,
  type PuzzlePatch,
  type PuzzleStarted,
  type PuzzleStatus,
  type PuzzleSummary,
  type SquareRef,
} from '../../../shared/contracts/puzzles';
import { inputHash, isCertificateCurrent, notToScaleRects, PUZZLE_ENGINE_VERSION } from '../../../shared/puzzle/index';
import type { Tiling } from '../../../shared/tiling/index';
import type { Db, DbOrTx } from '../../platform/db/client';
import { puzzle } from './schema';
import { stock } from '../stock/index';
import { Conflict, NotFound, Unprocessable } from '../../platform/http/errors';
import { issuesText } from '../../platform/db/stored-json';
import { certificateInputOf, DEFAULT_LEVEL, nodeSha256, PUZZLE_JOB_KIND, puzzleJobParamsSchema, puzzleJobSummarySchema, type Placed, type PuzzleJobInput, type PuzzleJobParams, type PuzzleJobSummary } from './rules';
import { certificateOf, givensOf, lastRecheckOf, levelOf, levelText, notesOf, secondOf, startersOf, stepsOf, type StoredRecheck } from './stored';
import { defineJobSink, type JobRecord, type Jobs } from '../../platform/jobs/port';
import type { PuzzleForPrint, PuzzleSource } from '../editions/ports';
import type { StockPort, StockUsage } from '../stock/ports';
import type { EditionUsage } from './ports';

// Puzzles: made from a stock tiling, proved in the worker pool (job kind 'puzzle-prove'),
// stored with the certificate of their latest proof. Every change bumps the revision and
// starts a new proof; a job's result is stored only if the puzzle is still at the revision
// it proved. A puzzle is printable only while its certificate is current: verdict unique,
// issued by the engine version in use, for exactly the puzzle as it is now (input hash).

/** Time budget of one puzzle job in the pool [common practice: bound every background job]. */
const JOB_BUDGET_MS = 3 * 60_000;

type PuzzleRow = typeof puzzle.$inferSelect;

/** The puzzles' store: its own table, the stock and the editions through their ports. */
export type PuzzlesStore = { db: Db; stock: StockPort; editionUsage: EditionUsage };

/** The printed title: an Assembly names its frame (the solver gets it); a Deduction must not give its sizes away. */
export function puzzleTitle(kind: 'assembly' | 'deduction', t: Tiling): string {
  return kind === 'assembly' ? `Assembly ${t.W} \u00d7 ${t.H}, ${t.squares.length} squares` : `Deduction, ${t.squares.length} squares`;
}

/** Editor's square references -> placed sizes of the tiling; 422 naming each bad one. */
function resolveRefs(t: Tiling, refs: SquareRef[], field: string): Placed[] {
  const at = new Map(t.squares.map((q) => [`${q.x},${q.y}`, q.s]));
  const bad: { path: string; message: string }[] = [];
  const seen = new Set<string>();
  const out: Placed[] = [];
  refs.forEach((r, i) => {
    const k = `${r.x},${r.y}`;
    const s = at.get(k);
    if (s === undefined) bad.push({ path: `body.${field}.${i}`, message: `no square of the tiling has its corner at (${r.x}, ${r.y})` });
    else if (seen.has(k)) bad.push({ path: `body.${field}.${i}`, message: `the square at (${r.x}, ${r.y}) is named twice` });
    else { seen.add(k); out.push({ x: r.x, y: r.y, size: s }); }
  });
  if (bad.length > 0) throw new Unprocessable(`${bad.length} ${field === 'givens' ? 'given(s)' : 'starter piece(s)'} do not name a square of the tiling.`, bad);
  return out;
}

function currentInputHash(kind: 'assembly' | 'deduction', tiling: Tiling, level: PuzzleLevel | null, showFrame: boolean, starters: Placed[], givens: Placed[]): string {
  return inputHash(certificateInputOf({ kind, tiling, level: level ?? DEFAULT_LEVEL, showFrame }, starters, givens), nodeSha256);
}

// ---- the job and its result ------------------------------------------------------------

/**
 * A proof of this revision that ends without a result (only while it is still the one running:
 * a PATCH cancels the previous proof). A RE-CHECK that ends so demotes nothing: the puzzle goes
 * back to its certificate's verdict (the certificate in force stays) and the unfinished attempt
 * is recorded beside it (recheckJson.unfinished).
 */
function endProof(db: DbOrTx, puzzleId: number, revision: number, status: 'cancelled' | 'failed', why?: string, task?: PuzzleJobParams['task'], jobState?: 'failed' | 'cancelled' | 'interrupted'): void {
  const current = and(eq(puzzle.id, puzzleId), eq(puzzle.revision, revision), eq(puzzle.status, 'proving'));
  if (task === 'recheck') {
    const r = db.select({ id: puzzle.id, certificateJson: puzzle.certificateJson, recheckJson: puzzle.recheckJson }).from(puzzle).where(current).get();
    const cert = r ? certificateOf(r) : null;
    if (r && cert) {
      const previous = lastRecheckOf(r) ?? {};
      const recheck: StoredRecheck = { ...previous, unfinished: { state: jobState ?? status, at: new Date().toISOString() } };
      db.update(puzzle).set({ status: cert.verdict, recheckJson: JSON.stringify(recheck), updatedAt: new Date() }).where(current).run();
      return;
    }
  }
  db.update(puzzle)
    .set({ status, updatedAt: new Date(), ...(why === undefined ? {} : { notesJson: JSON.stringify([why]) }) })
    .where(current)
    .run();
}

/**
 * The job's sink (in the job's final transaction): its summary is parsed before anything is
 * stored. A summary that does not parse fails the proof, stores none of it and says why in
 * the puzzle's notes; a cancelled job marks only its own revision cancelled.
 */
export function finishProof(tx: DbOrTx, puzzleId: number, revision: number, summary: unknown, state: 'done' | 'cancelled', task?: PuzzleJobParams['task']): void {
  if (state === 'cancelled' || summary === null) {
    endProof(tx, puzzleId, revision, 'cancelled', undefined, task, 'cancelled');
    return;
  }
  const parsed = puzzleJobSummarySchema.safeParse(summary);
  if (parsed.success) {
    storeResult(tx, puzzleId, parsed.data);
    return;
  }
  const issues = issuesText(parsed.error);
  endProof(tx, puzzleId, revision, 'failed', `the proof's result was refused and nothing of it was stored (${issues})`, task, 'failed');
}

/** Store a finished proof (in the job's final transaction); ignored when the puzzle changed since. */
export function storeResult(tx: DbOrTx, puzzleId: number, s: PuzzleJobSummary, at: Date = new Date()): void {
  const row = tx.select({ revision: puzzle.revision, kind: puzzle.kind }).from(puzzle).where(eq(puzzle.id, puzzleId)).get();
  if (!row || row.revision !== s.revision) return;
  const cert = s.certificate;
  const set: Partial<typeof puzzle.$inferInsert> = { status: cert.verdict, updatedAt: at };
  if (s.task === 'recheck' && s.recheck) {
    set.recheckJson = JSON.stringify({ ...s.recheck, at: at.toISOString() });
    // it holds: the stored certificate stays; the status goes back to its verdict
    if (s.recheck.holds) { tx.update(puzzle).set(set).where(eq(puzzle.id, puzzleId)).run(); return; }
  }
  Object.assign(set, {
    certificateJson: JSON.stringify(cert),
    certInputHash: cert.inputHash,
    certEngineVersion: cert.engineVersion,
    inputHash: cert.inputHash,
    startersJson: JSON.stringify(s.starters),
    givensJson: JSON.stringify(s.givens),
    stepsJson: JSON.stringify(s.steps),
    // a grade only means something for a puzzle with one solution
    grade: cert.verdict === 'unique' ? s.grade : null,
    level: row.kind === 'deduction' ? levelText(s.level ?? DEFAULT_LEVEL) : null,
    secondJson: s.second ? JSON.stringify(s.second) : null,
    notesJson: JSON.stringify(s.notes),
  });
  tx.update(puzzle).set(set).where(eq(puzzle.id, puzzleId)).run();
}

/**
 * The server half of the proof job (wired in server/compose.ts): its final state is stored on
 * the puzzle in the job's final transaction; a failed or interrupted job leaves no result and
 * says so on the puzzle. A proof is not run again as such (its input is the puzzle as it was):
 * the editor proves again.
 */
export const puzzleProofSink = defineJobSink({
  kind: PUZZLE_JOB_KIND,
  retryable: false,
  onFinish(summary, tx, state, job) {
    const p = puzzleJobParamsSchema.parse(job.params);
    if (state === 'done' || state === 'cancelled') finishProof(tx, p.puzzleId, p.revision, summary, state, p.task);
    else endProof(tx, p.puzzleId, p.revision, 'failed', undefined, p.task, state === 'interrupted' ? 'interrupted' : 'failed');
  },
});

function submitJob(db: Db, runner: Jobs, puzzleId: number, revision: number, task: PuzzleJobParams['task'], input: PuzzleJobInput, userId: string | null): string {
  const params: PuzzleJobParams = { puzzleId, revision, task };
  const jobId = runner.submit({ kind: PUZZLE_JOB_KIND, params, input, createdBy: userId, budgetMs: JOB_BUDGET_MS });
  db.update(puzzle).set({ jobId }).where(eq(puzzle.id, puzzleId)).run();
  return jobId;
}

/** The job's input for a stored puzzle (overrides: what a PATCH changes). */
function jobInputOf(r: PuzzleRow, tiling: Tiling, overrides: Partial<PuzzleJobInput> = {}): PuzzleJobInput {
  return { kind: r.kind, tiling, level: levelOf(r), showFrame: r.showFrame, starters: startersOf(r), givens: givensOf(r), grade: null, seed: 1, ...overrides };
}

// ---- commands ---------------------------------------------------------------------------

export function createPuzzle(deps: PuzzlesStore, runner: Jobs, who: SessionUser, body: PuzzleCreate): PuzzleStarted {
  const { db } = deps;
  const found = db.select({ id: stock.id }).from(stock).where(eq(stock.id, body.stockId)).get();
  if (!found) throw new Unprocessable(`There is no stock tiling ${body.stockId}.`, [{ path: 'body.stockId', message: `no stock tiling ${body.stockId}` }]);
  const { tiling } = deps.stock.tiling(db, body.stockId);
  const starters = body.starters ? resolveRefs(tiling, body.starters, 'starters') : null;
  const givens = body.givens ? resolveRefs(tiling, body.givens, 'givens') : null;
  const level: PuzzleLevel | null = body.kind === 'deduction' ? (body.level ?? null) : null;
  const showFrame = body.showFrame ?? false;
  const hash = starters !== null || givens !== null ? currentInputHash(body.kind, tiling, level, showFrame, starters ?? [], givens ?? []) : '';
  const id = db.transaction((tx) => {
    const row = tx
      .insert(puzzle)
      .values({
        stockId: body.stockId, kind: body.kind, title: puzzleTitle(body.kind, tiling), status: 'proving',
        level: levelText(level), showFrame,
        startersJson: JSON.stringify(starters ?? []), givensJson: JSON.stringify(givens ?? []),
        inputHash: hash, createdBy: who.id,
      })
      .returning({ id: puzzle.id })
      .get();
    deps.stock.markUsed(tx, body.stockId);
    return row.id;
  });
  const input: PuzzleJobInput = { kind: body.kind, tiling, level, showFrame, starters, givens, grade: body.grade ?? null, seed: body.seed ?? 1 };
  const jobId = submitJob(db, runner, id, 1, 'make', input, who.id);
  return { id, jobId };
}

function getRow(db: DbOrTx, id: number): PuzzleRow {
  const r = db.select().from(puzzle).where(eq(puzzle.id, id)).get();
  if (!r) throw new NotFound(`No puzzle ${id}.`);
  return r;
}

/** A puzzle in an edition that has gone to proof (or beyond) may not change. */
function lockedBy(deps: PuzzlesStore, id: number): string | null {
  const r = deps.editionUsage.usesOf(deps.db, [id]).find((u) => u.state !== 'draft');
  return r ? `${r.publicationTitle} No. ${r.number} (${r.state.replace('_', ' ')})` : null;
}

export function patchPuzzle(deps: PuzzlesStore, runner: Jobs, who: SessionUser, id: number, body: PuzzlePatch): PuzzleStarted {
  const { db } = deps;
  const r = getRow(db, id);
  const locked = lockedBy(deps, id);
  if (locked) throw new Conflict(`Puzzle ${id} is in ${locked}; it can no longer change.`);
  if (r.kind === 'assembly' && (body.givens !== undefined || body.level !== undefined || body.showFrame !== undefined)) {
    throw new Unprocessable('An Assembly puzzle has starter pieces only.', [{ path: body.givens !== undefined ? 'body.givens' : 'body.level', message: 'not for an Assembly puzzle' }]);
  }
  if (r.kind === 'deduction' && body.starters !== undefined) throw new Unprocessable('A Deduction puzzle has givens, not starter pieces.', [{ path: 'body.starters', message: 'not for a Deduction puzzle' }]);
  const { tiling } = deps.stock.tiling(db, r.stockId);
  const starters = body.starters ? resolveRefs(tiling, body.starters, 'starters') : startersOf(r);
  const givens = body.givens ? resolveRefs(tiling, body.givens, 'givens') : givensOf(r);
  const level = r.kind === 'deduction' ? (body.level ?? levelOf(r) ?? DEFAULT_LEVEL) : null;
  const showFrame = body.showFrame ?? r.showFrame;
  const revision = r.revision + 1;
  const propose = body.propose === true;
  // when the engine proposes, the input is known only once it has chosen (stored with the result)
  const hash = propose ? '' : currentInputHash(r.kind, tiling, level, showFrame, starters, givens);
  if (r.jobId) runner.cancel(r.jobId);
  db.update(puzzle)
    .set({
      revision, status: 'proving', inputHash: hash, startersJson: JSON.stringify(starters), givensJson: JSON.stringify(givens),
      level: levelText(level), showFrame, secondJson: null, recheckJson: null, updatedAt: new Date(),
    })
    .where(eq(puzzle.id, id))
    .run();
  const input = jobInputOf(r, tiling, { level, showFrame, ...(propose ? { starters: null, givens: null } : { starters, givens }) });
  return { id, jobId: submitJob(db, runner, id, revision, propose ? 'make' : 'prove', input, who.id) };
}

export function recheckPuzzle(deps: PuzzlesStore, runner: Jobs, who: SessionUser, id: number): PuzzleStarted {
  const { db } = deps;
  const r = getRow(db, id);
  if (r.status === 'proving') throw new Conflict(`Puzzle ${id} is being proved; re-check it when the proof is done.`);
  const cert = certificateOf(r);
  if (!cert) throw new Conflict(`Puzzle ${id} has no certificate to re-check.`);
  const { tiling } = deps.stock.tiling(db, r.stockId);
  db.update(puzzle).set({ status: 'proving', updatedAt: new Date() }).where(eq(puzzle.id, id)).run();
  return { id, jobId: submitJob(db, runner, id, r.revision, 'recheck', jobInputOf(r, tiling, { certificate: cert }), who.id) };
}

export function cancelPuzzleJob(db: Db, runner: Jobs, id: number): void {
  const r = getRow(db, id);
  if (r.status !== 'proving' || !r.jobId) throw new Conflict(`Puzzle ${id} has no proof running.`);
  runner.cancel(r.jobId);
}

// ---- reading ------------------------------------------------------------------------------

const verdictWords: Record<string, string> = {
  multiple: 'the pieces fit together in more than one way: not unique',
  none: 'the pieces cannot fill the frame',
  undecided: 'the search ran out of time before it could decide',
  stuck: 'unique by rank, but steps at this level do not reach every size',
  'not-unique': 'the givens leave some sizes free: not unique',
};

/** Why the puzzle's certificate does not make it printable (empty: it does). */
export function staleReasons(r: Pick<PuzzleRow, 'id' | 'certificateJson' | 'inputHash' | 'status'>): string[] {
  const cert = certificateOf(r);
  if (!cert) return [r.status === 'proving' ? 'the first proof is still running' : 'there is no certificate'];
  const out: string[] = [];
  if (cert.verdict !== 'unique') out.push(verdictWords[cert.verdict] ?? `the verdict is ${cert.verdict}`);
  if (!isCertificateCurrent(cert)) out.push(`issued by engine ${cert.engineVersion}; the engine in use is ${PUZZLE_ENGINE_VERSION}`);
  if (cert.inputHash !== r.inputHash) out.push('the puzzle changed since the certificate was issued (input hash differs)');
  if (r.status === 'proving') out.push('a new proof is running');
  return out;
}

function usesOf(deps: PuzzlesStore, ids: number[]): Map<number, PuzzleSummary['usedIn']> {
  const m = new Map<number, PuzzleSummary['usedIn']>();
  if (ids.length === 0) return m;
  for (const x of deps.editionUsage.usesOf(deps.db, ids)) {
    const list = m.get(x.puzzleId) ?? [];
    list.push({ editionId: x.editionId, publicationTitle: x.publicationTitle, number: x.number, editionDate: x.editionDate, state: x.state });
    m.set(x.puzzleId, list);
  }
  return m;
}

type SummaryRow = Pick<PuzzleRow, 'id' | 'kind' | 'title' | 'status' | 'grade' | 'level' | 'stockId' | 'certificateJson' | 'inputHash' | 'createdAt' | 'updatedAt' | 'jobId'> & { tilingKey: string; order: number; width: number; height: number };

/**
 * The status to show: a proof whose job failed or was interrupted (server restart) is 'failed';
 * a re-check that ended so is the certificate's verdict again (a re-check never demotes).
 */
function effectiveStatus(r: Pick<PuzzleRow, 'id' | 'status' | 'certificateJson'>, job: JobRecord | null): PuzzleStatus {
  if (r.status === 'proving' && job && (job.state === 'failed' || job.state === 'interrupted' || job.state === 'cancelled')) {
    const task = puzzleJobParamsSchema.safeParse(job.params);
    const cert = task.success && task.data.task === 'recheck' ? certificateOf(r) : null;
    return cert ? cert.verdict : job.state === 'cancelled' ? 'cancelled' : 'failed';
  }
  return r.status;
}

function toSummary(r: SummaryRow, used: PuzzleSummary['usedIn'], job: JobRecord | null): PuzzleSummary {
  return {
    id: r.id, kind: r.kind, title: r.title, status: effectiveStatus(r, job), grade: r.grade, level: levelOf(r), stockId: r.stockId,
    tilingKey: r.tilingKey, order: r.order, width: r.width, height: r.height,
    certificateCurrent: staleReasons(r).length === 0, usedIn: used,
    createdAt: r.createdAt.toISOString(), updatedAt: r.updatedAt.toISOString(),
  };
}

function jobOf(job: JobRecord | null): PuzzleJob | null {
  if (!job) return null;
  const p = job.progress;
  return { id: job.id, state: job.state, phase: p?.phase ?? null, done: p?.done ?? null, total: p?.total ?? null, elapsedMs: p?.elapsedMs ?? null, error: job.error };
}

const summaryColumns = {
  id: puzzle.id, kind: puzzle.kind, title: puzzle.title, status: puzzle.status, grade: puzzle.grade, level: puzzle.level, stockId: puzzle.stockId,
  certificateJson: puzzle.certificateJson, inputHash: puzzle.inputHash, createdAt: puzzle.createdAt, updatedAt: puzzle.updatedAt, jobId: puzzle.jobId,
  tilingKey: stock.canonicalKey, order: stock.order, width: stock.width, height: stock.height,
};

/** A puzzle's row with the facts of its stock tiling (undefined: there is no such puzzle). */
function rowWithStock(db: DbOrTx, id: number) {
  return db
    .select({ row: puzzle, tilingKey: stock.canonicalKey, order: stock.order, width: stock.width, height: stock.height, setterId: stock.setterId })
    .from(puzzle)
    .innerJoin(stock, eq(stock.id, puzzle.stockId))
    .where(eq(puzzle.id, id))
    .get();
}

export function getPuzzle(deps: PuzzlesStore, runner: Jobs, id: number): PuzzleDetail {
  const { db } = deps;
  const found = rowWithStock(db, id);
  if (!found) throw new NotFound(`No puzzle ${id}.`);
  const { row: r, ...facts } = found;
  const { tiling } = deps.stock.tiling(db, r.stockId);
  const job = r.jobId ? runner.get(r.jobId) : null;
  return {
    ...toSummary({ ...r, ...facts }, usesOf(deps, [id]).get(id) ?? [], job),
    showFrame: r.showFrame,
    tiling,
    starters: startersOf(r),
    givens: givensOf(r),
    steps: stepsOf(r),
    certificate: certificateOf(r),
    staleReasons: staleReasons(r),
    second: secondOf(r),
    notes: notesOf(r),
    ...recheckView(lastRecheckOf(r)),
    job: jobOf(job),
  };
}

/** The stored re-checks as the detail shows them: the last finished one, and an unfinished attempt after it. */
function recheckView(stored: StoredRecheck | null): Pick<PuzzleDetail, 'lastRecheck' | 'lastUnfinishedRecheck'> {
  const finished = stored && stored.holds !== undefined && stored.at !== undefined ? { holds: stored.holds, reasons: stored.reasons ?? [], at: stored.at } : null;
  return { lastRecheck: finished, lastUnfinishedRecheck: stored?.unfinished ?? null };
}

/**
 * Printable = what staleReasons calls current, in SQL: a certificate with the verdict unique,
 * of the engine in use, for the puzzle as it is now, and no proof running. (Not `status =
 * 'unique'`: a proof that failed or was cancelled after an unchanged input leaves the
 * certificate in force, and staleReasons agrees.)
 */
const printableWhere = (): SQL =>
  and(
    sql`json_extract(${puzzle.certificateJson}, '$.verdict') = 'unique'`,
    ne(puzzle.status, 'proving'),
    eq(puzzle.certEngineVersion, PUZZLE_ENGINE_VERSION),
    sql`${puzzle.certInputHash} = ${puzzle.inputHash}`,
  )!;

const sortColumns = { createdAt: puzzle.createdAt, updatedAt: puzzle.updatedAt, grade: puzzle.grade, order: stock.order, id: puzzle.id } as const;

export function listPuzzles(deps: PuzzlesStore, runner: Jobs, q: PuzzleListQuery): PuzzleList {
  const { db } = deps;
  const w: SQL[] = [];
  if (q.kind) w.push(eq(puzzle.kind, q.kind));
  if (q.status) w.push(eq(puzzle.status, q.status));
  if (q.grade !== undefined) w.push(eq(puzzle.grade, q.grade));
  if (q.stockId !== undefined) w.push(eq(puzzle.stockId, q.stockId));
  if (q.printable === true) w.push(printableWhere());
  if (q.printable === false) w.push(sql`not (${printableWhere()})`);
  const where = w.length > 0 ? and(...w) : undefined;
  const dir = q.sort.desc ? desc : asc;
  const rows = db
    .select(summaryColumns)
    .from(puzzle)
    .innerJoin(stock, eq(stock.id, puzzle.stockId))
    .where(where)
    .orderBy(dir(sortColumns[q.sort.key]), dir(puzzle.id))
    .limit(q.pageSize)
    .offset((q.page - 1) * q.pageSize)
    .all();
  const total = db.select({ n: count() }).from(puzzle).innerJoin(stock, eq(stock.id, puzzle.stockId)).where(where).get()?.n ?? 0;
  const used = usesOf(deps, rows.map((r) => r.id));
  return { items: rows.map((r) => toSummary(r, used.get(r.id) ?? [], r.status === 'proving' && r.jobId ? runner.get(r.jobId) : null)), total, page: q.page, pageSize: q.pageSize };
}

// ---- print's view and the stock's history ---------------------------------------------

export function getPuzzleForPrint(stockPort: StockPort, db: DbOrTx, puzzleId: string): PuzzleForPrint | null {
  if (!/^\d{1,15}$/.test(puzzleId)) return null;
  const r = rowWithStock(db, Number(puzzleId));
  if (!r) return null;
  const p = r.row;
  const { tiling } = stockPort.tiling(db, p.stockId);
  const cert = certificateOf(p);
  const stale = staleReasons(p);
  const certificate = cert ? { current: stale.length === 0, summary: stale.length === 0 ? `unique (${cert.engineVersion}, ${cert.createdAt.slice(0, 10)}, input ${cert.inputHash.slice(0, 12)})` : stale.join('; ') } : null;
  const base = { id: String(p.id), kind: p.kind, title: p.title, grade: p.grade ?? 3, tilingKey: r.tilingKey, setterId: r.setterId, certificate };
  const solution = { tiling: { W: tiling.W, H: tiling.H, squares: tiling.squares.map((q) => ({ x: q.x, y: q.y, s: q.s })) } };
  if (p.kind === 'assembly') {
    return { ...base, assembly: { frame: { W: tiling.W, H: tiling.H }, pieces: tiling.squares.map((q) => q.s).sort((a, b) => b - a), starters: startersOf(p) }, solution };
  }
  const layout = notToScaleRects(tiling);
  const index = new Map(tiling.squares.map((q, i) => [`${q.x},${q.y}`, i]));
  const givens = givensOf(p).flatMap((g) => {
    const i = index.get(`${g.x},${g.y}`);
    return i === undefined ? [] : [{ rect: i, size: g.size }];
  });
  const steps = stepsOf(p).map((s) => s.text);
  return { ...base, deduction: { layout, givens }, solution: { ...solution, steps } };
}

export function listPrintablePuzzleIds(db: DbOrTx): string[] {
  return db.select({ id: puzzle.id }).from(puzzle).where(printableWhere()).orderBy(desc(puzzle.createdAt), desc(puzzle.id)).all().map((r) => String(r.id));
}

/** Print's view of the puzzle store (PuzzleSource in ../editions/ports.ts). */
export function createPuzzleSource(stockPort: StockPort): PuzzleSource {
  return { getPuzzleForPrint: (db, puzzleId) => getPuzzleForPrint(stockPort, db, puzzleId), listPrintablePuzzleIds };
}

/** The stock's history and summary (StockUsage in ../stock/ports.ts): puzzles made from a tiling, the editions they went into, counts by grade. */
export function createStockUsage(editionUsage: EditionUsage): StockUsage {
  return {
    // prepared statements: these run for every stock detail (issue 14)
    puzzlesFor: (db, stockId) =>
      (prepared(connectionOf(db), 'select id, kind, grade, created_at as createdAt from puzzle where stock_id = ? order by created_at asc, id asc').all(stockId) as { id: number; kind: 'assembly' | 'deduction'; grade: number | null; createdAt: number }[])
        .map((p) => ({ id: p.id, kind: p.kind, grade: p.grade, createdAt: new Date(p.createdAt).toISOString() })),
    // editions whose slots hold a puzzle made from this tiling, one entry per edition
    editionsFor: (db, stockId) => {
      const ids = prepared(connectionOf(db), 'select id from puzzle where stock_id = ?').pluck().all(stockId) as number[];
      if (ids.length === 0) return [];
      const seen = new Set<string>();
      return editionUsage
        .usesOf(db, ids)
        .filter((u) => !seen.has(u.editionId) && seen.add(u.editionId))
        .map((u) => ({ id: u.editionId, title: `${u.publicationTitle} No. ${u.number}`, date: u.editionDate }));
    },
    gradeCounts: (db) =>
      db.select({ grade: puzzle.grade, count: count() }).from(puzzle).where(sql`${puzzle.grade} is not null`).groupBy(puzzle.grade).orderBy(asc(puzzle.grade)).all()
        .map((g) => ({ grade: g.grade ?? 0, count: g.count })),
  };
}
