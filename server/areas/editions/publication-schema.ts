import { sql } from 'drizzle-orm';
import { blob, check, index, integer, primaryKey, real, sqliteTable, text } from 'drizzle-orm/sqlite-core';
import { user } from '../../platform/auth/schema';

// Publications: a title with its page template, cadence, solution rule, reuse window and
// fee rates per puzzle kind (integer minor units; payouts read these), its press spec (null
// fields: the template's default), the printers assigned to it, and the plants' ICC output
// profiles (PDF/X-4), kept by their SHA-256 so a proof's document names the one it used.

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
    /** press spec: 'pdfx-1a' | 'pdfx-4' (null: the template's) */
    pressStandard: text('press_standard', { enum: ['pdfx-1a', 'pdfx-4'] }),
    /** a registered output condition (shared/contracts/press.ts outputConditions) */
    pressCondition: text('press_condition'),
    pressBleedMm: real('press_bleed_mm'),
    pressMinTypePt: real('press_min_type_pt'),
    pressMinLinePt: real('press_min_line_pt'),
    /** the plant's output profile (PDF/X-4) */
    outputProfileSha256: text('output_profile_sha256').references(() => outputProfile.sha256, { onDelete: 'restrict' }),
    createdAt: integer('created_at', { mode: 'timestamp_ms' }).notNull().default(nowMs),
    updatedAt: integer('updated_at', { mode: 'timestamp_ms' }).notNull().default(nowMs),
  },
  (t) => [
    check('publication_fees_check', sql`${t.feeAssemblyMinor} >= 0 and ${t.feeDeductionMinor} >= 0`),
    check('publication_window_check', sql`${t.reuseWindowDays} >= 0`),
    check('publication_currency_check', sql`length(${t.currency}) = 3`),
  ],
);

/** ICC output profiles uploaded by admins (the plant's), by content; never changed once stored. */
export const outputProfile = sqliteTable('output_profile', {
  sha256: text('sha256').primaryKey(),
  description: text('description').notNull(),
  icc: blob('icc', { mode: 'buffer' }).notNull(),
  uploadedBy: text('uploaded_by').references(() => user.id, { onDelete: 'set null' }),
  uploadedAt: integer('uploaded_at', { mode: 'timestamp_ms' }).notNull().default(nowMs),
});

/** The printers of a publication: they see, download and decide its proofs, and get its proof mail. */
export const publicationPrinter = sqliteTable(
  'publication_printer',
  {
    publicationId: text('publication_id')
      .notNull()
      .references(() => publication.id, { onDelete: 'cascade' }),
    userId: text('user_id')
      .notNull()
      .references(() => user.id, { onDelete: 'cascade' }),
  },
  (t) => [primaryKey({ columns: [t.publicationId, t.userId] }), index('publication_printer_user_idx').on(t.userId)],
);
