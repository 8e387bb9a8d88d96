import { and, asc, count, desc, eq, gt, gte, lte, sql, type SQL } from 'drizzle-orm';
import { canonicalTiling, isSimple, toBouwkamp, verifyTiling, type Tiling } from '../../../shared/tiling/index';
import type { Provenance, StockDetail, StockItem, StockList, StockListQuery, StockSummary } from '../../../shared/contracts/stock';
import { stockFilterSchema } from '../../../shared/contracts/stock';
import type { z } from 'zod';
import type { Statement } from 'better-sqlite3';
import type { Db, DbOrTx } from '../../platform/db/client';
import { stock } from './schema';
import { NotFound, Unprocessable } from '../../platform/http/errors';
import type { AddToStockInput, AddToStockResult, StockPort, StockTiling, StockUsage, SubmissionHistory } from './ports';
import { classificationOf, smithDrawingOf, squaresToJson, tilingFromJson } from './tiling-analysis';

// The stock of verified tilings, one row per canonical key. addToStock is the one way in
// (review, foundry, demo seed all call it).

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

/**
 * Totals come from a snapshot of the filter columns in typed arrays (about 1 MB for 50,000
 * tilings), counted in a loop: SQLite needs 5-10 ms to count a filter through an index at that
 * size, the loop well under 1 ms. The snapshot is used only while nothing was written to the
 * database since it was taken (this module's writes, SQLite's total_changes() on this
 * connection and data_version for other connections), so totals are always exact. Taking one
 * costs ~100 ms at 50,000, so after a write it is retaken at most every SNAPSHOT_MIN_AGE_MS;
 * until then totals are counted by SQLite in the narrowest index.
 */
const SNAPSHOT_MIN_AGE_MS = 1_000;
let stockGeneration = 0;

type FilterSnapshot = {
  n: number;
  order: Int32Array;
  width: Int32Array;
  height: Int32Array;
  /** bit 0 square, bit 1 perfect, bit 2 simple, bit 3 used (useCount > 0) */
  flags: Uint8Array;
  /** index into provenanceCodes, 255 for anything else */
  provenance: Uint8Array;
  setter: (string | null)[];
  /** what the database looked like when the snapshot was taken */
  stamp: string;
  at: number;
};
const provenanceCodes: readonly Provenance[] = ['setter', 'foundry', 'demo'];
const snapshots = new WeakMap<Sqlite, FilterSnapshot>();

function databaseStamp(db: Db): string {
  const changes = prepared(db.$client, 'select total_changes()').pluck().get() as number;
  const version = db.$client.pragma('data_version', { simple: true }) as number;
  return `${stockGeneration}:${changes}:${version}`;
}

/** The snapshot if it is current or may be retaken now; null when SQLite should count instead. */
function filterSnapshot(db: Db): FilterSnapshot | null {
  const now = Date.now();
  const stamp = databaseStamp(db);
  const hit = snapshots.get(db.$client);
  if (hit && hit.stamp === stamp) return hit;
  if (hit && now - hit.at < SNAPSHOT_MIN_AGE_MS) return null;
  const rows = prepared(db.$client, 'select "order", width, height, square, perfect, simple, use_count, provenance, setter_id from stock indexed by stock_filter_idx')
    .raw()
    .all() as [number, number, number, number, number, number, number, string, string | null][];
  const n = rows.length;
  const snap: FilterSnapshot = {
    n,
    order: new Int32Array(n),
    width: new Int32Array(n),
    height: new Int32Array(n),
    flags: new Uint8Array(n),
    provenance: new Uint8Array(n),
    setter: Array.from<string | null>({ length: n }),
    stamp,
    at: now,
  };
  for (let i = 0; i < n; i++) {
    const [order, width, height, square, perfect, simple, useCount, provenance, setterId] = rows[i]!;
    snap.order[i] = order;
    snap.width[i] = width;
    snap.height[i] = height;
    snap.flags[i] = (square ? 1 : 0) | (perfect ? 2 : 0) | (simple ? 4 : 0) | (useCount > 0 ? 8 : 0);
    const p = provenanceCodes.indexOf(provenance as Provenance);
    snap.provenance[i] = p < 0 ? 255 : p;
    snap.setter[i] = setterId;
  }
  snapshots.set(db.$client, snap);
  return snap;
}

/** How many stock tilings match the filter (the same conditions as whereOf and listWhere). */
export function countStock(db: Db, f: StockFilter): number {
  const s = filterSnapshot(db);
  if (!s) return countStockInSql(db, f);
  const oLo = f.orderMin ?? -Infinity;
  const oHi = f.orderMax ?? Infinity;
  const wLo = f.widthMin ?? -Infinity;
  const wHi = f.widthMax ?? Infinity;
  const hLo = f.heightMin ?? -Infinity;
  const hHi = f.heightMax ?? Infinity;
  // flags: the bits that must match (mask) and their values (want)
  let mask = 0;
  let want = 0;
  if (f.square !== undefined) {
    mask |= 1;
    want |= f.square ? 1 : 0;
  }
  if (f.perfect !== undefined) {
    mask |= 2;
    want |= f.perfect ? 2 : 0;
  }
  if (f.simple !== undefined) {
    mask |= 4;
    want |= f.simple ? 4 : 0;
  }
  if (f.used !== undefined) {
    mask |= 8;
    want |= f.used === 'used' ? 8 : 0;
  }
  const prov = f.provenance === undefined ? -1 : provenanceCodes.indexOf(f.provenance);
  const setter = f.setterId;
  let count = 0;
  for (let i = 0; i < s.n; i++) {
    const o = s.order[i]!;
    if (o < oLo || o > oHi) continue;
    const w = s.width[i]!;
    if (w < wLo || w > wHi) continue;
    const h = s.height[i]!;
    if (h < hLo || h > hHi) continue;
    if ((s.flags[i]! & mask) !== want) continue;
    if (prov >= 0 && s.provenance[i] !== prov) continue;
    if (setter !== undefined && s.setter[i] !== setter) continue;
    count++;
  }
  return count;
}

function countStockInSql(db: Db, f: StockFilter): number {
  // count in a narrow index, as a range scan where a range filter allows
  const idx =
    f.orderMin !== undefined || f.orderMax !== undefined
      ? 'stock_filter_idx'
      : f.widthMin !== undefined || f.widthMax !== undefined
        ? 'stock_width_sort_idx'
        : f.heightMin !== undefined || f.heightMax !== undefined
          ? 'stock_height_sort_idx'
          : 'stock_filter_idx';
  const where = listWhere(f);
  return (prepared(db.$client, `select count(*) from stock indexed by ${idx} ${where.text}`).pluck().get(...where.params) as number | undefined) ?? 0;
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
  'select id, width, height, "order", square, perfect, simple, provenance, ' +
  'setter_id as setterId, use_count as useCount, created_at as createdAt, accepted_at as acceptedAt, squares_json as squaresJson ' +
  'from stock where id in (select value from json_each(?))';

/** The stored squares ([[x,y,s],...], written by squaresToJson) as the list sends them. */
function squaresFromJson(json: string): [number, number, number][] {
  const raw = JSON.parse(json) as unknown;
  if (!Array.isArray(raw) || !raw.every((q) => Array.isArray(q) && q.length === 3 && q.every(Number.isInteger))) {
    throw new Error('stored squares are not a list of [x,y,s]');
  }
  return raw as [number, number, number][];
}

function listStockUncached(db: Db, q: StockListQuery): StockList {
  const where = listWhere(q);
  const dir = q.sort.desc ? 'desc' : 'asc';
  const col = sortColumns[q.sort.key];
  const offset = (q.page - 1) * q.pageSize;
  const idRows = prepared(db.$client, `select id from stock ${where.text} order by ${col} ${dir}, id ${dir} limit ? offset ?`)
    .pluck()
    .all(...where.params, q.pageSize, offset) as number[];
  const total = countStock(db, q);
  const rows = idRows.length ? (prepared(db.$client, listRowsSql).all(JSON.stringify(idRows)) as ListRow[]) : [];
  const byId = new Map(rows.map((r) => [r.id, r]));
  return {
    items: idRows.flatMap((id) => {
      const r = byId.get(id);
      if (!r) return [];
      return [
        {
          id: r.id,
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
          squares: squaresFromJson(r.squaresJson),
        },
      ];
    }),
    total,
    page: q.page,
    pageSize: q.pageSize,
  };
}

export function stockTiling(db: DbOrTx, id: number): StockTiling {
  const r = db
    .select({ width: stock.width, height: stock.height, squaresJson: stock.squaresJson, canonicalKey: stock.canonicalKey, setterId: stock.setterId })
    .from(stock)
    .where(eq(stock.id, id))
    .get();
  if (!r) throw new NotFound(`stock tiling ${id} does not exist`);
  return { tiling: tilingFromJson(r.width, r.height, r.squaresJson), canonicalKey: r.canonicalKey, setterId: r.setterId };
}

export function getStockDetail(deps: { db: DbOrTx; stockUsage: StockUsage; submissionHistory: SubmissionHistory }, id: number): StockDetail {
  const { db, stockUsage: usage } = deps;
  const r = db
    .select({ ...itemColumns, squaresJson: stock.squaresJson, paramsJson: stock.paramsJson })
    .from(stock)
    .where(eq(stock.id, id))
    .get();
  if (!r) throw new NotFound(`stock tiling ${id} does not exist`);
  const { squaresJson, paramsJson, ...item } = r;
  // the stored orientation is the canonical one: its Bouwkamp code is the canonical code
  const tiling = tilingFromJson(r.width, r.height, squaresJson);
  const subs = deps.submissionHistory.acceptedFor(db, id);
  const events: StockDetail['history']['events'] = [];
  if (subs.length === 0) events.push({ kind: 'added', at: r.createdAt.toISOString(), note: `added by ${r.provenance}` });
  for (const s of subs) {
    events.push({ kind: 'submitted', at: s.submittedAt.toISOString(), submissionId: s.submissionId });
    if (s.acceptedAt) events.push({ kind: 'accepted', at: s.acceptedAt.toISOString(), submissionId: s.submissionId });
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

export function stockSummary(db: DbOrTx, usage: StockUsage): StockSummary {
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

/** Every canonical key in the stock. */
export function allStockKeys(db: DbOrTx): string[] {
  return db.select({ k: stock.canonicalKey }).from(stock).all().map((r) => r.k);
}

/** Perfect rectangles that are not squares, by id, at most `limit`. */
export function perfectRectangles(db: DbOrTx, limit: number): { id: number; tiling: Tiling }[] {
  return db
    .select({ id: stock.id, width: stock.width, height: stock.height, squaresJson: stock.squaresJson })
    .from(stock)
    .where(and(eq(stock.perfect, true), eq(stock.square, false)))
    .orderBy(asc(stock.id))
    .limit(limit)
    .all()
    .map((r) => ({ id: r.id, tiling: tilingFromJson(r.width, r.height, r.squaresJson) }));
}

/** The stock's port for other areas (see ./ports.ts), wired in server/compose.ts. */
export const stockPort: StockPort = {
  add: addToStock,
  markUsed: markStockUsed,
  tiling: stockTiling,
  findByKey: findStockByKey,
  allKeys: allStockKeys,
  perfectRectangles,
};
