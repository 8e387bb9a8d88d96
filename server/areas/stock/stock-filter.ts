import { and, sql, type SQL } from 'drizzle-orm';
import type { z } from 'zod';
import type { stockFilterSchema } from '../../../shared/contracts/stock';
import type { Db } from '../../platform/db/client';
import { prepared } from '../../platform/db/statements';

// The stock filter, defined once. Every filter field is a condition on one column (`fields`);
// every column says how SQL reads it (`columns`). From these two tables come the SQL text of
// the list and count statements (stockWhereSql), the export's Drizzle condition (stockWhere)
// and the totals counted in memory (countStock): adding a filter field is one line in
// `fields` (and, for a new column, one in `columns`).

export type StockFilter = z.infer<typeof stockFilterSchema>;

interface ColumnDef {
  sql: string;
  kind: 'int' | 'bool' | 'text';
  index?: string;
}

/**
 * The columns the filter reads: the SQL expression over the stock table, and its kind (int:
 * a number; bool: 0 or 1; text: a string, or NULL that no condition matches). `index` names the
 * narrow index SQLite counts in when a range condition is on that column (the first such column
 * in this order wins).
 */
const columns = {
  order: { sql: '"order"', kind: 'int', index: 'stock_filter_idx' },
  width: { sql: 'width', kind: 'int', index: 'stock_width_sort_idx' },
  height: { sql: 'height', kind: 'int', index: 'stock_height_sort_idx' },
  square: { sql: 'square', kind: 'bool' },
  perfect: { sql: 'perfect', kind: 'bool' },
  simple: { sql: 'simple', kind: 'bool' },
  used: { sql: '(use_count > 0)', kind: 'bool' },
  provenance: { sql: 'provenance', kind: 'text' },
  setter: { sql: 'setter_id', kind: 'text' },
} satisfies Record<string, ColumnDef>;
type Column = keyof typeof columns;
const columnDef = (c: Column): ColumnDef => columns[c];
const columnNames = Object.keys(columns) as Column[];

/** One condition: `column op value`. */
interface Condition {
  column: Column;
  op: '>=' | '<=' | '=';
  value: number | string | boolean;
}

const atLeast = (column: Column) => (value: number): Condition => ({ column, op: '>=', value });
const atMost = (column: Column) => (value: number): Condition => ({ column, op: '<=', value });
const equals = (column: Column) => (value: string | boolean): Condition => ({ column, op: '=', value });

/** Every field of the filter as a condition on one column. */
type Field = keyof StockFilter;
type Rule<K extends Field> = (value: NonNullable<StockFilter[K]>) => Condition;
const fields: { [K in Field]: Rule<K> } = {
  orderMin: atLeast('order'),
  orderMax: atMost('order'),
  widthMin: atLeast('width'),
  widthMax: atMost('width'),
  heightMin: atLeast('height'),
  heightMax: atMost('height'),
  square: equals('square'),
  perfect: equals('perfect'),
  simple: equals('simple'),
  provenance: equals('provenance'),
  used: (v) => equals('used')(v === 'used'),
  setterId: equals('setter'),
};
const fieldNames = Object.keys(fields) as Field[];

function conditionOf<K extends Field>(f: StockFilter, name: K): Condition | null {
  const rule: Rule<K> = fields[name];
  const v = f[name];
  return v === undefined ? null : rule(v);
}

function conditionsOf(f: StockFilter): Condition[] {
  const out: Condition[] = [];
  for (const name of fieldNames) {
    const c = conditionOf(f, name);
    if (c) out.push(c);
  }
  return out;
}

/** A condition's value as SQLite stores it (booleans are 0 and 1). */
const sqlValue = (c: Condition): number | string => (typeof c.value === 'boolean' ? (c.value ? 1 : 0) : c.value);
const sqlTest = (c: Condition) => `${columnDef(c.column).sql} ${c.op}`;

/** The filter as a SQL `where` clause over the stock table ('' for no filter) with its bound parameters, in order. */
export function stockWhereSql(f: StockFilter): { text: string; params: (string | number)[] } {
  const conds = conditionsOf(f);
  return { text: conds.length ? `where ${conds.map((c) => `${sqlTest(c)} ?`).join(' and ')}` : '', params: conds.map(sqlValue) };
}

/** The filter as a Drizzle condition on the stock table (undefined for no filter). */
export function stockWhere(f: StockFilter): SQL | undefined {
  const conds = conditionsOf(f);
  return conds.length ? and(...conds.map((c) => sql`${sql.raw(sqlTest(c))} ${sqlValue(c)}`)) : undefined;
}

export type Sqlite = Db['$client'];
export { prepared };

/**
 * Bumped by every write of the stock service (the list's page cache follows it): `people` by
 * what someone does (accepting a submission, a puzzle made or dropped), `background` by results
 * a job stores (a foundry run adds thousands, one slice after another).
 */
const generations = { people: 0, background: 0 };
export const stockGeneration = (): Readonly<typeof generations> => ({ ...generations });
export function noteStockWrite(by: 'people' | 'background' = 'people'): void {
  generations[by]++;
}

/**
 * Totals come from a snapshot of the filter columns in typed arrays (about 1.2 MB for 50,000
 * tilings), counted in a loop: SQLite needs 5-10 ms to count a filter through an index at that
 * size, the loop well under 1 ms. Stock rows are only ever added, or changed in place (use
 * count, reduced key); never deleted. So the snapshot holds the rows up to its last rowid and
 * stays good while no row is changed: rows added since are counted by SQLite over the rowid
 * range after it (a short range scan), so totals are always exact, also while a foundry run
 * stores thousands of tilings (issue 14: before, any write to the database sent every count to
 * SQLite until a second had passed without one). A change in place is seen by the stock's
 * rewrite count (table stock_revision, kept by triggers on the stock table: migration 0019), the
 * same number on every connection and in the same transaction as the rows, so the request
 * thread's connection and the stock reader's (./stock-reader.ts) keep snapshots alike. Reading
 * all rows at once took ~100 ms at 50,000, a stall for every request behind it, so a snapshot
 * is (re)taken in chunks of 2,000 rows by rowid, one chunk per turn of the event loop (a few ms
 * each); a change between two chunks discards the partial one. A retake starts once nothing has
 * been changed for SNAPSHOT_MIN_AGE_MS (at once for the first; meanwhile SQLite counts, in the
 * narrowest index), or when RETAKE_AFTER_ADDED rows were added since the last one (meanwhile the
 * snapshot in hand and the added range count).
 */
const SNAPSHOT_MIN_AGE_MS = 1_000;
const RETAKE_AFTER_ADDED = 5_000;
let snapshotChunkRows = 2_000;
/** Tests: smaller chunks, so a few hundred rows take several turns. */
export function setSnapshotChunkRowsForTests(n: number): void {
  snapshotChunkRows = n;
}

interface FilterSnapshot {
  n: number;
  /** per int or text column: ints as they are, texts as codes (-1 for NULL) */
  values: Partial<Record<Column, Int32Array>>;
  /** the code of each text seen, per text column */
  codes: Partial<Record<Column, Map<string, number>>>;
  /** the bool columns, one bit each (bit k for the k-th bool column in `columns` order) */
  flags: Int32Array;
  /** what the database looked like when the snapshot was taken */
  stamp: string;
  /** the last rowid it holds (rows after it are counted by SQLite) */
  lastRowid: number;
  at: number;
}
const snapshots = new WeakMap<Sqlite, FilterSnapshot>();
const flagBit = new Map(columnNames.filter((c) => columnDef(c).kind === 'bool').map((c, k) => [c, 1 << k]));

/** The stock's rewrite count (table stock_revision, kept by triggers: migration 0019); not rows added. */
function databaseStamp(client: Sqlite): string {
  return String(prepared(client, 'select rewrites from stock_revision where id = 1').pluck().get() ?? 0);
}

const lastRowidOf = (client: Sqlite) => (prepared(client, 'select max(rowid) from stock').pluck().get() as number | null) ?? 0;

type SnapshotRow = (number | string | null)[];
interface Retake {
  stamp: string;
  /** the last rowid read so far */
  after: number;
  rows: SnapshotRow[];
}
const retakes = new WeakMap<Sqlite, Retake>();
/** the stamp last seen per connection and since when */
const lastStamp = new WeakMap<Sqlite, { stamp: string; since: number }>();
const chunkSql = `select rowid, ${columnNames.map((c) => columnDef(c).sql).join(', ')} from stock where rowid > ? order by rowid limit ?`;

/** The snapshot if it is current; else null (SQLite counts), and a retake is started when due. */
function filterSnapshot(client: Sqlite): FilterSnapshot | null {
  const now = Date.now();
  const stamp = databaseStamp(client);
  const hit = snapshots.get(client);
  if (hit && hit.stamp === stamp) {
    // many rows added since it was taken: take a new one, answering from this one meanwhile
    if (!retakes.has(client) && lastRowidOf(client) - hit.lastRowid > RETAKE_AFTER_ADDED) startRetake(client, stamp);
    return hit;
  }
  const seen = lastStamp.get(client);
  if (!seen || seen.stamp !== stamp) lastStamp.set(client, { stamp, since: now });
  const stableFor = seen && seen.stamp === stamp ? now - seen.since : 0;
  const running = retakes.get(client);
  if ((!running || running.stamp !== stamp) && (!hit || stableFor >= SNAPSHOT_MIN_AGE_MS)) startRetake(client, stamp);
  return null;
}

/** Read the snapshot's rows chunk by chunk, one chunk per turn of the event loop. */
function startRetake(client: Sqlite, stamp: string): void {
  const r: Retake = { stamp, after: 0, rows: [] };
  retakes.set(client, r);
  const step = () => {
    if (retakes.get(client) !== r) return;
    // closed, or written since the retake began: give up (the next count starts another when due)
    if (!client.open || databaseStamp(client) !== r.stamp) {
      retakes.delete(client);
      return;
    }
    // the stock reader takes smaller chunks: a list page waits behind at most one (a few ms)
    const rows = client.readonly ? Math.min(500, snapshotChunkRows) : snapshotChunkRows;
    const chunk = prepared(client, chunkSql).raw().all(r.after, rows) as SnapshotRow[];
    for (const row of chunk) r.rows.push(row.slice(1));
    if (chunk.length > 0) r.after = chunk[chunk.length - 1]![0] as number;
    if (chunk.length === rows) {
      setImmediate(step);
      return;
    }
    retakes.delete(client);
    snapshots.set(client, buildSnapshot(r.rows, r.stamp, Date.now(), r.after));
  };
  setImmediate(step);
}

/** Tests: true once a snapshot matching the database as it is now is in place. */
export function stockSnapshotCurrent(db: Db): boolean {
  const hit = snapshots.get(db.$client);
  return hit !== undefined && hit.stamp === databaseStamp(db.$client);
}

function buildSnapshot(rows: SnapshotRow[], stamp: string, at: number, lastRowid: number): FilterSnapshot {
  const n = rows.length;
  const snap: FilterSnapshot = { n, values: {}, codes: {}, flags: new Int32Array(n), stamp, at, lastRowid };
  columnNames.forEach((name, k) => {
    const kind = columnDef(name).kind;
    const bit = flagBit.get(name);
    if (bit !== undefined) {
      for (let i = 0; i < n; i++) if (rows[i]![k]) snap.flags[i]! |= bit;
      return;
    }
    const a = (snap.values[name] = new Int32Array(n));
    if (kind === 'text') {
      const seen = (snap.codes[name] = new Map<string, number>());
      for (let i = 0; i < n; i++) {
        const v = rows[i]![k] as string | null;
        if (v === null) a[i] = -1;
        else {
          let code = seen.get(v);
          if (code === undefined) seen.set(v, (code = seen.size));
          a[i] = code;
        }
      }
    } else {
      for (let i = 0; i < n; i++) a[i] = rows[i]![k] as number;
    }
  });
  return snap;
}

/** How many stock tilings match the filter: the same conditions as stockWhereSql, tested on the snapshot. */
export function countStock(db: Db, f: StockFilter): number {
  return countStockIn(db.$client, f);
}

/** countStock on a connection (the stock reader's own, ./stock-reader-thread.ts). */
export function countStockIn(client: Sqlite, f: StockFilter): number {
  const s = filterSnapshot(client);
  if (!s) return countStockInSql(client, f);
  // one filter's count in the snapshot serves every page and sort of it (an editor paging
  // through a view; the load bench's random pages): kept with the snapshot, at most 200 filters
  const key = JSON.stringify(conditionsOf(f));
  let counts = snapshotCounts.get(s);
  if (!counts) snapshotCounts.set(s, (counts = new Map()));
  let inSnapshot = counts.get(key);
  if (inSnapshot === undefined) {
    inSnapshot = countInSnapshot(s, f);
    if (counts.size >= 200) counts.delete(counts.keys().next().value!);
    counts.set(key, inSnapshot);
  }
  if (!client.readonly) return inSnapshot + countAddedBetween(client, f, s.lastRowid, Infinity);
  // a read-only connection (the stock reader) sees only committed rows, and rowids only grow:
  // what it counted after the snapshot stays counted, so each count scans only the rows added
  // since this filter's last one (a foundry run adds thousands while the list is read)
  let added = snapshotAdded.get(s);
  if (!added) snapshotAdded.set(s, (added = new Map()));
  const last = lastRowidOf(client);
  let a = added.get(key) ?? { upTo: s.lastRowid, n: 0 };
  if (last > a.upTo) {
    a = { upTo: last, n: a.n + countAddedBetween(client, f, a.upTo, last) };
    if (added.size >= 200) added.delete(added.keys().next().value!);
    added.set(key, a);
  }
  return inSnapshot + a.n;
}

/** Counts in a snapshot by filter (its conditions as JSON); gone with the snapshot. */
const snapshotCounts = new WeakMap<FilterSnapshot, Map<string, number>>();
/** Rows added after a snapshot that match a filter, counted up to a rowid (read-only connections); gone with the snapshot. */
const snapshotAdded = new WeakMap<FilterSnapshot, Map<string, { upTo: number; n: number }>>();

/**
 * Rows with after < rowid <= upTo that match the filter: a range scan of the table by rowid (no
 * index). On a writing connection upTo is Infinity: rows added in a transaction of its own that
 * may still roll back (and give their rowids again) are never remembered.
 */
function countAddedBetween(client: Sqlite, f: StockFilter, after: number, upTo: number): number {
  const where = stockWhereSql(f);
  const text = `select count(*) from stock not indexed where rowid > ? and rowid <= ?${where.text ? ` and ${where.text.slice('where '.length)}` : ''}`;
  return (prepared(client, text).pluck().get(after, Number.isFinite(upTo) ? upTo : Number.MAX_SAFE_INTEGER, ...where.params) as number | undefined) ?? 0;
}

function countInSnapshot(s: FilterSnapshot, f: StockFilter): number {
  // bool conditions: the flag bits that must match (mask) and their values (want); the other
  // conditions on one column meet in one range [lo, hi] of its snapshot values
  let mask = 0;
  let want = 0;
  const ranges = new Map<Column, { lo: number; hi: number }>();
  for (const c of conditionsOf(f)) {
    const bit = flagBit.get(c.column);
    if (bit !== undefined) {
      const v = c.value ? bit : 0;
      if (mask & bit && (want & bit) !== v) return 0;
      mask |= bit;
      want |= v;
      continue;
    }
    let v: number;
    if (typeof c.value === 'string') {
      const code = s.codes[c.column]?.get(c.value);
      if (code === undefined) return 0; // no row holds this text
      v = code;
    } else v = Number(c.value);
    const r = ranges.get(c.column) ?? { lo: -Infinity, hi: Infinity };
    if (c.op !== '<=') r.lo = Math.max(r.lo, v);
    if (c.op !== '>=') r.hi = Math.min(r.hi, v);
    if (r.lo > r.hi) return 0;
    ranges.set(c.column, r);
  }
  const cols = [...ranges.keys()].map((c) => s.values[c]!);
  const lo = Float64Array.from(ranges.values(), (r) => r.lo);
  const hi = Float64Array.from(ranges.values(), (r) => r.hi);
  const m = cols.length;
  const flags = s.flags;
  let count = 0;
  rows: for (let i = 0; i < s.n; i++) {
    if ((flags[i]! & mask) !== want) continue;
    for (let k = 0; k < m; k++) {
      const v = cols[k]![i]!;
      if (v < lo[k]! || v > hi[k]!) continue rows;
    }
    count++;
  }
  return count;
}

function countStockInSql(client: Sqlite, f: StockFilter): number {
  // count in a narrow index, as a range scan where a range filter allows
  const conds = conditionsOf(f);
  const ranged = columnNames.find((c) => columnDef(c).index !== undefined && conds.some((d) => d.column === c));
  const idx = (ranged && columnDef(ranged).index) ?? 'stock_filter_idx';
  const where = stockWhereSql(f);
  return (prepared(client, `select count(*) from stock indexed by ${idx} ${where.text}`).pluck().get(...where.params) as number | undefined) ?? 0;
}
