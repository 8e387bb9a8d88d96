import { sql } from 'drizzle-orm';
import { index, integer, sqliteTable, text } from 'drizzle-orm/sqlite-core';
import { user } from '../../platform/auth/schema';
import { stock, tilingColumns } from '../stock/schema';

// Setters' submissions: verified on the way in, reviewed by an editor.

const nowMs = sql`(cast(unixepoch('subsecond') * 1000 as integer))`;

export const submission = sqliteTable(
  'submission',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    setterId: text('setter_id')
      .notNull()
      .references(() => user.id, { onDelete: 'cascade' }),
    title: text('title'),
    note: text('note'),
    source: text('source', { enum: ['paste', 'sketch', 'file'] }).notNull(),
    /** the code as the setter sent it (or the Bouwkamp code of sent squares). */
    code: text('code').notNull(),
    canonicalCode: text('canonical_code').notNull(),
    canonicalKey: text('canonical_key').notNull(),
    /** canonical key of the tiling divided by the gcd of its sizes (scaled copies share it); null until filled for rows older than migration 0017 */
    reducedKey: text('reduced_key'),
    /** the tiling as sent (not turned to the canonical orientation) */
    ...tilingColumns(),
    status: text('status', { enum: ['pending', 'accepted', 'rejected'] }).notNull().default('pending'),
    /** at submission time: already in the stock, or already pending. */
    duplicateOf: text('duplicate_of', { enum: ['stock', 'pending'] }),
    editorNote: text('editor_note'),
    reviewedBy: text('reviewed_by').references(() => user.id, { onDelete: 'set null' }),
    reviewedAt: integer('reviewed_at', { mode: 'timestamp_ms' }),
    stockId: integer('stock_id').references(() => stock.id, { onDelete: 'set null' }),
    createdAt: integer('created_at', { mode: 'timestamp_ms' }).notNull().default(nowMs),
  },
  (t) => [
    index('submission_setter_idx').on(t.setterId, t.createdAt),
    index('submission_status_idx').on(t.status, t.createdAt),
    index('submission_key_idx').on(t.canonicalKey),
    index('submission_reduced_key_idx').on(t.reducedKey, t.status),
  ],
);
