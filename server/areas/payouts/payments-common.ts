import type { MoneyDeps } from './ports';
import { Conflict, HttpError, NotFound } from '../../platform/http/errors';
import { payoutsDepsFrom } from './runtime';
import { LedgerError } from './ledger';
import { PayoutError, resumePendingPayouts, closeMonth, previousMonth, type PayoutsDeps } from './payouts';

// Shared by the payouts, earnings and webhook routes: service errors -> HTTP errors,
// the payout service's dependencies, and the start-up recovery of pending payouts.

class ServiceUnavailable extends HttpError {
  constructor(message: string) {
    super(503, 'internal', message);
  }
}

function translate(error: unknown): never {
  if (error instanceof PayoutError || error instanceof LedgerError) {
    if (error.code === 'not_found') throw new NotFound(error.message, error.details);
    if (error.code === 'conflict') throw new Conflict(error.message, error.details);
    if (error.code === 'unavailable') throw new ServiceUnavailable(error.message);
    throw new HttpError(400, 'bad_request', error.message, error.details);
  }
  throw error;
}

/** Runs a service call and turns its domain errors into HTTP errors. */
export function moneyErrors<T>(run: () => T): T {
  try {
    const out = run();
    if (out instanceof Promise) return out.catch(translate) as T;
    return out;
  } catch (error) {
    translate(error);
  }
}

export function payoutsDepsOrFail(deps: MoneyDeps): PayoutsDeps {
  if (!deps.payments) {
    throw new ServiceUnavailable('Payments are not configured: set PAYMENTS_SECRET_KEY and PAYMENTS_WEBHOOK_SECRET, or leave both unset so the local fake provider starts.');
  }
  return payoutsDepsFrom(deps, deps.payments);
}

/**
 * Outside tests: shortly after start-up, finish payouts a crash or an outage left pending
 * (same idempotency keys, so nothing is paid twice), and mail last month's statements to
 * setters who have not had them (month close), then check again every hour.
 */
export function startPayoutRecovery(deps: MoneyDeps): void {
  if (deps.env.NODE_ENV === 'test' || !deps.payments) return;
  const p = payoutsDepsFrom(deps, deps.payments);
  const tick = async () => {
    try {
      await resumePendingPayouts(p);
      closeMonth(p, previousMonth(deps.clock.now()));
    } catch (error) {
      deps.log.warn(`payouts: start-up recovery failed (${(error as Error).message})`);
    }
  };
  setTimeout(() => void tick(), 2_000).unref();
  setInterval(() => void tick(), 60 * 60_000).unref();
}
