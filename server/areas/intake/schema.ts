import { sql } from 'drizzle-orm';
import { index, integer, primaryKey, sqliteTable, text } from 'drizzle-orm/sqlite-core';
import { user } from '../../platform/auth/schema';
import { job } from '../../platform/jobs/schema';
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

/**
 * One line of an uploaded file as the upload job stored it (decision 051): its verdict and the
 * submission it made. The job stores lines in small batches; a line is stored once (resuming
 * an interrupted upload skips the lines already here).
 */
export const uploadLine = sqliteTable(
  'upload_line',
  {
    jobId: text('job_id')
      .notNull()
      .references(() => job.id, { onDelete: 'cascade' }),
    line: integer('line').notNull(),
    verdict: text('verdict', { enum: ['valid', 'invalid', 'duplicate'] }).notNull(),
    submissionId: integer('submission_id').references(() => submission.id, { onDelete: 'set null' }),
    duplicateOf: text('duplicate_of', { enum: ['stock', 'pending', 'this-file'] }),
    /** invalid lines: the engine's error (code, message, where), JSON */
    errorJson: text('error_json'),
    order: integer('order'),
    width: integer('width'),
    height: integer('height'),
  },
  (t) => [primaryKey({ columns: [t.jobId, t.line] })],
);
