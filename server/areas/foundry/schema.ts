import { sql } from 'drizzle-orm';
import { index, integer, sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core';
import { job } from '../../platform/jobs/schema';
import { stock } from '../stock/schema';

// What each foundry run found: one row per distinct tiling (canonical key) per run, written
// in the same transaction as the run's progress. `stockId` is set when the tiling went into
// the stock (or was already there).

const nowMs = sql`(cast(unixepoch('subsecond') * 1000 as integer))`;

export const foundryResult = sqliteTable(
  'foundry_result',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    jobId: text('job_id')
      .notNull()
      .references(() => job.id, { onDelete: 'cascade' }),
    canonicalKey: text('canonical_key').notNull(),
    code: text('code').notNull(),
    order: integer('order').notNull(),
    width: integer('width').notNull(),
    height: integer('height').notNull(),
    perfect: integer('perfect', { mode: 'boolean' }).notNull(),
    simple: integer('simple', { mode: 'boolean' }).notNull(),
    square: integer('square', { mode: 'boolean' }).notNull(),
    maxSize: integer('max_size').notNull(),
    /** how it was made, JSON (graph code, pole, seed, joined parts) */
    origin: text('origin'),
    stockId: integer('stock_id').references(() => stock.id, { onDelete: 'set null' }),
    createdAt: integer('created_at', { mode: 'timestamp_ms' }).notNull().default(nowMs),
  },
  (t) => [
    uniqueIndex('foundry_result_job_key_idx').on(t.jobId, t.canonicalKey),
    index('foundry_result_key_idx').on(t.canonicalKey),
  ],
);
