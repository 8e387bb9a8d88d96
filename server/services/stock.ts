import { and, asc, count, desc, eq, gt, gte, lte, sql, type SQL } from 'drizzle-orm';
import { canonicalTiling, isSimple, toBouwkamp, verifyTiling, type Tiling } from '../../shared/tiling/index';
import type { Provenance, StockDetail, StockItem, StockList, StockListQuery, StockSummary } from '../../shared/contracts/stock';
import { stockFilterSchema } from '../../shared/contracts/stock';
import type { z } from 'zod';
import type { Statement } from 'better-sqlite3';
import type { Db, DbOrTx } from '../db/client';
import { stock } from '../db/schema/stock';
import { submission } from '../db/schema/submissions';
import { NotFound, Unprocessable } from '../http/errors';
import { classificationOf, smithDrawingOf, squaresToJson, tilingFromJson } from './tiling-check';

// The stock of verified tilings, one row per canonical key. addToStock is the one way in
// (review, foundry, demo seed all call it).

export interface AddToStockInput {
  tiling: Tiling;
  provenance: Provenance;
  setterId?: string | null;
  params?: Record<string, unknown> | null;
  acceptedAt?: Date | null;
}

export interface AddToStockResult {
  id: number;
  /** false when the tiling (up to symmetry) was already in the stock: nothing changed */
  created: boolean;
  canonicalKey: string;
}

/**
 * Put a tiling into the stock inside the caller's transaction. Idempotent by canonical key:
 * adding a tiling that is already there (in any orientation) returns the existing row.
 * The tiling is re-verified; an invalid one is refused with 422.
 */
export function addToStock(tx: DbOrTx, input: AddToStockInput): AddToStockResult {
  const v = verifyTiling(input.tiling);
  if (!v.ok) throw new Unprocessable(`not a valid tiling: ${v.message}`, v.square === undefined ? undefined : { square: v.square });
  const f = stockFacts(input.tiling);
  const existing = tx.select({ id: stock.id }).from(stock).where(eq(stock.canonicalKey, f.canonicalKey)).get();
  if (existing) return { id: existing.id, created: false, canonicalKey: f.canonicalKey };
  stockGeneration++;
  const row = tx
    .insert(stock)
    .values({
      canonicalKey: f.canonicalKey,
      canonicalCode: f.canonicalCode,
      squaresJson: squaresToJson(f.canonical),
      width: f.canonical.W,
      height: f.canonical.H,
      order: f.canonical.squares.length,
      square: f.canonical.W === f.canonical.H,
      perfect: f.perfect,
      simple: f.simple,
      provenance: input.provenance,
      setterId: input.setterId ?? null,
      paramsJson: input.params ? JSON.stringify(input.params) : null,
      acceptedAt: input.acceptedAt ?? (input.provenance === 'setter' ? new Date() : null),
    })
    .returning({ id: stock.id })
    .get();
  return { id: row.id, created: true, canonicalKey: f.canonicalKey };
}

/**
 * What a stock row needs, computed once: the canonical orientation (engine), its code and
 * key read off that orientation's Bouwkamp code, the engine's fast simplicity test, and
 * perfection as distinct sizes. Tests check it equals canonicalCode/canonicalKey/classifyTiling.
 */
export function stockFacts(t: Tiling) {
  const canonical = canonicalTiling(t);
  const canonicalCode = toBouwkamp(canonical, { header: true });
  const sizes = canonicalCode.replace(/^\s*\d+\s+\d+\s+\d+\s*/, '').match(/\d+/g) ?? [];
  const canonicalKey = `${canonical.W}x${canonical.H}:${sizes.join(',')}`;
  const perfect = new Set(t.squares.map((q) => q.s)).size === t.squares.length;
  return { canonical, canonicalCode, canonicalKey, perfect, simple: isSimple(t) };
}

/** Count one more (or fewer) puzzle derived from a stock tiling; the puzzle area calls this. */
export function markStockUsed(tx: DbOrTx, stockId: number, delta = 1): void {
  stockGeneration++;
  const r = tx
    .update(stock)
    .set({ useCount: sql`max(0, ${stock.useCount} + ${delta})` })
    .where(eq(stock.id, stockId))
    .run();
  if (r.changes === 0) throw new NotFound(`stock tiling ${stockId} does not exist`);
}

/** The id of the stock row with this canonical key, if any. */
export function findStockByKey(db: DbOrTx, key: string): number | null {
  return db.select({ id: stock.id }).from(stock).where(eq(stock.canonicalKey, key)).get()?.id ?? null;
}

/**
 * Where stock tilings were used: the puzzle and edition areas plug in here (setStockUsage)
 * once they exist; until then the history lists are empty.
 */
export interface StockUsage {
  puzzlesFor(db: DbOrTx, stockId: number): StockDetail['history']['puzzles'];
  editionsFor(db: DbOrTx, stockId: number): StockDetail['history']['editions'];
  gradeCounts(db: DbOrTx): StockSummary['byGrade'];
}
const noUsage: StockUsage = { puzzlesFor: () => [], editionsFor: () => [], gradeCounts: () => [] };
let usage: StockUsage = noUsage;
export function setStockUsage(u: StockUsage | null): void {
  usage = u ?? noUsage;
}

type StockFilter = z.infer<typeof stockFilterSchema>;

function whereOf(f: StockFilter): SQL | undefined {
  const w: SQL[] = [];
  if (f.orderMin !== undefined) w.push(gte(stock.order, f.orderMin));
  if (f.orderMax !== undefined) w.push(lte(stock.order, f.orderMax));
  if (f.widthMin !== undefined) w.push(gte(stock.width, f.widthMin));
  if (f.widthMax !== undefined) w.push(lte(stock.width, f.widthMax));
  if (f.heightMin !== undefined) w.push(gte(stock.height, f.heightMin));
  if (f.heightMax !== undefined) w.push(lte(stock.height, f.heightMax));
  if (f.square !== undefined) w.push(eq(stock.square, f.square));
  if (f.perfect !== undefined) w.push(eq(stock.perfect, f.perfect));
  if (f.simple !== undefined) w.push(eq(stock.simple, f.simple));
  if (f.provenance !== undefined) w.push(eq(stock.provenance, f.provenance));
  if (f.used === 'used') w.push(gt(stock.useCount, 0));
  if (f.used === 'unused') w.push(eq(stock.useCount, 0));
  if (f.setterId !== undefined) w.push(eq(stock.setterId, f.setterId));
  return w.length ? and(...w) : undefined;
}

const itemColumns = {
  id: stock.id,
  canonicalKey: stock.canonicalKey,
  canonicalCode: stock.canonicalCode,
  width: stock.width,
  height: stock.height,
  order: stock.order,
  square: stock.square,
  perfect: stock.perfect,
  simple: stock.simple,
  provenance: stock.provenance,
  setterId: stock.setterId,
  useCount: stock.useCount,
  createdAt: stock.createdAt,
  acceptedAt: stock.acceptedAt,
};

type ItemRow = { createdAt: Date; acceptedAt: Date | null } & Omit<StockItem, 'createdAt' | 'acceptedAt'>;
function toItem(r: ItemRow): StockItem {
  return { ...r, createdAt: r.createdAt.toISOString(), acceptedAt: r.acceptedAt ? r.acceptedAt.toISOString() : null };
}

const sortColumns = {
  createdAt: 'created_at',
  order: '"order"',
  width: 'width',
  height: 'height',
  id: 'id',
} as const;

/**
 * The list's SQL, written out once per filter shape and prepared once per database (Drizzle
 * would build and SQLite would prepare the same text on every request). Column names and
 * directions come from whitelists; every value is a bound parameter. Mirrors whereOf.
 */
function listWhere(f: StockFilter): { text: string; params: (string | number)[] } {
  const w: string[] = [];
  const params: (string | number)[] = [];
  const add = (cond: string, v: string | number) => {
    w.push(cond);
    params.push(v);
  };
  if (f.orderMin !== undefined) add('"order" >= ?', f.orderMin);
  if (f.orderMax !== undefined) add('"order" <= ?', f.orderMax);
  if (f.widthMin !== undefined) add('width >= ?', f.widthMin);
  if (f.widthMax !== undefined) add('width <= ?', f.widthMax);
  if (f.heightMin !== undefined) add('height >= ?', f.heightMin);
  if (f.heightMax !== undefined) add('height <= ?', f.heightMax);
  if (f.square !== undefined) add('square = ?', f.square ? 1 : 0);
  if (f.perfect !== undefined) add('perfect = ?', f.perfect ? 1 : 0);
  if (f.simple !== undefined) add('simple = ?', f.simple ? 1 : 0);
  if (f.provenance !== undefined) add('provenance = ?', f.provenance);
  if (f.used === 'used') w.push('use_count > 0');
  if (f.used === 'unused') w.push('use_count = 0');
  if (f.setterId !== undefined) add('setter_id = ?', f.setterId);
  return { text: w.length ? `where ${w.join(' and ')}` : '', params };
}

type Sqlite = Db['$client'];
const statementCache = new WeakMap<Sqlite, Map<string, Statement>>();
function prepared(client: Sqlite, text: string): Statement {
  let perDb = statementCache.get(client);
  if (!perDb) statementCache.set(client, (perDb = new Map()));
  let st = perDb.get(text);
  if (!st) {
    // filter shapes x sorts are finitely many (a few thousand at most); keep the recent ones
    if (perDb.size >= 500) perDb.delete(perDb.keys().next().value!);
    perDb.set(text, (st = client.prepare(text)));
  }
  return st;
}

/** Totals per filter, forgotten on any stock write and after COUNT_TTL_MS (counting is the slow part of a page). */
const COUNT_TTL_MS = 2_000;
let stockGeneration = 0;
const countCache = new WeakMap<object, Map<string, { n: number; generation: number; at: number }>>();

function countStock(db: Db, f: StockFilter, where: { text: string; params: (string | number)[] }): number {
  const key = JSON.stringify([f.orderMin, f.orderMax, f.widthMin, f.widthMax, f.heightMin, f.heightMax, f.square, f.perfect, f.simple, f.provenance, f.used, f.setterId]);
  let perDb = countCache.get(db);
  if (!perDb) countCache.set(db, (perDb = new Map()));
  const hit = perDb.get(key);
  const now = Date.now();
  if (hit && hit.generation === stockGeneration && now - hit.at < COUNT_TTL_MS) return hit.n;
  // count in a narrow index, as a range scan where a range filter allows
  const idx =
    f.orderMin !== undefined || f.orderMax !== undefined
      ? 'stock_filter_idx'
      : f.widthMin !== undefined || f.widthMax !== undefined
        ? 'stock_width_sort_idx'
        : f.heightMin !== undefined || f.heightMax !== undefined
          ? 'stock_height_sort_idx'
          : 'stock_filter_idx';
  const row = prepared(db.$client, `select count(*) as n from stock indexed by ${idx} ${where.text}`).get(...where.params) as { n: number } | undefined;
  const n = row?.n ?? 0;
  if (perDb.size > 1000) perDb.clear();
  perDb.set(key, { n, generation: stockGeneration, at: now });
  return n;
}

/**
 * GET /api/stock. Two steps so the wide rows (squares JSON) are never scanned or sorted:
 * the page's ids come from a narrow covering index (stock_recent_idx or stock_filter_idx, as
 * SQLite picks), the total from stock_filter_idx, then only the page's rows are read (decision 052).
 */
const LIST_TTL_MS = 5_000;
const listCache = new WeakMap<object, Map<string, { value: StockList; generation: number; at: number }>>();

export function listStock(db: Db, q: StockListQuery): StockList {
  // the same page of the same view (editors page back and forth) is answered from memory until
  // the stock changes or LIST_TTL_MS passes
  const key = JSON.stringify(q);
  let perDb = listCache.get(db);
  if (!perDb) listCache.set(db, (perDb = new Map()));
  const hit = perDb.get(key);
  const now = Date.now();
  if (hit && hit.generation === stockGeneration && now - hit.at < LIST_TTL_MS) return hit.value;
  const value = listStockUncached(db, q);
  if (perDb.size >= 500) perDb.delete(perDb.keys().next().value!);
  perDb.set(key, { value, generation: stockGeneration, at: now });
  return value;
}

type ListRow = {
  id: number;
  canonicalKey: string;
  canonicalCode: string;
  width: number;
  height: number;
  order: number;
  square: number;
  perfect: number;
  simple: number;
  provenance: Provenance;
  setterId: string | null;
  useCount: number;
  createdAt: number;
  acceptedAt: number | null;
  squaresJson: string;
};

const listRowsSql =
  'select id, canonical_key as canonicalKey, canonical_code as canonicalCode, width, height, "order", square, perfect, simple, provenance, ' +
  'setter_id as setterId, use_count as useCount, created_at as createdAt, accepted_at as acceptedAt, squares_json as squaresJson ' +
  'from stock where id in (select value from json_each(?))';

function listStockUncached(db: Db, q: StockListQuery): StockList {
  const where = listWhere(q);
  const dir = q.sort.desc ? 'desc' : 'asc';
  const col = sortColumns[q.sort.key];
  const offset = (q.page - 1) * q.pageSize;
  const idRows = prepared(db.$client, `select id from stock ${where.text} order by ${col} ${dir}, id ${dir} limit ? offset ?`)
    .pluck()
    .all(...where.params, q.pageSize, offset) as number[];
  const total = countStock(db, q, where);
  const rows = idRows.length ? (prepared(db.$client, listRowsSql).all(JSON.stringify(idRows)) as ListRow[]) : [];
  const byId = new Map(rows.map((r) => [r.id, r]));
  return {
    items: idRows.flatMap((id) => {
      const r = byId.get(id);
      if (!r) return [];
      return [
        {
          id: r.id,
          canonicalKey: r.canonicalKey,
          canonicalCode: r.canonicalCode,
          width: r.width,
          height: r.height,
          order: r.order,
          square: r.square === 1,
          perfect: r.perfect === 1,
          simple: r.simple === 1,
          provenance: r.provenance,
          setterId: r.setterId,
          useCount: r.useCount,
          createdAt: new Date(r.createdAt).toISOString(),
          acceptedAt: r.acceptedAt === null ? null : new Date(r.acceptedAt).toISOString(),
          tiling: tilingFromJson(r.width, r.height, r.squaresJson),
        },
      ];
    }),
    total,
    page: q.page,
    pageSize: q.pageSize,
  };
}

export function stockTiling(db: DbOrTx, id: number): { tiling: Tiling; canonicalKey: string } {
  const r = db
    .select({ width: stock.width, height: stock.height, squaresJson: stock.squaresJson, canonicalKey: stock.canonicalKey })
    .from(stock)
    .where(eq(stock.id, id))
    .get();
  if (!r) throw new NotFound(`stock tiling ${id} does not exist`);
  return { tiling: tilingFromJson(r.width, r.height, r.squaresJson), canonicalKey: r.canonicalKey };
}

export function getStockDetail(db: DbOrTx, id: number): StockDetail {
  const r = db
    .select({ ...itemColumns, squaresJson: stock.squaresJson, paramsJson: stock.paramsJson })
    .from(stock)
    .where(eq(stock.id, id))
    .get();
  if (!r) throw new NotFound(`stock tiling ${id} does not exist`);
  const { squaresJson, paramsJson, ...item } = r;
  // the stored orientation is the canonical one: its Bouwkamp code is the canonical code
  const tiling = tilingFromJson(r.width, r.height, squaresJson);
  const subs = db
    .select({ id: submission.id, createdAt: submission.createdAt, reviewedAt: submission.reviewedAt, status: submission.status })
    .from(submission)
    .where(and(eq(submission.stockId, id), eq(submission.status, 'accepted')))
    .orderBy(asc(submission.createdAt))
    .all();
  const events: StockDetail['history']['events'] = [];
  if (subs.length === 0) events.push({ kind: 'added', at: r.createdAt.toISOString(), note: `added by ${r.provenance}` });
  for (const s of subs) {
    events.push({ kind: 'submitted', at: s.createdAt.toISOString(), submissionId: s.id });
    if (s.reviewedAt) events.push({ kind: 'accepted', at: s.reviewedAt.toISOString(), submissionId: s.id });
  }
  return {
    ...toItem(item),
    bouwkamp: r.canonicalCode,
    params: paramsJson ? (JSON.parse(paramsJson) as Record<string, unknown>) : null,
    tiling,
    smith: smithDrawingOf(tiling),
    classification: classificationOf(tiling),
    history: { events, puzzles: usage.puzzlesFor(db, id), editions: usage.editionsFor(db, id) },
  };
}

export function stockSummary(db: DbOrTx): StockSummary {
  const byOrder = db
    .select({ order: stock.order, count: count() })
    .from(stock)
    .groupBy(stock.order)
    .orderBy(asc(stock.order))
    .all();
  const total = byOrder.reduce((s, r) => s + r.count, 0);
  return { total, byOrder, byGrade: usage.gradeCounts(db) };
}

export interface ExportRow extends StockItem {
  squaresJson: string;
}

/** The filtered selection for export, newest first, at most `limit` rows. */
export function exportStock(db: DbOrTx, f: StockFilter, limit: number): StockItem[] {
  return db
    .select(itemColumns)
    .from(stock)
    .where(whereOf(f))
    .orderBy(desc(stock.createdAt), desc(stock.id))
    .limit(limit)
    .all()
    .map(toItem);
}

function csvCell(v: unknown): string {
  const s = v === null || v === undefined ? '' : String(v);
  return /[",\n\r]/.test(s) ? `"${s.replaceAll('"', '""')}"` : s;
}

export function stockCsv(items: StockItem[]): string {
  const cols = ['id', 'canonicalKey', 'canonicalCode', 'width', 'height', 'order', 'square', 'perfect', 'simple', 'provenance', 'useCount', 'createdAt', 'acceptedAt'] as const;
  const lines = [cols.join(',')];
  for (const it of items) lines.push(cols.map((c) => csvCell(it[c])).join(','));
  return lines.join('\r\n') + '\r\n';
}

/** One canonical Bouwkamp code a line; `#` lines are comments (our upload reads this file back). */
export function stockCodeFile(items: StockItem[], now: Date): string {
  const head = [`# Squarewright stock export, ${items.length} tilings, ${now.toISOString()}`, '# one canonical Bouwkamp code per line'];
  return [...head, ...items.map((i) => i.canonicalCode)].join('\n') + '\n';
}
