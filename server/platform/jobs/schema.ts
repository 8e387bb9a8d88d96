import { sql } from 'drizzle-orm';
import { index, integer, primaryKey, sqliteTable, text } from 'drizzle-orm/sqlite-core';
import { user } from '../auth/schema';

// Background jobs (server/platform/jobs, decision 032). A job never disappears:
// queued -> running -> done | cancelled | failed; a job found queued or running when the
// server starts (thread mode) becomes interrupted, and may be resumed or restarted (queued again).

const nowMs = sql`(cast(unixepoch('subsecond') * 1000 as integer))`;

export const jobStates = ['queued', 'running', 'done', 'cancelled', 'failed', 'interrupted'] as const;

export const job = sqliteTable(
  'job',
  {
    id: text('id').primaryKey(),
    kind: text('kind').notNull(),
    state: text('state', { enum: jobStates }).notNull().default('queued'),
    /** the validated parameters, JSON */
    params: text('params').notNull(),
    /** latest progress report, JSON ({ done, total, found, phase, rate, etaMs }) */
    progress: text('progress'),
    /** the handler's summary when it finished, JSON */
    summary: text('summary'),
    error: text('error'),
    budgetMs: integer('budget_ms'),
    cancelRequested: integer('cancel_requested', { mode: 'boolean' }).notNull().default(false),
    createdBy: text('created_by').references(() => user.id, { onDelete: 'set null' }),
    createdAt: integer('created_at', { mode: 'timestamp_ms' }).notNull().default(nowMs),
    startedAt: integer('started_at', { mode: 'timestamp_ms' }),
    finishedAt: integer('finished_at', { mode: 'timestamp_ms' }),
  },
  (t) => [index('job_kind_created_idx').on(t.kind, t.createdAt), index('job_state_idx').on(t.state)],
);

export const jobPartStates = ['queued', 'running', 'done', 'failed', 'cancelled', 'interrupted'] as const;

/**
 * The parts of a job split into parts (a foundry run's shards; every job has at least part 0).
 * A resumed job runs only its parts that are not done.
 */
export const jobPart = sqliteTable(
  'job_part',
  {
    jobId: text('job_id')
      .notNull()
      .references(() => job.id, { onDelete: 'cascade' }),
    idx: integer('idx').notNull(),
    state: text('state', { enum: jobPartStates }).notNull().default('queued'),
    /** the part's summary when it finished, JSON */
    summary: text('summary'),
    error: text('error'),
    /** how many times a worker started it */
    attempts: integer('attempts').notNull().default(0),
    startedAt: integer('started_at', { mode: 'timestamp_ms' }),
    finishedAt: integer('finished_at', { mode: 'timestamp_ms' }),
  },
  (t) => [primaryKey({ columns: [t.jobId, t.idx] })],
);
