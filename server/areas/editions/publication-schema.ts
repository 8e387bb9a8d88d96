import { sql } from 'drizzle-orm';
import { check, integer, sqliteTable, text } from 'drizzle-orm/sqlite-core';

// Publications: a title with its page template, cadence, solution rule, reuse window and
// fee rates per puzzle kind (integer minor units; payouts read these).

const nowMs = sql`(cast(unixepoch('subsecond') * 1000 as integer))`;

export const publication = sqliteTable(
  'publication',
  {
    id: text('id').primaryKey(),
    title: text('title').notNull().unique(),
    publisher: text('publisher').notNull(),
    /** id of a page template in templates/pages (validated against the loaded templates) */
    templateId: text('template_id').notNull(),
    cadence: text('cadence', { enum: ['weekly', 'fortnightly', 'monthly', 'quarterly', 'irregular'] }).notNull(),
    solutionRule: text('solution_rule', { enum: ['same_edition', 'next_edition'] }).notNull(),
    reuseWindowDays: integer('reuse_window_days').notNull(),
    currency: text('currency').notNull(),
    feeAssemblyMinor: integer('fee_assembly_minor').notNull(),
    feeDeductionMinor: integer('fee_deduction_minor').notNull(),
    createdAt: integer('created_at', { mode: 'timestamp_ms' }).notNull().default(nowMs),
    updatedAt: integer('updated_at', { mode: 'timestamp_ms' }).notNull().default(nowMs),
  },
  (t) => [
    check('publication_fees_check', sql`${t.feeAssemblyMinor} >= 0 and ${t.feeDeductionMinor} >= 0`),
    check('publication_window_check', sql`${t.reuseWindowDays} >= 0`),
    check('publication_currency_check', sql`length(${t.currency}) = 3`),
  ],
);
