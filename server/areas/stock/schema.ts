import { sql } from 'drizzle-orm';
import { index, integer, sqliteTable, text } from 'drizzle-orm/sqlite-core';
import { user } from '../../platform/auth/schema';

// The stock: accepted, verified tilings, one row per canonical key (a tiling up to symmetry).

const nowMs = sql`(cast(unixepoch('subsecond') * 1000 as integer))`;

/**
 * The columns of a stored tiling, shared by the stock and the submissions: its squares as
 * JSON [[x,y,s],...] (so drawings need no decoding; read through storedSquares), its size,
 * order and class flags.
 */
export const tilingColumns = () => ({
  squaresJson: text('squares_json').notNull(),
  width: integer('width').notNull(),
  height: integer('height').notNull(),
  order: integer('order').notNull(),
  square: integer('square', { mode: 'boolean' }).notNull(),
  perfect: integer('perfect', { mode: 'boolean' }).notNull(),
  simple: integer('simple', { mode: 'boolean' }).notNull(),
});

export const stock = sqliteTable(
  'stock',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    /** canonicalKey of the engine: "WxH:" + sizes of the canonical orientation; unique. */
    canonicalKey: text('canonical_key').notNull().unique(),
    /** canonical Bouwkamp code with header. */
    canonicalCode: text('canonical_code').notNull(),
    /** canonical key of the tiling divided by the gcd of its sizes (scaled copies share it); null until filled for rows older than migration 0017 */
    reducedKey: text('reduced_key'),
    /** the canonical orientation */
    ...tilingColumns(),
    provenance: text('provenance', { enum: ['setter', 'foundry', 'demo'] }).notNull(),
    setterId: text('setter_id').references(() => user.id, { onDelete: 'set null' }),
    /** how it was made (foundry run, seed, source submission) as JSON. */
    paramsJson: text('params_json'),
    /** how many puzzles were derived from it (others call markStockUsed). */
    useCount: integer('use_count').notNull().default(0),
    createdAt: integer('created_at', { mode: 'timestamp_ms' }).notNull().default(nowMs),
    acceptedAt: integer('accepted_at', { mode: 'timestamp_ms' }),
  },
  (t) => [
    index('stock_order_idx').on(t.order, t.id),
    index('stock_reduced_key_idx').on(t.reducedKey),
    index('stock_setter_idx').on(t.setterId),
    // newest-first lists (the default) walk this one and stop after a page, filtering in the index
    index('stock_recent_idx').on(t.createdAt, t.id, t.order, t.width, t.height, t.square, t.perfect, t.simple, t.provenance, t.useCount, t.setterId),
    // every filter and sort column: list and count queries scan this narrow index, never the
    // wide rows (squares JSON); see listStock (./stock.ts), countStock (./stock-filter.ts) and decision 052
    // lists sorted by width or height walk these in order and stop after a page
    index('stock_width_sort_idx').on(t.width, t.id, t.order, t.height, t.square, t.perfect, t.simple, t.provenance, t.useCount, t.setterId),
    index('stock_height_sort_idx').on(t.height, t.id, t.order, t.width, t.square, t.perfect, t.simple, t.provenance, t.useCount, t.setterId),
    index('stock_filter_idx').on(t.order, t.width, t.height, t.square, t.perfect, t.simple, t.provenance, t.useCount, t.setterId, t.createdAt, t.id),
  ],
);

/**
 * How many times stock rows were changed in place (or deleted): one row, kept by triggers on
 * the stock table (migration 0019), so every connection (the request thread's and the list
 * reader's, ./stock-reader.ts) sees the same number in the same transaction. Rows added do not
 * count: the stock's filter snapshot counts them by rowid (./stock-filter.ts).
 */
export const stockRevision = sqliteTable('stock_revision', {
  id: integer('id').primaryKey(),
  rewrites: integer('rewrites').notNull(),
});
