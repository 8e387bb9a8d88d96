import type { BetterAuthPlugin } from 'better-auth';
import { APIError, createAuthMiddleware, isAPIError } from 'better-auth/api';
import { eq } from 'drizzle-orm';
import type { Clock } from '../clock';
import type { Db } from '../db/client';
import { queueMail } from '../mail/outbox';
import { user } from './schema';

// Sign-in limits (a better-auth plugin), counting FAILED attempts only, so a right password is
// never the reason for a refusal while its limit is not reached:
//  - per client address: at most `address.max` failures in `address.window` seconds, then every
//    attempt from that address is refused (429) until the window ends;
//  - per account (e-mail): `account.failures` failures within `account.windowSec` lock the
//    account for `account.lockSec` seconds (429, saying so); the owner gets one mail per lock.
//    A password reset lifts the lock (auth.ts: onPasswordReset). The same message whether or
//    not the account exists.
// State is in memory, per server (a restart forgets it; it is a brake on guessing, not a record).

export type SignInLimits = {
  address: { window: number; max: number };
  account: { failures: number; windowSec: number; lockSec: number };
};

/** Account lock defaults [common practice: about ten failures in a quarter of an hour]. */
export const defaultAccountLock = { failures: 10, windowSec: 15 * 60, lockSec: 15 * 60 };

type Counter = { count: number; start: number };
type AccountState = Counter & { lockedUntil: number };

export type SignInGuardOptions = {
  limits: SignInLimits;
  clock: Clock;
  db: Db;
  publicUrl: string;
  addressHeader: string;
  onMailQueued?: () => void;
};

function prune<T extends { start: number }>(map: Map<string, T>, now: number, keepMs: number): void {
  if (map.size < 10_000) return;
  for (const [k, v] of map) if (now - v.start >= keepMs) map.delete(k);
}

export type SignInGuard = {
  plugin: BetterAuthPlugin;
  /** lift an account's lock (after its password was reset: the reset proved the mailbox) */
  unlock(email: string): void;
};

export function createSignInGuard(o: SignInGuardOptions): SignInGuard {
  const addresses = new Map<string, Counter>();
  const accounts = new Map<string, AccountState>();
  const { address: addressRule, account: accountRule } = o.limits;
  const now = () => o.clock.now().getTime();

  const addressOf = (headers: Headers | undefined) => headers?.get(o.addressHeader) ?? null;
  const emailOf = (body: unknown) => {
    const email = (body as { email?: unknown } | undefined)?.email;
    return typeof email === 'string' ? email.trim().toLowerCase().slice(0, 254) : null;
  };

  function addressRetryAfter(addr: string, t: number): number | null {
    const c = addresses.get(addr);
    if (!c || t - c.start >= addressRule.window * 1000) return null;
    return c.count >= addressRule.max ? Math.ceil((c.start + addressRule.window * 1000 - t) / 1000) : null;
  }

  function lockMail(email: string, lockedUntil: number) {
    const row = o.db.select({ name: user.name, banned: user.banned }).from(user).where(eq(user.email, email)).get();
    if (!row || row.banned) return;
    queueMail(
      o.db,
      {
        to: email,
        template: 'sign-in-locked',
        data: {
          name: row.name,
          email,
          failures: String(accountRule.failures),
          until: `${new Date(lockedUntil).toISOString().slice(0, 16).replace('T', ' ')} UTC`,
          link: `${o.publicUrl}/forgot-password`,
        },
      },
      o.clock.now(),
    );
    o.onMailQueued?.();
  }

  function recordFailure(addr: string | null, email: string | null, t: number) {
    if (addr) {
      prune(addresses, t, addressRule.window * 1000);
      const c = addresses.get(addr);
      if (!c || t - c.start >= addressRule.window * 1000) addresses.set(addr, { count: 1, start: t });
      else c.count += 1;
    }
    if (email) {
      prune(accounts, t, Math.max(accountRule.windowSec, accountRule.lockSec) * 1000);
      let a = accounts.get(email);
      if (!a || (t - a.start >= accountRule.windowSec * 1000 && a.lockedUntil <= t)) {
        a = { count: 0, start: t, lockedUntil: 0 };
        accounts.set(email, a);
      }
      a.count += 1;
      if (a.count >= accountRule.failures && a.lockedUntil <= t) {
        a.lockedUntil = t + accountRule.lockSec * 1000;
        lockMail(email, a.lockedUntil);
      }
    }
  }

  const plugin: BetterAuthPlugin = {
    id: 'squarewright-sign-in-guard',
    hooks: {
      before: [
        {
          matcher: (ctx) => ctx.path === '/sign-in/email',
          handler: createAuthMiddleware(async (ctx) => {
            const t = now();
            const addr = addressOf(ctx.headers);
            const wait = addr ? addressRetryAfter(addr, t) : null;
            if (wait !== null) {
              throw new APIError('TOO_MANY_REQUESTS', { code: 'ADDRESS_LOCKED', message: `Too many failed sign-ins from your address. Try again in ${wait} s.` }, { 'X-Retry-After': String(wait) });
            }
            const email = emailOf(ctx.body);
            const a = email ? accounts.get(email) : undefined;
            if (a && a.lockedUntil > t) {
              const minutes = Math.ceil((a.lockedUntil - t) / 60_000);
              throw new APIError(
                'TOO_MANY_REQUESTS',
                {
                  code: 'ACCOUNT_LOCKED',
                  message: `This account is locked for ${minutes} more minute${minutes === 1 ? '' : 's'} after ${accountRule.failures} failed sign-ins. We have sent its owner a mail; a password reset unlocks it at once.`,
                },
                { 'X-Retry-After': String(Math.ceil((a.lockedUntil - t) / 1000)) },
              );
            }
          }),
        },
      ],
      after: [
        {
          matcher: (ctx) => ctx.path === '/sign-in/email',
          handler: createAuthMiddleware(async (ctx) => {
            const returned: unknown = ctx.context.returned;
            const failed = isAPIError(returned);
            const email = emailOf(ctx.body);
            if (failed && returned.statusCode === 401) recordFailure(addressOf(ctx.headers), email, now());
            else if (!failed && email) accounts.delete(email);
          }),
        },
      ],
    },
  };
  return { plugin, unlock: (email) => accounts.delete(email.trim().toLowerCase()) };
}
