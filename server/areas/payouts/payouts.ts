import { randomUUID } from 'node:crypto';
import { and, asc, desc, eq, inArray, isNull, ne, or } from 'drizzle-orm';
import { formatMoney, toDecimalString, type CurrencyTotal } from '../../../shared/contracts/ledger';
import type {
  CreatePayoutRunInput,
  CreatePayoutRunResponse,
  Earnings,
  Payout,
  PayoutDetails,
  PayoutDetailsInput,
  PayoutRun,
  PayoutsOverview,
} from '../../../shared/contracts/payouts';
import type { Clock } from '../../platform/clock';
import type { Db, DbOrTx } from '../../platform/db/client';
import { user } from '../../platform/auth/schema';
import { payout, payoutAccount, paymentEvent, payoutRun, statementMailing } from './schema';
import type { Logger } from '../../platform/log';
import type { EventSink } from '../../platform/events';
import { queueMail } from '../../platform/mail/outbox';
import { ProviderRefused, ProviderUnavailable, summariseAccount, type AccountSummary, type PaymentsProvider, type ProviderEvent, type ProviderPayout } from './provider';
import { buildStatement, listEntries, listStatementMonths, owedBalances } from './ledger';

// Payout runs: an editor pays setters what the ledger says they are owed, through the
// payments provider. Every provider call carries an idempotency key derived from the
// payout's id and attempt, and the payout row is committed before the first call, so a
// repeated click, a retried request or a restart replays the same provider objects
// instead of paying twice. The provider's signed webhook moves a payout from pending to
// paid or failed; a failed payout can be retried (a new attempt, a new key).

export type PayoutsDeps = {
  db: Db;
  provider: PaymentsProvider;
  clock: Clock;
  log: Logger;
  /** Absolute base URL of the app (for the provider's return links). */
  publicUrl: string;
  /** Wake the mail sender after a commit that queued mail. */
  kickMail?: () => void;
  /** Outgoing events (payout.paid), emitted in the transaction that marks a payout paid. */
  events?: EventSink;
  /** Test seam: runs right after each successful provider call, before its result is stored. */
  afterProviderCall?: (step: 'transfer' | 'payout', payoutId: string) => void;
};

export class PayoutError extends Error {
  constructor(
    readonly code: 'not_found' | 'conflict' | 'unavailable' | 'bad_input',
    message: string,
    readonly details?: unknown,
  ) {
    super(message);
    this.name = 'PayoutError';
  }
}

/** The idempotency key of one provider call: stable across repeats and restarts, new per attempt. */
export function payoutIdempotencyKey(payoutId: string, attempt: number, step: 'transfer' | 'payout'): string {
  return `sw-payout-${payoutId}-a${attempt}-${step}`;
}

const payoutColumns = {
  id: payout.id,
  runId: payout.runId,
  setterId: payout.setterId,
  setterName: user.name,
  amountMinor: payout.amountMinor,
  currency: payout.currency,
  state: payout.state,
  attempt: payout.attempt,
  failureMessage: payout.failureMessage,
  createdAt: payout.createdAt,
  updatedAt: payout.updatedAt,
  paidAt: payout.paidAt,
};

type PayoutRow = {
  id: string;
  runId: string;
  setterId: string;
  setterName: string;
  amountMinor: number;
  currency: string;
  state: 'pending' | 'paid' | 'failed';
  attempt: number;
  failureMessage: string | null;
  createdAt: Date;
  updatedAt: Date;
  paidAt: Date | null;
};

function toPayout(row: PayoutRow): Payout {
  return {
    ...row,
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
    paidAt: row.paidAt ? row.paidAt.toISOString() : null,
  };
}

function listPayouts(db: DbOrTx, where: ReturnType<typeof eq> | undefined): Payout[] {
  return db
    .select(payoutColumns)
    .from(payout)
    .innerJoin(user, eq(user.id, payout.setterId))
    .where(where)
    .orderBy(desc(payout.createdAt), asc(payout.id))
    .all()
    .map(toPayout);
}

export function getPayout(db: DbOrTx, payoutId: string): Payout {
  const [found] = listPayouts(db, eq(payout.id, payoutId));
  if (!found) throw new PayoutError('not_found', `payout ${payoutId} does not exist`);
  return found;
}

function loadRun(db: DbOrTx, runId: string): PayoutRun {
  const run = db
    .select({ id: payoutRun.id, createdAt: payoutRun.createdAt, createdByName: user.name })
    .from(payoutRun)
    .leftJoin(user, eq(user.id, payoutRun.createdBy))
    .where(eq(payoutRun.id, runId))
    .get();
  if (!run) throw new PayoutError('not_found', `payout run ${runId} does not exist`);
  return { id: run.id, createdAt: run.createdAt.toISOString(), createdByName: run.createdByName ?? '(removed user)', payouts: listPayouts(db, eq(payout.runId, runId)) };
}

/** These users with their payout details at the provider (null columns when they have none), by id. */
function settersWithDetails(db: DbOrTx, setterIds: readonly string[]) {
  const ids = [...new Set(setterIds)];
  const rows = ids.length
    ? db
        .select({ id: user.id, name: user.name, email: user.email, accountId: payoutAccount.providerAccountId, status: payoutAccount.status, hint: payoutAccount.displayHint })
        .from(user)
        .leftJoin(payoutAccount, eq(payoutAccount.setterId, user.id))
        .where(inArray(user.id, ids))
        .all()
    : [];
  return new Map(rows.map((s) => [s.id, s]));
}

/** GET /api/payouts: what is owed per setter and currency, and every run with its payouts. */
export function payoutsOverview(db: DbOrTx, limitRuns = 50): PayoutsOverview {
  const balances = owedBalances(db);
  const byId = settersWithDetails(db, balances.map((b) => b.setterId));
  const owed = balances
    .map((b) => {
      const s = byId.get(b.setterId);
      return {
        setterId: b.setterId,
        setterName: s?.name ?? b.setterId,
        email: s?.email ?? '',
        currency: b.currency,
        owedMinor: b.owedMinor,
        detailsStatus: s?.status ?? null,
        detailsHint: s?.hint ?? null,
      };
    })
    .sort((a, b) => a.setterName.localeCompare(b.setterName) || a.currency.localeCompare(b.currency));
  const runIds = db.select({ id: payoutRun.id }).from(payoutRun).orderBy(desc(payoutRun.createdAt), desc(payoutRun.id)).limit(limitRuns).all();
  return { owed, runs: runIds.map((r) => loadRun(db, r.id)) };
}

/**
 * Creates a payout run for the setters owed (all, or those named) who have finished their
 * payout details, then submits each payout to the provider. The same requestKey again
 * returns the first run and pays nothing new.
 */
export async function createPayoutRun(deps: PayoutsDeps, createdBy: string, input: CreatePayoutRunInput): Promise<CreatePayoutRunResponse> {
  const { db, clock } = deps;
  const created = db.transaction((tx) => {
    const existing = tx.select({ id: payoutRun.id }).from(payoutRun).where(eq(payoutRun.requestKey, input.requestKey)).get();
    if (existing) return { runId: existing.id, replayed: true, skipped: [] as CreatePayoutRunResponse['skipped'], payoutIds: [] as string[] };
    const balances = owedBalances(tx).filter((b) => !input.setterIds || input.setterIds.includes(b.setterId));
    const skipped: CreatePayoutRunResponse['skipped'] = [];
    const setters = settersWithDetails(tx, [...balances.map((b) => b.setterId), ...(input.setterIds ?? [])]);
    for (const id of input.setterIds ?? []) {
      if (!balances.some((b) => b.setterId === id)) skipped.push({ setterId: id, setterName: setters.get(id)?.name ?? id, reason: 'nothing is owed' });
    }
    const toPay: { setterId: string; accountId: string; currency: string; amountMinor: number }[] = [];
    for (const b of balances) {
      const s = setters.get(b.setterId);
      if (!s?.accountId || s.status !== 'ready') {
        skipped.push({ setterId: b.setterId, setterName: s?.name ?? b.setterId, reason: s?.accountId ? 'payout details not finished' : 'no payout details yet' });
        continue;
      }
      toPay.push({ setterId: b.setterId, accountId: s.accountId, currency: b.currency, amountMinor: b.owedMinor });
    }
    if (toPay.length === 0) {
      throw new PayoutError('conflict', 'Nothing to pay: no setter is owed money and has finished payout details.', { skipped });
    }
    const runId = randomUUID();
    const now = clock.now();
    tx.insert(payoutRun).values({ id: runId, requestKey: input.requestKey, createdBy, createdAt: now }).run();
    const payoutIds: string[] = [];
    for (const p of toPay) {
      const id = randomUUID();
      payoutIds.push(id);
      tx.insert(payout)
        .values({ id, runId, setterId: p.setterId, providerAccountId: p.accountId, amountMinor: p.amountMinor, currency: p.currency, state: 'pending', attempt: 1, createdAt: now, updatedAt: now })
        .run();
    }
    return { runId, replayed: false, skipped, payoutIds };
  });
  // Committed: from here on a crash is recovered by resumePendingPayouts with the same keys.
  const toSubmit = created.replayed
    ? db.select({ id: payout.id }).from(payout).where(and(eq(payout.runId, created.runId), eq(payout.state, 'pending'), isNull(payout.providerPayoutId))).all().map((r) => r.id)
    : created.payoutIds;
  for (const id of toSubmit) await submitPayout(deps, id);
  return { run: loadRun(db, created.runId), replayed: created.replayed, skipped: created.skipped };
}

/** Messages kept with a payout are cut to this length. */
const maxMessage = 500;

/** Ends a pending payout, paid or failed; one that is no longer pending is left as it is. */
/** Ends a pending payout; true when this call ended it (false: it was no longer pending). */
function endPending(tx: DbOrTx, payoutId: string, now: Date, outcome: { state: 'paid' } | { state: 'failed'; message: string }): boolean {
  const change = outcome.state === 'paid' ? { state: 'paid' as const, paidAt: now } : { state: 'failed' as const, failureMessage: outcome.message.slice(0, maxMessage) };
  return tx.update(payout).set({ ...change, lastError: null, updatedAt: now }).where(and(eq(payout.id, payoutId), eq(payout.state, 'pending'))).run().changes > 0;
}

function markFailed(deps: PayoutsDeps, payoutId: string, message: string): void {
  endPending(deps.db, payoutId, deps.clock.now(), { state: 'failed', message });
  deps.log.warn(`payout ${payoutId} failed: ${message}`);
}

function noteTransient(deps: PayoutsDeps, payoutId: string, message: string): void {
  deps.db.update(payout).set({ lastError: message.slice(0, maxMessage), updatedAt: deps.clock.now() }).where(eq(payout.id, payoutId)).run();
  deps.log.warn(`payout ${payoutId} stays pending (provider unavailable): ${message}`);
}

/** Applies the provider's view of a payout (from an answer or a webhook) to ours; true when it changed ours. */
function applyProviderPayout(deps: PayoutsDeps, tx: DbOrTx, payoutId: string, remote: ProviderPayout): boolean {
  if (remote.status === 'paid') {
    const now = deps.clock.now();
    const ended = endPending(tx, payoutId, now, { state: 'paid' });
    if (ended && deps.events) {
      const p = tx.select({ amountMinor: payout.amountMinor, currency: payout.currency }).from(payout).where(eq(payout.id, payoutId)).get();
      if (p) deps.events.emit(tx, 'payout.paid', { payout: { id: payoutId, amountMinor: p.amountMinor, currency: p.currency, paidAt: now.toISOString() } });
    }
    if (ended) mailPaid(deps, tx, payoutId, now);
    return ended;
  }
  if (remote.status === 'failed' || remote.status === 'canceled') {
    return endPending(tx, payoutId, deps.clock.now(), { state: 'failed', message: remote.failure_message ?? `the provider reports the payout ${remote.status}` });
  }
  return false;
}

/**
 * Sends one pending payout to the provider: first the transfer to the setter's provider
 * account (once per payout), then the payout to their bank (once per attempt). Safe to
 * call any number of times: each step is skipped when done and replayed by key otherwise.
 */
export async function submitPayout(deps: PayoutsDeps, payoutId: string): Promise<void> {
  const { db, provider } = deps;
  const row = db
    .select({ id: payout.id, state: payout.state, attempt: payout.attempt, accountId: payout.providerAccountId, amountMinor: payout.amountMinor, currency: payout.currency, transferId: payout.providerTransferId, providerPayoutId: payout.providerPayoutId })
    .from(payout)
    .where(eq(payout.id, payoutId))
    .get();
  if (!row) throw new PayoutError('not_found', `payout ${payoutId} does not exist`);
  if (row.state !== 'pending') return;
  const money = { accountId: row.accountId, amountMinor: row.amountMinor, currency: row.currency, payoutId: row.id };
  try {
    let transferId = row.transferId;
    if (!transferId) {
      const transfer = await provider.createTransfer({ ...money, idempotencyKey: payoutIdempotencyKey(row.id, row.attempt, 'transfer') });
      deps.afterProviderCall?.('transfer', row.id);
      transferId = transfer.id;
      db.update(payout).set({ providerTransferId: transferId, updatedAt: deps.clock.now() }).where(eq(payout.id, row.id)).run();
    }
    if (!row.providerPayoutId) {
      const remote = await provider.createPayout({ ...money, idempotencyKey: payoutIdempotencyKey(row.id, row.attempt, 'payout') });
      deps.afterProviderCall?.('payout', row.id);
      db.transaction((tx) => {
        tx.update(payout).set({ providerPayoutId: remote.id, lastError: null, updatedAt: deps.clock.now() }).where(eq(payout.id, row.id)).run();
        applyProviderPayout(deps, tx, row.id, remote);
      });
    }
  } catch (error) {
    if (error instanceof ProviderRefused) return markFailed(deps, row.id, error.message);
    if (error instanceof ProviderUnavailable) return noteTransient(deps, row.id, error.message);
    throw error;
  }
}

/** POST /api/payouts/:id/retry: a failed payout becomes pending again as a new attempt. */
export async function retryPayout(deps: PayoutsDeps, payoutId: string): Promise<Payout> {
  const current = getPayout(deps.db, payoutId);
  if (current.state !== 'failed') throw new PayoutError('conflict', `payout ${payoutId} is ${current.state}; only a failed payout can be retried`);
  const account = payoutAccountOf(deps.db, current.setterId);
  if (!account || account.status !== 'ready') throw new PayoutError('conflict', `${current.setterName} has no finished payout details; the payout cannot be retried yet`);
  const changed = deps.db
    .update(payout)
    .set({ state: 'pending', attempt: current.attempt + 1, providerPayoutId: null, providerAccountId: account.accountId, failureMessage: null, lastError: null, updatedAt: deps.clock.now() })
    .where(and(eq(payout.id, payoutId), eq(payout.state, 'failed')))
    .run();
  if (changed.changes === 1) await submitPayout(deps, payoutId);
  return getPayout(deps.db, payoutId);
}

/**
 * At start-up (and whenever wanted): finishes what a crash or an outage left pending.
 * Unsent steps are sent again with the same keys (the provider replays, nothing is paid
 * twice); sent ones are read back from the provider in case a webhook was missed.
 */
export async function resumePendingPayouts(deps: PayoutsDeps): Promise<{ resumed: number }> {
  const pending = deps.db.select({ id: payout.id, accountId: payout.providerAccountId, providerPayoutId: payout.providerPayoutId }).from(payout).where(eq(payout.state, 'pending')).all();
  for (const p of pending) {
    if (!p.providerPayoutId) {
      await submitPayout(deps, p.id);
      continue;
    }
    try {
      const remote = await deps.provider.retrievePayout(p.accountId, p.providerPayoutId);
      deps.db.transaction((tx) => applyProviderPayout(deps, tx, p.id, remote));
    } catch (error) {
      deps.log.warn(`payout ${p.id}: could not read its state from the provider (${(error as Error).message})`);
    }
  }
  return { resumed: pending.length };
}

/** Our copy of a provider account's state (from an answer or a webhook). */
function accountState(deps: Pick<PayoutsDeps, 'clock'>, remote: AccountSummary) {
  return { status: remote.ready ? ('ready' as const) : ('onboarding' as const), displayHint: remote.hint, updatedAt: deps.clock.now() };
}

/** Applies one verified provider event; a repeated event id changes nothing. */
export function applyProviderEvent(deps: PayoutsDeps, event: ProviderEvent): 'applied' | 'duplicate' | 'ignored' {
  return deps.db.transaction((tx) => {
    let payoutId: string | null = null;
    if (event.type === 'payout.paid' || event.type === 'payout.failed') {
      payoutId = tx.select({ id: payout.id }).from(payout).where(eq(payout.providerPayoutId, event.data.object.id)).get()?.id ?? null;
    }
    const inserted = tx.insert(paymentEvent).values({ id: event.id, type: event.type, payoutId, receivedAt: deps.clock.now() }).onConflictDoNothing().returning({ id: paymentEvent.id }).all();
    if (inserted.length === 0) return 'duplicate';
    // an event that changes nothing of ours (an unknown account, a payout already settled,
    // an account whose state we already have) is 'ignored', not 'applied'
    if (event.type === 'account.updated') {
      const remote = summariseAccount(event.data.object);
      const next = accountState(deps, remote);
      const changed = tx
        .update(payoutAccount)
        .set(next)
        .where(and(eq(payoutAccount.providerAccountId, remote.id), or(ne(payoutAccount.status, next.status), ne(payoutAccount.displayHint, next.displayHint))))
        .run();
      return changed.changes > 0 ? 'applied' : 'ignored';
    }
    if (!payoutId) return 'ignored';
    return applyProviderPayout(deps, tx, payoutId, event.data.object) ? 'applied' : 'ignored';
  });
}

/** A setter's account at the provider as we keep it, or undefined. */
function payoutAccountOf(db: DbOrTx, setterId: string) {
  return db
    .select({ accountId: payoutAccount.providerAccountId, status: payoutAccount.status, hint: payoutAccount.displayHint, updatedAt: payoutAccount.updatedAt })
    .from(payoutAccount)
    .where(eq(payoutAccount.setterId, setterId))
    .get();
}

function detailsOf(db: DbOrTx, setterId: string): PayoutDetails | null {
  const row = payoutAccountOf(db, setterId);
  return row ? { status: row.status, hint: row.hint, updatedAt: row.updatedAt.toISOString() } : null;
}

/**
 * POST /api/earnings/payout-details: makes (once) the setter's account at the provider and
 * a link to the provider's hosted page where the setter enters bank details. We store the
 * provider's account id and a display hint, never bank numbers.
 */
export async function startPayoutDetails(deps: PayoutsDeps, setter: { id: string; email: string }, input: PayoutDetailsInput): Promise<{ details: PayoutDetails; onboardingUrl: string | null }> {
  const { db, provider } = deps;
  let row = payoutAccountOf(db, setter.id);
  try {
    if (!row) {
      const account = await provider.createAccount({ email: setter.email, country: input.country, setterId: setter.id });
      const now = deps.clock.now();
      db.insert(payoutAccount).values({ setterId: setter.id, providerAccountId: account.id, status: 'onboarding', displayHint: 'Details not finished', createdAt: now, updatedAt: now }).onConflictDoNothing().run();
      row = payoutAccountOf(db, setter.id);
    }
    if (!row) throw new PayoutError('unavailable', 'the payout account could not be stored');
    const back = `${deps.publicUrl}/earnings`;
    const link = await provider.createOnboardingLink({ accountId: row.accountId, returnUrl: `${back}?details=done`, refreshUrl: `${back}?details=again` });
    const details = detailsOf(db, setter.id);
    if (!details) throw new PayoutError('unavailable', 'the payout account could not be stored');
    return { details, onboardingUrl: link.url };
  } catch (error) {
    if (error instanceof ProviderRefused || error instanceof ProviderUnavailable) throw new PayoutError('unavailable', `The payments provider did not accept the request: ${error.message}`);
    throw error;
  }
}

/** Reads an unfinished account back from the provider (after the setter returns from its page). */
export async function refreshPayoutDetails(deps: PayoutsDeps, setterId: string): Promise<PayoutDetails | null> {
  const row = payoutAccountOf(deps.db, setterId);
  if (!row) return null;
  if (row.status === 'onboarding') {
    try {
      const remote = await deps.provider.getAccount(row.accountId);
      deps.db.update(payoutAccount).set(accountState(deps, remote)).where(eq(payoutAccount.setterId, setterId)).run();
    } catch (error) {
      deps.log.warn(`payout details of ${setterId}: provider not reachable (${(error as Error).message})`);
    }
  }
  return detailsOf(deps.db, setterId);
}

/** GET /api/earnings for one setter. */
export function earningsOf(db: DbOrTx, setterId: string, now: Date = new Date()): Earnings {
  const owed: CurrencyTotal[] = owedBalances(db, setterId).map((b) => ({ currency: b.currency, amountMinor: b.owedMinor }));
  return {
    month: now.toISOString().slice(0, 7),
    entries: listEntries(db, setterId).reverse(),
    statements: listStatementMonths(db, setterId),
    payouts: listPayouts(db, eq(payout.setterId, setterId)),
    owed,
    details: detailsOf(db, setterId),
  };
}

function statementMailData(db: DbOrTx, setterId: string, month: string, publicUrl: string) {
  const statement = buildStatement(db, setterId, month);
  const lines = statement.entries.length
    ? statement.entries
        .map((e) => `${e.date}  ${e.kind === 'fee' ? `fee, ${e.puzzleKind ?? 'puzzle'} ${e.puzzleId ?? ''}` : `correction: ${e.reason ?? ''}`}  ${toDecimalString(e.amountMinor, e.currency)} ${e.currency}`)
        .join('\n')
    : '(no entries this month)';
  const totals = statement.totals.map((t) => formatMoney(t.amountMinor, t.currency)).join(', ') || 'nothing';
  const paid = statement.paid.map((t) => formatMoney(t.amountMinor, t.currency)).join(', ') || 'nothing';
  return { statement, data: { name: statement.setterName, month, lines, totals, paid, link: `${publicUrl}/earnings` } };
}

/** "You have been paid": the amount and the statement of the month it was paid in, mailed to the setter in the transaction that marks the payout paid. */
function mailPaid(deps: Pick<PayoutsDeps, 'publicUrl' | 'kickMail'>, tx: DbOrTx, payoutId: string, now: Date): void {
  const p = tx
    .select({ setterId: payout.setterId, amountMinor: payout.amountMinor, currency: payout.currency, email: user.email })
    .from(payout)
    .innerJoin(user, eq(user.id, payout.setterId))
    .where(eq(payout.id, payoutId))
    .get();
  if (!p) return;
  const month = now.toISOString().slice(0, 7);
  const { data } = statementMailData(tx, p.setterId, month, deps.publicUrl);
  queueMail(tx, { to: p.email, template: 'payout-paid', data: { ...data, amount: formatMoney(p.amountMinor, p.currency), date: now.toISOString().slice(0, 10) } }, now);
  deps.kickMail?.();
}

/** What statements need: no provider. */
export type StatementDeps = Pick<PayoutsDeps, 'db' | 'clock' | 'publicUrl' | 'kickMail'>;

/** Queues a setter's monthly statement mail (POST /api/earnings/statements/:month/send). */
export function sendStatement(deps: StatementDeps, setterId: string, month: string): { to: string } {
  const to = deps.db.transaction((tx) => {
    const who = tx.select({ email: user.email }).from(user).where(eq(user.id, setterId)).get();
    if (!who) throw new PayoutError('not_found', `setter ${setterId} does not exist`);
    const { data } = statementMailData(tx, setterId, month, deps.publicUrl);
    queueMail(tx, { to: who.email, template: 'earnings-statement', data }, deps.clock.now());
    tx.insert(statementMailing).values({ setterId, month, sentAt: deps.clock.now() }).onConflictDoNothing().run();
    return who.email;
  });
  deps.kickMail?.();
  return { to };
}

/** Month close: mails the statement of `month` to every setter with entries in it who has not had it yet. */
export function closeMonth(deps: StatementDeps, month: string): { mailed: number } {
  const setters = deps.db.select({ id: user.id }).from(user).where(eq(user.role, 'setter')).all();
  let mailed = 0;
  for (const s of setters) {
    const already = deps.db.select({ m: statementMailing.month }).from(statementMailing).where(and(eq(statementMailing.setterId, s.id), eq(statementMailing.month, month))).get();
    if (already) continue;
    if (listEntries(deps.db, s.id, month).length === 0) continue;
    sendStatement(deps, s.id, month);
    mailed++;
  }
  return { mailed };
}

/** The month before `now`, YYYY-MM (UTC). */
export function previousMonth(now: Date): string {
  const d = new Date(Date.UTC(now.getUTCFullYear(), now.getUTCMonth() - 1, 1));
  return d.toISOString().slice(0, 7);
}
