import { accountById } from './accounts';
import type { FakeContext } from './context';
import { invalidRequest, noSuch } from './errors';
import { newId, nowSec } from './ids';
import { parseParams, payoutParams, transferParams, type FormFields } from './params';
import { addToBalance, balanceOf, type FakeState, type Payout, type Transfer } from './state';

// Money through the fake: a transfer moves money from the platform into a connected
// account's balance; a payout moves it from that balance to the account's bank. A payout
// is pending at first and settles a moment later (paid, or failed with the money back in
// the balance), reported by webhook like the provider's.

/** POST /v1/transfers (refused for an account flagged by failTransfersFor, or not onboarded). */
export function createTransfer(ctx: FakeContext, fields: FormFields): Transfer {
  const params = parseParams(transferParams, fields);
  const { amount, currency, destination } = params;
  const account = accountById(ctx.state, destination);
  const refusal = ctx.failures.transfers.get(destination);
  if (refusal) throw invalidRequest('account_invalid', refusal, 'destination');
  if (!account.details_submitted) {
    throw invalidRequest('account_invalid', `Account ${destination} has not finished onboarding; its transfers capability is inactive.`, 'destination');
  }
  addToBalance(ctx.state, destination, currency, amount);
  const transfer: Transfer = {
    id: newId('tr'),
    object: 'transfer',
    amount,
    currency,
    destination,
    created: nowSec(),
    metadata: params.metadata,
    transfer_group: params.transfer_group,
    reversed: false,
    livemode: false,
  };
  ctx.state.transfers.set(transfer.id, transfer);
  ctx.stats.created.transfers++;
  ctx.webhooks.send('transfer.created', transfer);
  return transfer;
}

/** POST /v1/payouts with the Stripe-Account header: a pending payout out of that account's balance. */
export function createPayout(ctx: FakeContext, fields: FormFields, stripeAccount: string | undefined): Payout {
  if (!stripeAccount) throw invalidRequest('parameter_missing', 'This fake pays out from connected accounts only: send the Stripe-Account header.');
  accountById(ctx.state, stripeAccount);
  const { amount, currency, metadata } = parseParams(payoutParams, fields);
  const balance = balanceOf(ctx.state, stripeAccount);
  const available = balance.get(currency) ?? 0;
  if (available < amount) {
    throw invalidRequest('balance_insufficient', `You have insufficient funds in your account (${available} ${currency} available, ${amount} requested).`, 'amount');
  }
  balance.set(currency, available - amount);
  const payout: Payout = {
    id: newId('po'),
    object: 'payout',
    amount,
    currency,
    status: 'pending',
    created: nowSec(),
    arrival_date: nowSec() + 86_400,
    metadata,
    failure_code: null,
    failure_message: null,
    method: 'standard',
    type: 'bank_account',
    livemode: false,
  };
  ctx.state.payouts.set(payout.id, { payout, account: stripeAccount });
  ctx.stats.created.payouts++;
  return payout;
}

/** GET /v1/payouts/:id (with Stripe-Account, only that account's payouts). */
export function retrievePayout(ctx: FakeContext, id: string, stripeAccount: string | undefined): Payout {
  const entry = ctx.state.payouts.get(id);
  if (!entry || (stripeAccount && entry.account !== stripeAccount)) throw noSuch('payout', id, 'id');
  return entry.payout;
}

/** Settles a pending payout: failed (money back in the balance) for an account flagged by failPayoutsFor, paid otherwise. */
export function settlePayout(ctx: FakeContext, id: string): void {
  const entry = ctx.state.payouts.get(id);
  if (!entry || entry.payout.status !== 'pending') return;
  const { payout, account } = entry;
  const failure = ctx.failures.payouts.get(account);
  if (failure) {
    payout.status = 'failed';
    payout.failure_code = 'account_closed';
    payout.failure_message = failure;
    addToBalance(ctx.state, account, payout.currency, payout.amount);
    ctx.webhooks.send('payout.failed', payout, account);
  } else {
    payout.status = 'paid';
    ctx.webhooks.send('payout.paid', payout, account);
  }
  ctx.save();
}

/** Sum of an account's paid payouts per currency: what reached its bank. */
export function paidOutTo(state: FakeState, accountId: string): Record<string, number> {
  const out: Record<string, number> = {};
  for (const { payout, account } of state.payouts.values()) {
    if (account === accountId && payout.status === 'paid') out[payout.currency] = (out[payout.currency] ?? 0) + payout.amount;
  }
  return out;
}

export type Settlement = {
  /** A payout was created: settle it after the delay (when settling on a timer). */
  scheduled(id: string): void;
  /** After a restart: schedule the payouts still pending. */
  resumePending(): void;
  /** Settles every pending payout now and waits for their webhooks. */
  settleAll(): Promise<void>;
  /** Drops the timers (on stop). */
  cancel(): void;
};

export function createSettlement(ctx: FakeContext, options: { delayMs: number; auto: boolean }): Settlement {
  const timers = new Set<NodeJS.Timeout>();
  const cancel = () => {
    for (const t of timers) clearTimeout(t);
    timers.clear();
  };
  const scheduled = (id: string) => {
    if (!options.auto) return;
    const t = setTimeout(() => {
      timers.delete(t);
      settlePayout(ctx, id);
    }, options.delayMs);
    timers.add(t);
  };
  return {
    scheduled,
    resumePending: () => {
      for (const { payout } of ctx.state.payouts.values()) if (payout.status === 'pending') scheduled(payout.id);
    },
    settleAll: async () => {
      cancel();
      for (const id of ctx.state.payouts.keys()) settlePayout(ctx, id);
      await ctx.webhooks.drain();
    },
    cancel,
  };
}
