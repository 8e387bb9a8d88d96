import { and, asc, count, desc, eq, isNull, sql } from 'drizzle-orm';
import { isSimple, verifyTiling, type Tiling } from '../../../shared/tiling/index';
import type { Provenance, StockDetail, StockItem, StockList, StockListQuery, StockSummary } from '../../../shared/contracts/stock';
import type { Db, DbOrTx } from '../../platform/db/client';
import { stock } from './schema';
import { NotFound, Unprocessable } from '../../platform/http/errors';
import type { AddToStockInput, AddToStockResult, StockPort, StockTiling, StockUsage, SubmissionHistory } from './ports';
import { connectionOf } from '../../platform/db/statements';
import { readStock, type ExportFormat, type ExportMark, type StockReader } from './stock-reader';
import { countStockIn, noteStockWrite, prepared, type Sqlite, stockGeneration, stockWhere, stockWhereSql, type StockFilter } from './stock-filter';
import { squaresToJson, storedParamsOf, storedSquaresOf, storedTiling } from './stored-json';
import { canonicalFormOf, classificationOf, gcdOfKey, reducedFormOf, smithDrawingOf } from './tiling-analysis';
import { scaleText } from '../../../shared/contracts/tilings';

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
  // prepared statements, not Drizzle: a foundry run stores tens of thousands of rows on the
  // request thread, and building and preparing each query was most of the cost (issue 14)
  const c = connectionOf(tx);
  const existing = prepared(c, 'select id from stock where canonical_key = ?').pluck().get(f.canonicalKey) as number | undefined;
  if (existing !== undefined) return { id: existing, created: false, canonicalKey: f.canonicalKey };
  // a scaled copy of a stock tiling is no new tiling either (issue 16)
  const scaled = findStockByReducedKey(tx, f.reducedKey);
  if (scaled) return { id: scaled.id, created: false, canonicalKey: f.canonicalKey, scale: scaleText(f.gcd, gcdOfKey(scaled.canonicalKey)) };
  noteStockWrite(input.background ? 'background' : 'people');
  const acceptedAt = input.acceptedAt ?? (input.provenance === 'setter' ? new Date() : null);
  const id = prepared(c, insertStockSql)
    .pluck()
    .get(
      f.canonicalKey,
      f.reducedKey,
      f.canonicalCode,
      squaresToJson(f.canonical),
      f.canonical.W,
      f.canonical.H,
      f.canonical.squares.length,
      f.canonical.W === f.canonical.H ? 1 : 0,
      f.perfect ? 1 : 0,
      f.simple ? 1 : 0,
      input.provenance,
      input.setterId ?? null,
      input.params ? JSON.stringify(input.params) : null,
      acceptedAt === null ? null : acceptedAt.getTime(),
    ) as number;
  return { id, created: true, canonicalKey: f.canonicalKey };
}

/** The columns addToStock writes (created_at and use_count take their defaults). */
const insertStockSql =
  'insert into stock (canonical_key, reduced_key, canonical_code, squares_json, width, height, "order", square, perfect, simple, provenance, setter_id, params_json, accepted_at) ' +
  'values (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?) returning id';

/**
 * What a stock row needs: the canonical orientation with the engine's canonical code and key
 * (canonicalised once), the engine's fast simplicity test, and perfection as distinct sizes.
 * Tests check it equals canonicalCode/canonicalKey/classifyTiling.
 */
export function stockFacts(t: Tiling) {
  const perfect = new Set(t.squares.map((q) => q.s)).size === t.squares.length;
  const form = canonicalFormOf(t);
  return { ...form, ...reducedFormOf(form.canonical, form.canonicalKey), perfect, simple: isSimple(t) };
}

/** Count one more (or fewer) puzzle derived from a stock tiling; the puzzle area calls this. */
export function markStockUsed(tx: DbOrTx, stockId: number, delta = 1): void {
  noteStockWrite();
  const r = tx
    .update(stock)
    .set({ useCount: sql`max(0, ${stock.useCount} + ${delta})` })
    .where(eq(stock.id, stockId))
    .run();
  if (r.changes === 0) throw new NotFound(`stock tiling ${stockId} does not exist`);
}

/** The stock row whose tiling is this one at some scale (same reduced key), if any. */
export function findStockByReducedKey(db: DbOrTx, reducedKey: string): { id: number; canonicalKey: string } | null {
  const row = prepared(connectionOf(db), 'select id, canonical_key as canonicalKey from stock where reduced_key = ? order by id limit 1').get(reducedKey) as { id: number; canonicalKey: string } | undefined;
  return row ?? null;
}

/**
 * Fills reduced_key for stock rows stored before migration 0017 (run once at start-up; a
 * few ms per thousand rows). Returns how many rows it filled.
 */
export function fillStockReducedKeys(db: DbOrTx): number {
  const rows = db.select({ id: stock.id, canonicalKey: stock.canonicalKey, squaresJson: stock.squaresJson, width: stock.width, height: stock.height }).from(stock).where(isNull(stock.reducedKey)).all();
  for (const r of rows) {
    const g = gcdOfKey(r.canonicalKey);
    const reducedKey = g === 1 ? r.canonicalKey : reducedFormOf(storedTiling('stock', r), r.canonicalKey).reducedKey;
    db.update(stock).set({ reducedKey }).where(eq(stock.id, r.id)).run();
  }
  if (rows.length > 0) noteStockWrite();
  return rows.length;
}

/** The id of the stock row with this canonical key, if any. */
export function findStockByKey(db: DbOrTx, key: string): number | null {
  return db.select({ id: stock.id }).from(stock).where(eq(stock.canonicalKey, key)).get()?.id ?? null;
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
 * GET /api/stock. Two steps so the wide rows (squares JSON) are never scanned or sorted:
 * the page's ids come from a narrow covering index (stock_recent_idx or stock_filter_idx, as
 * SQLite picks), the total from countStock (./stock-filter.ts), then only the page's rows are
 * read (decision 052). The page is read by the stock reader's thread when the server has
 * one (./stock-reader.ts), else here; either way the answer is JSON text, cached as text.
 */
const LIST_TTL_MS = 5_000;
/** How late a list may show results a job stores (a foundry run storing thousands would otherwise empty the cache with each slice). */
const BACKGROUND_LAG_MS = 1_000;
const listCache = new WeakMap<object, Map<string, { value: string; generation: ReturnType<typeof stockGeneration>; at: number }>>();

/** A page of the stock list as JSON text (the StockList contract). */
export async function stockListJson(deps: { db: Db; stockReader?: StockReader | null }, q: StockListQuery): Promise<string> {
  // the same page of the same view (editors page back and forth) is answered from memory until
  // the stock changes or LIST_TTL_MS passes
  const key = JSON.stringify(q);
  let perDb = listCache.get(deps.db);
  if (!perDb) listCache.set(deps.db, (perDb = new Map()));
  const hit = perDb.get(key);
  const gen = stockGeneration();
  if (hit && hit.generation.people === gen.people && Date.now() - hit.at < (hit.generation.background === gen.background ? LIST_TTL_MS : BACKGROUND_LAG_MS)) return hit.value;
  // the generation is taken before the page is read: a write meanwhile makes the next request read again
  const at = Date.now();
  const value = await readStock(deps.stockReader, (r) => r.list(q), () => JSON.stringify(listStockPage(deps.db.$client, q)));
  if (perDb.size >= 500) perDb.delete(perDb.keys().next().value!);
  perDb.set(key, { value, generation: gen, at });
  return value;
}

/** A page of the stock list as an object (tests; the routes use stockListJson). */
export function listStock(db: Db, q: StockListQuery): StockList {
  return listStockPage(db.$client, q);
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

/** A list or export row's common fields as the API gives them (flags as booleans, times as ISO text). */
function itemFieldsOf(r: Omit<ListRow, 'squaresJson'>) {
  return {
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
  };
}

const listRowsSql =
  'select id, width, height, "order", square, perfect, simple, provenance, ' +
  'setter_id as setterId, use_count as useCount, created_at as createdAt, accepted_at as acceptedAt, squares_json as squaresJson ' +
  'from stock where id in (select value from json_each(?))';

/** One page of the stock list read on this connection, in one read transaction (its items and its total agree). */
export function listStockPage(client: Sqlite, q: StockListQuery): StockList {
  return client.transaction(() => readListPage(client, q))();
}

function readListPage(client: Sqlite, q: StockListQuery): StockList {
  const where = stockWhereSql(q);
  const dir = q.sort.desc ? 'desc' : 'asc';
  const col = sortColumns[q.sort.key];
  const offset = (q.page - 1) * q.pageSize;
  const idRows = prepared(client, `select id from stock ${where.text} order by ${col} ${dir}, id ${dir} limit ? offset ?`)
    .pluck()
    .all(...where.params, q.pageSize, offset) as number[];
  const total = countStockIn(client, q);
  const rows = idRows.length ? (prepared(client, listRowsSql).all(JSON.stringify(idRows)) as ListRow[]) : [];
  const squares = storedSquaresOf('stock', rows);
  const byId = new Map(rows.map((r, i) => [r.id, { r, squares: squares[i]! }]));
  return {
    items: idRows.flatMap((id) => {
      const hit = byId.get(id);
      if (!hit) return [];
      return [{ ...itemFieldsOf(hit.r), squares: hit.squares }];
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
  return { tiling: storedTiling('stock', { id, ...r }), canonicalKey: r.canonicalKey, setterId: r.setterId };
}

/** params_json: how the tiling was made (AddToStockInput.params), read only here. */

const detailSql =
  'select id, canonical_key as canonicalKey, canonical_code as canonicalCode, width, height, "order", square, perfect, simple, provenance, ' +
  'setter_id as setterId, use_count as useCount, created_at as createdAt, accepted_at as acceptedAt, squares_json as squaresJson, params_json as paramsJson from stock where id = ?';
type DetailRow = Omit<ListRow, 'square' | 'perfect' | 'simple'> & { canonicalKey: string; canonicalCode: string; square: number; perfect: number; simple: number; paramsJson: string | null };

export function getStockDetail(deps: { db: DbOrTx; stockUsage: StockUsage; submissionHistory: SubmissionHistory }, id: number): StockDetail {
  const { db, stockUsage: usage } = deps;
  // a prepared statement, not Drizzle: building the query was half the cost of a detail (issue 14)
  const raw = prepared(connectionOf(db), detailSql).get(id) as DetailRow | undefined;
  if (!raw) throw new NotFound(`stock tiling ${id} does not exist`);
  const r = {
    ...raw,
    square: raw.square === 1,
    perfect: raw.perfect === 1,
    simple: raw.simple === 1,
    createdAt: new Date(raw.createdAt),
    acceptedAt: raw.acceptedAt === null ? null : new Date(raw.acceptedAt),
  };
  const { squaresJson, paramsJson, ...item } = r;
  // the stored orientation is the canonical one: its Bouwkamp code is the canonical code
  const tiling = storedTiling('stock', { ...r, squaresJson });
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
    params: storedParamsOf({ id, paramsJson }),
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

export type { ExportFormat, ExportMark } from './stock-reader';

type ExportRowRead = Omit<ListRow, 'squaresJson'> & { canonicalKey: string; canonicalCode: string };
const exportColumns =
  'id, canonical_key as canonicalKey, canonical_code as canonicalCode, width, height, "order", square, perfect, simple, provenance, ' +
  'setter_id as setterId, use_count as useCount, created_at as createdAt, accepted_at as acceptedAt';

/**
 * The next rows of an export (newest first, after `after`) as the file's text: prepared SQL
 * over the stock_recent_idx order, the position by row value, so each page costs the same
 * however far the export has got. Read on the stock reader's thread when there is one.
 */
export function exportPage(client: Sqlite, f: StockFilter, after: ExportMark | null, n: number, format: ExportFormat): { text: string; count: number; after: ExportMark | null } {
  const where = stockWhereSql(f);
  const cond = [where.text.slice('where '.length), after ? '(created_at, id) < (?, ?)' : ''].filter(Boolean).join(' and ');
  const text = `select ${exportColumns} from stock ${cond ? `where ${cond}` : ''} order by created_at desc, id desc limit ?`;
  const rows = prepared(client, text).all(...where.params, ...(after ? [after.createdAt, after.id] : []), n) as ExportRowRead[];
  const items: StockItem[] = rows.map((r) => ({ ...itemFieldsOf(r), canonicalKey: r.canonicalKey, canonicalCode: r.canonicalCode }));
  const last = rows[rows.length - 1];
  return { text: format === 'csv' ? stockCsvRows(items) : stockCodeRows(items), count: rows.length, after: last ? { createdAt: last.createdAt, id: last.id } : after };
}

/** The filtered selection for export, newest first, at most `limit` rows, at once (tests; routes stream exportBatches). */
export function exportStock(db: DbOrTx, f: StockFilter, limit: number): StockItem[] {
  return db
    .select(itemColumns)
    .from(stock)
    .where(stockWhere(f))
    .orderBy(desc(stock.createdAt), desc(stock.id))
    .limit(limit)
    .all()
    .map(toItem);
}

function csvCell(v: unknown): string {
  const s = v === null || v === undefined ? '' : String(v);
  return /[",\n\r]/.test(s) ? `"${s.replaceAll('"', '""')}"` : s;
}

const csvColumns = ['id', 'canonicalKey', 'canonicalCode', 'width', 'height', 'order', 'square', 'perfect', 'simple', 'provenance', 'useCount', 'createdAt', 'acceptedAt'] as const;

/** The CSV's header line. */
export const stockCsvHead = () => csvColumns.join(',') + '\r\n';

/** CSV lines of these items (no header). */
export function stockCsvRows(items: StockItem[]): string {
  let out = '';
  for (const it of items) out += csvColumns.map((c) => csvCell(it[c])).join(',') + '\r\n';
  return out;
}

export function stockCsv(items: StockItem[]): string {
  return stockCsvHead() + stockCsvRows(items);
}

/** The code file's comment lines (`#`: our upload skips them). */
export const stockCodeFileHead = (count: number, now: Date) => `# Squarewright stock export, ${count} tilings, ${now.toISOString()}\n# one canonical Bouwkamp code per line\n`;

/** Code file lines of these items (no head): one canonical Bouwkamp code a line. */
export const stockCodeRows = (items: StockItem[]) => items.map((i) => `${i.canonicalCode}\n`).join('');

/** One canonical Bouwkamp code a line; `#` lines are comments (our upload reads this file back). */
export function stockCodeFile(items: StockItem[], now: Date): string {
  return stockCodeFileHead(items.length, now) + stockCodeRows(items);
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
    .map((r) => ({ id: r.id, tiling: storedTiling('stock', r) }));
}

/** The stock's port for other areas (see ./ports.ts), wired in server/compose.ts. */
export const stockPort: StockPort = {
  add: addToStock,
  markUsed: markStockUsed,
  tiling: stockTiling,
  findByKey: findStockByKey,
  findByReducedKey: findStockByReducedKey,
  allKeys: allStockKeys,
  perfectRectangles,
};
