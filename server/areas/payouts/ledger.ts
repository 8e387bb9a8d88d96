import { randomUUID } from 'node:crypto';
import { and, asc, eq, inArray, like, sql } from 'drizzle-orm';
import {
  ledgerCorrectionInputSchema,
  publicationFeesInputSchema,
  toDecimalString,
  type CurrencyTotal,
  type LedgerCorrectionInput,
  type LedgerEntry,
  type PublicationFeesInput,
  type Statement,
} from '../../../shared/contracts/ledger';
import type { DbOrTx } from '../../platform/db/client';
import type { FeeRecorder } from '../editions/ports';
import { user } from '../../platform/auth/schema';
import { ledgerEntry, payout } from './schema';
import { edition, publication } from '../editions/index';

// The setters' fee ledger. Append-only: fees are written by the publish step, corrections
// by editors, and nothing is ever updated or deleted.

export class LedgerError extends Error {
  constructor(
    readonly code: 'not_found' | 'bad_input' | 'conflict',
    message: string,
    readonly details?: unknown,
  ) {
    super(message);
    this.name = 'LedgerError';
  }
}

const entryColumns = {
  id: ledgerEntry.id,
  kind: ledgerEntry.kind,
  setterId: ledgerEntry.setterId,
  editionId: ledgerEntry.editionId,
  publicationId: ledgerEntry.publicationId,
  puzzleId: ledgerEntry.puzzleId,
  puzzleKind: ledgerEntry.puzzleKind,
  amountMinor: ledgerEntry.amountMinor,
  currency: ledgerEntry.currency,
  entryDate: ledgerEntry.entryDate,
  reason: ledgerEntry.reason,
  correctsEntryId: ledgerEntry.correctsEntryId,
  createdAt: ledgerEntry.createdAt,
};

type EntryRow = Omit<typeof ledgerEntry.$inferSelect, 'createdBy'>;

function toEntry(row: EntryRow): LedgerEntry {
  return {
    id: row.id,
    kind: row.kind,
    setterId: row.setterId,
    editionId: row.editionId,
    publicationId: row.publicationId,
    puzzleId: row.puzzleId,
    puzzleKind: row.puzzleKind,
    amountMinor: row.amountMinor,
    currency: row.currency,
    date: row.entryDate,
    reason: row.reason,
    correctsEntryId: row.correctsEntryId,
    createdAt: row.createdAt.toISOString(),
  };
}

/** Today's date in UTC, YYYY-MM-DD. */
export function todayIso(now: Date = new Date()): string {
  return now.toISOString().slice(0, 10);
}

/**
 * Writes one fee entry per printed puzzle of a published edition. Call it with the
 * transaction handle of the publish step, so fees and the edition's new state commit or
 * roll back together. Repeating it for the same edition adds nothing (one fee per puzzle
 * per edition, enforced by a unique index). Returns the entries written by this call.
 */
export function recordPublicationFees(tx: DbOrTx, input: PublicationFeesInput): LedgerEntry[] {
  const parsed = publicationFeesInputSchema.parse(input);
  const written: LedgerEntry[] = [];
  for (const entry of parsed.entries) {
    const rows = tx
      .insert(ledgerEntry)
      .values({
        id: randomUUID(),
        kind: 'fee',
        setterId: entry.setterId,
        editionId: parsed.editionId,
        publicationId: parsed.publicationId,
        puzzleId: entry.puzzleId,
        puzzleKind: entry.kind,
        amountMinor: entry.amountMinor,
        currency: entry.currency,
        entryDate: parsed.date,
      })
      .onConflictDoNothing()
      .returning(entryColumns)
      .all();
    for (const row of rows) written.push(toEntry(row));
  }
  return written;
}

/** Fees into the ledger when an edition is published (FeeRecorder in ../editions/ports.ts). */
export const feeRecorder: FeeRecorder = { recordPublicationFees: (tx, input) => void recordPublicationFees(tx, input) };

/** Records a correction (positive or negative) as a new entry, never an edit. */
export function recordCorrection(tx: DbOrTx, input: LedgerCorrectionInput, createdBy: string | null, now: Date = new Date()): LedgerEntry {
  const parsed = ledgerCorrectionInputSchema.parse(input);
  const setter = tx.select({ id: user.id, role: user.role }).from(user).where(eq(user.id, parsed.setterId)).get();
  if (!setter) throw new LedgerError('not_found', `setter ${parsed.setterId} does not exist`, { path: ['setterId'] });
  if (setter.role !== 'setter') throw new LedgerError('bad_input', `user ${parsed.setterId} is not a setter`, { path: ['setterId'] });
  if (parsed.correctsEntryId) {
    const target = tx
      .select({ setterId: ledgerEntry.setterId, currency: ledgerEntry.currency })
      .from(ledgerEntry)
      .where(eq(ledgerEntry.id, parsed.correctsEntryId))
      .get();
    if (!target) throw new LedgerError('not_found', `ledger entry ${parsed.correctsEntryId} does not exist`, { path: ['correctsEntryId'] });
    if (target.setterId !== parsed.setterId) {
      throw new LedgerError('bad_input', `ledger entry ${parsed.correctsEntryId} belongs to another setter`, { path: ['correctsEntryId'] });
    }
    if (target.currency !== parsed.currency) {
      throw new LedgerError('bad_input', `ledger entry ${parsed.correctsEntryId} is in ${target.currency}, not ${parsed.currency}`, { path: ['currency'] });
    }
  }
  const row = tx
    .insert(ledgerEntry)
    .values({
      id: randomUUID(),
      kind: 'correction',
      setterId: parsed.setterId,
      amountMinor: parsed.amountMinor,
      currency: parsed.currency,
      entryDate: parsed.date ?? todayIso(now),
      reason: parsed.reason,
      correctsEntryId: parsed.correctsEntryId ?? null,
      createdBy,
    })
    .returning(entryColumns)
    .get();
  return toEntry(row);
}

/** A setter's entries, oldest first; optionally only one month (YYYY-MM). */
export function listEntries(db: DbOrTx, setterId: string, month?: string): LedgerEntry[] {
  const where = month
    ? and(eq(ledgerEntry.setterId, setterId), like(ledgerEntry.entryDate, `${month}-%`))
    : eq(ledgerEntry.setterId, setterId);
  return db
    .select(entryColumns)
    .from(ledgerEntry)
    .where(where)
    // same day: in the order written (rowid), so a statement lists an edition's puzzles in slot order
    .orderBy(asc(ledgerEntry.entryDate), asc(sql`ledger_entry.rowid`))
    .all()
    .map(toEntry);
}

/** Sums amounts per currency, currencies in alphabetical order. */
export function totalsByCurrency(items: readonly { currency: string; amountMinor: number }[]): CurrencyTotal[] {
  const sums = new Map<string, number>();
  for (const item of items) sums.set(item.currency, (sums.get(item.currency) ?? 0) + item.amountMinor);
  return [...sums.entries()].sort(([a], [b]) => a.localeCompare(b)).map(([currency, amountMinor]) => ({ currency, amountMinor }));
}

/** Months (YYYY-MM) that have entries for a setter, newest first, with their totals. */
export function listStatementMonths(db: DbOrTx, setterId: string): { month: string; entryCount: number; totals: CurrencyTotal[] }[] {
  const rows = db
    .select({
      month: sql<string>`substr(${ledgerEntry.entryDate}, 1, 7)`,
      currency: ledgerEntry.currency,
      amountMinor: sql<number>`sum(${ledgerEntry.amountMinor})`,
      entryCount: sql<number>`count(*)`,
    })
    .from(ledgerEntry)
    .where(eq(ledgerEntry.setterId, setterId))
    .groupBy(sql`substr(${ledgerEntry.entryDate}, 1, 7)`, ledgerEntry.currency)
    .all();
  const byMonth = new Map<string, { month: string; entryCount: number; totals: CurrencyTotal[] }>();
  for (const row of rows) {
    const item = byMonth.get(row.month) ?? { month: row.month, entryCount: 0, totals: [] };
    item.entryCount += Number(row.entryCount);
    item.totals.push({ currency: row.currency, amountMinor: Number(row.amountMinor) });
    byMonth.set(row.month, item);
  }
  for (const item of byMonth.values()) item.totals.sort((a, b) => a.currency.localeCompare(b.currency));
  return [...byMonth.values()].sort((a, b) => b.month.localeCompare(a.month));
}

/** First and last instant of a YYYY-MM month in UTC, as [start, end). */
function monthRange(month: string): [Date, Date] {
  const [y, m] = month.split('-').map(Number) as [number, number];
  return [new Date(Date.UTC(y, m - 1, 1)), new Date(Date.UTC(y, m, 1))];
}

/** A setter's statement for one month: its entries, totals, and what was paid in it. */
export function buildStatement(db: DbOrTx, setterId: string, month: string): Statement {
  const setter = db.select({ id: user.id, name: user.name }).from(user).where(eq(user.id, setterId)).get();
  if (!setter) throw new LedgerError('not_found', `setter ${setterId} does not exist`);
  const entries = listEntries(db, setterId, month);
  const [start, end] = monthRange(month);
  const paidRows = db
    .select({ currency: payout.currency, amountMinor: payout.amountMinor, paidAt: payout.paidAt })
    .from(payout)
    .where(and(eq(payout.setterId, setterId), eq(payout.state, 'paid')))
    .all()
    .filter((row) => row.paidAt !== null && row.paidAt >= start && row.paidAt < end);
  return {
    setterId,
    setterName: setter.name,
    month,
    entries,
    totals: totalsByCurrency(entries),
    paid: totalsByCurrency(paidRows),
  };
}

/** One CSV field (RFC 4180 quoting); a leading = + - @ is defused so spreadsheets show text. */
function csvField(value: string): string {
  const safe = /^[=+\-@\t\r]/.test(value) && !/^-?\d+(\.\d+)?$/.test(value) ? `'${value}` : value;
  return /[",\r\n]/.test(safe) ? `"${safe.replaceAll('"', '""')}"` : safe;
}

/** Editions by id as people name them: the publication's title and the edition's number (for statements). */
export type EditionNames = Map<string, { publication: string; number: number }>;

/** The names of the editions a statement's entries refer to (read-only join on the editions area's tables). */
export function editionNamesOf(db: DbOrTx, statement: Statement): EditionNames {
  const ids = [...new Set(statement.entries.map((e) => e.editionId).filter((x): x is string => x !== null && x !== undefined))];
  if (ids.length === 0) return new Map();
  const rows = db
    .select({ id: edition.id, number: edition.number, title: publication.title })
    .from(edition)
    .innerJoin(publication, eq(publication.id, edition.publicationId))
    .where(inArray(edition.id, ids))
    .all();
  return new Map(rows.map((r) => [r.id, { publication: r.title, number: r.number }]));
}

function editionText(names: EditionNames, id: string | null | undefined): string {
  if (!id) return '';
  const n = names.get(id);
  return n ? `${n.publication} No. ${n.number}` : 'an edition no longer on file';
}

function describe(entry: LedgerEntry, names: EditionNames): string {
  if (entry.kind === 'fee') return `Fee for ${entry.puzzleKind ?? 'a'} puzzle ${entry.puzzleId ?? ''} in ${editionText(names, entry.editionId)}`.trim();
  return `Correction: ${entry.reason ?? ''}`;
}

/** The statement as CSV (header row, one row per entry, then a total row per currency); editions and publications by name, never by internal id. */
export function statementCsv(statement: Statement, names: EditionNames = new Map()): string {
  const header = ['date', 'kind', 'description', 'edition', 'publication', 'puzzle', 'puzzle_kind', 'currency', 'amount', 'amount_minor'];
  const lines = [header.join(',')];
  for (const e of statement.entries) {
    const n = e.editionId ? names.get(e.editionId) : undefined;
    lines.push(
      [e.date, e.kind, describe(e, names), e.editionId ? (n ? `No. ${n.number}` : editionText(names, e.editionId)) : '', n?.publication ?? '', e.puzzleId ?? '', e.puzzleKind ?? '', e.currency, toDecimalString(e.amountMinor, e.currency), String(e.amountMinor)]
        .map(csvField)
        .join(','),
    );
  }
  for (const t of statement.totals) {
    lines.push(['', 'total', `Total for ${statement.month}`, '', '', '', '', t.currency, toDecimalString(t.amountMinor, t.currency), String(t.amountMinor)].map(csvField).join(','));
  }
  return `${lines.join('\r\n')}\r\n`;
}

/** Sum of amountMinor per setter and currency in the ledger or the payouts (one setter's, or everyone's). */
function sumsPerSetterAndCurrency(db: DbOrTx, table: typeof ledgerEntry | typeof payout, setterId: string | undefined) {
  return db
    .select({ setterId: table.setterId, currency: table.currency, total: sql<number>`sum(${table.amountMinor})` })
    .from(table)
    .where(setterId ? eq(table.setterId, setterId) : undefined)
    .groupBy(table.setterId, table.currency)
    .all();
}

/**
 * What each setter is owed per currency: all ledger entries minus every payout made
 * (pending, paid or failed: a failed payout keeps its money until it is retried, so a
 * new run can never pay the same fees again). Rows with nothing owed are left out.
 */
export function owedBalances(db: DbOrTx, setterId?: string): { setterId: string; currency: string; owedMinor: number }[] {
  const earned = sumsPerSetterAndCurrency(db, ledgerEntry, setterId);
  const paidOut = sumsPerSetterAndCurrency(db, payout, setterId);
  const key = (s: string, c: string) => `${s}\u0000${c}`;
  const out = new Map<string, number>();
  for (const row of paidOut) out.set(key(row.setterId, row.currency), Number(row.total));
  return earned
    .map((row) => ({ setterId: row.setterId, currency: row.currency, owedMinor: Number(row.total) - (out.get(key(row.setterId, row.currency)) ?? 0) }))
    .filter((row) => row.owedMinor > 0)
    .sort((a, b) => a.setterId.localeCompare(b.setterId) || a.currency.localeCompare(b.currency));
}
