import { sql } from 'drizzle-orm';
import { check, index, integer, sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core';
import { user } from '../../platform/auth/schema';

// The setters' fee ledger, payout runs and the provider's webhook events.
// Money is always an integer of minor units with its ISO 4217 currency beside it.
// Ledger entries are append-only: a correction is a new entry, never an edit.

const nowMs = sql`(cast(unixepoch('subsecond') * 1000 as integer))`;

export const ledgerEntry = sqliteTable(
  'ledger_entry',
  {
    id: text('id').primaryKey(),
    kind: text('kind', { enum: ['fee', 'correction'] }).notNull(),
    setterId: text('setter_id')
      .notNull()
      .references(() => user.id, { onDelete: 'restrict' }),
    // The print area's edition/publication/puzzle ids (no foreign key: the ledger must
    // outlive any later tidy-up of editions).
    editionId: text('edition_id'),
    publicationId: text('publication_id'),
    puzzleId: text('puzzle_id'),
    puzzleKind: text('puzzle_kind', { enum: ['assembly', 'deduction'] }),
    amountMinor: integer('amount_minor').notNull(),
    currency: text('currency').notNull(),
    /** YYYY-MM-DD: the publication date for a fee, the effective date for a correction. */
    entryDate: text('entry_date').notNull(),
    reason: text('reason'),
    correctsEntryId: text('corrects_entry_id'),
    createdBy: text('created_by').references(() => user.id, { onDelete: 'set null' }),
    createdAt: integer('created_at', { mode: 'timestamp_ms' }).notNull().default(nowMs),
  },
  (t) => [
    index('ledger_entry_setter_date_idx').on(t.setterId, t.entryDate),
    // One fee per printed puzzle per edition, whatever retries the publish step makes.
    uniqueIndex('ledger_entry_fee_once_idx').on(t.editionId, t.puzzleId).where(sql`kind = 'fee'`),
    check('ledger_entry_currency_check', sql`length(${t.currency}) = 3`),
  ],
);

/** A setter's account at the payments provider: its id and a hint, never bank numbers. */
export const payoutAccount = sqliteTable('payout_account', {
  setterId: text('setter_id')
    .primaryKey()
    .references(() => user.id, { onDelete: 'restrict' }),
  providerAccountId: text('provider_account_id').notNull().unique(),
  status: text('status', { enum: ['onboarding', 'ready'] }).notNull(),
  displayHint: text('display_hint').notNull(),
  createdAt: integer('created_at', { mode: 'timestamp_ms' }).notNull().default(nowMs),
  updatedAt: integer('updated_at', { mode: 'timestamp_ms' }).notNull().default(nowMs),
});

export const payoutRun = sqliteTable('payout_run', {
  id: text('id').primaryKey(),
  /** The client's key for one confirmation: a repeat returns this run. */
  requestKey: text('request_key').notNull().unique(),
  createdBy: text('created_by').references(() => user.id, { onDelete: 'set null' }),
  createdAt: integer('created_at', { mode: 'timestamp_ms' }).notNull().default(nowMs),
});

export const payout = sqliteTable(
  'payout',
  {
    id: text('id').primaryKey(),
    runId: text('run_id')
      .notNull()
      .references(() => payoutRun.id, { onDelete: 'restrict' }),
    setterId: text('setter_id')
      .notNull()
      .references(() => user.id, { onDelete: 'restrict' }),
    providerAccountId: text('provider_account_id').notNull(),
    amountMinor: integer('amount_minor').notNull(),
    currency: text('currency').notNull(),
    state: text('state', { enum: ['pending', 'paid', 'failed'] }).notNull().default('pending'),
    attempt: integer('attempt').notNull().default(1),
    /** Money moved from us to the setter's provider account (once per payout). */
    providerTransferId: text('provider_transfer_id'),
    /** The provider's payout to the setter's bank for the current attempt. */
    providerPayoutId: text('provider_payout_id'),
    failureMessage: text('failure_message'),
    /** Last transient error (network, provider 5xx); the payout stays pending and is resumed. */
    lastError: text('last_error'),
    createdAt: integer('created_at', { mode: 'timestamp_ms' }).notNull().default(nowMs),
    updatedAt: integer('updated_at', { mode: 'timestamp_ms' }).notNull().default(nowMs),
    paidAt: integer('paid_at', { mode: 'timestamp_ms' }),
  },
  (t) => [
    index('payout_setter_idx').on(t.setterId),
    index('payout_run_idx').on(t.runId),
    index('payout_provider_payout_idx').on(t.providerPayoutId),
    check('payout_amount_positive', sql`${t.amountMinor} > 0`),
  ],
);

/** Provider webhook events already applied (the provider may deliver one more than once). */
export const paymentEvent = sqliteTable('payment_event', {
  id: text('id').primaryKey(),
  type: text('type').notNull(),
  payoutId: text('payout_id'),
  receivedAt: integer('received_at', { mode: 'timestamp_ms' }).notNull().default(nowMs),
});

/** Monthly statements already mailed (so a month close does not mail twice). */
export const statementMailing = sqliteTable(
  'statement_mailing',
  {
    setterId: text('setter_id')
      .notNull()
      .references(() => user.id, { onDelete: 'restrict' }),
    month: text('month').notNull(),
    sentAt: integer('sent_at', { mode: 'timestamp_ms' }).notNull().default(nowMs),
  },
  (t) => [uniqueIndex('statement_mailing_once_idx').on(t.setterId, t.month)],
);
