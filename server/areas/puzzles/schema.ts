import { sql } from 'drizzle-orm';
import { index, integer, sqliteTable, text } from 'drizzle-orm/sqlite-core';
import { user } from '../../platform/auth/schema';
import { stock } from '../stock/schema';

// Puzzles made from stock tilings. The certificate of the latest finished proof is stored
// with the puzzle; `inputHash` is the hash of the puzzle as it is now, so a certificate is
// current only while its own input hash equals it (and its engine version is the one in use).

const nowMs = sql`(cast(unixepoch('subsecond') * 1000 as integer))`;

export const puzzleStatuses = ['proving', 'unique', 'multiple', 'none', 'undecided', 'stuck', 'not-unique', 'failed', 'cancelled'] as const;

export const puzzle = sqliteTable(
  'puzzle',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    stockId: integer('stock_id')
      .notNull()
      .references(() => stock.id, { onDelete: 'restrict' }),
    kind: text('kind', { enum: ['assembly', 'deduction'] }).notNull(),
    title: text('title').notNull(),
    status: text('status', { enum: puzzleStatuses }).notNull().default('proving'),
    grade: integer('grade'),
    /** Deduction: JSON number or "closure"; null for Assembly */
    level: text('level'),
    showFrame: integer('show_frame', { mode: 'boolean' }).notNull().default(false),
    /** JSON [{x,y,size}] in the stock tiling's canonical orientation */
    startersJson: text('starters_json').notNull().default('[]'),
    givensJson: text('givens_json').notNull().default('[]'),
    /** Deduction step list of the latest proof, JSON */
    stepsJson: text('steps_json').notNull().default('[]'),
    /** the certificate of the latest finished proof, JSON */
    certificateJson: text('certificate_json'),
    certInputHash: text('cert_input_hash'),
    certEngineVersion: text('cert_engine_version'),
    /** hash of the puzzle's input as it is now (starters/givens/level) */
    inputHash: text('input_hash').notNull(),
    /** second solution and differing squares (Assembly, multiple), JSON */
    secondJson: text('second_json'),
    notesJson: text('notes_json').notNull().default('[]'),
    recheckJson: text('recheck_json'),
    /** bumped on every change; a job's result is stored only for the revision it proved */
    revision: integer('revision').notNull().default(1),
    jobId: text('job_id'),
    createdBy: text('created_by').references(() => user.id, { onDelete: 'set null' }),
    createdAt: integer('created_at', { mode: 'timestamp_ms' }).notNull().default(nowMs),
    updatedAt: integer('updated_at', { mode: 'timestamp_ms' }).notNull().default(nowMs),
  },
  (t) => [index('puzzle_stock_idx').on(t.stockId), index('puzzle_status_idx').on(t.status), index('puzzle_created_idx').on(t.createdAt, t.id), index('puzzle_kind_idx').on(t.kind)],
);
