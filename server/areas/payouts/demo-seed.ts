import { eq } from 'drizzle-orm';
import { user } from '../../platform/auth/schema';
import { ledgerEntry, payoutAccount } from './schema';
import { demoAccounts, demoPassword } from '../accounts/index';
import type { MoneyDeps } from './ports';
import { recordPublicationFees } from './ledger';
import { createPayoutRun, resumePendingPayouts } from './payouts';
import { payoutsDepsFrom } from './runtime';

// Demo money, in our fictional scenario (Larkspur & Quill Press): two setters, one paid
// and one owed. Selma Quist (the demo setter) keeps her fees owed; a second demo setter,
// Tobias Wren, has finished payout details at the local fake provider and was paid last
// month's fees in a real payout run through the SDK. When the print area's demo has
// published editions, Selma's fees come from them; otherwise self-contained fee entries
// are written here, their edition ids prefixed "demo-ledger-" to say so.

export const secondDemoSetter = { email: 'setter2@demo.squarewright.test', name: 'Tobias Wren' };

function isoDay(year: number, month: number, day: number): string {
  return new Date(Date.UTC(year, month, day)).toISOString().slice(0, 10);
}

function userIdByEmail(deps: MoneyDeps, email: string | undefined): string | undefined {
  return email === undefined ? undefined : deps.db.select({ id: user.id }).from(user).where(eq(user.email, email)).get()?.id;
}

/** The demo account of a role (accounts area), which must exist already. */
function demoUserId(deps: MoneyDeps, role: 'setter' | 'editor'): string {
  const id = userIdByEmail(deps, demoAccounts.find((a) => a.role === role)?.email);
  if (!id) throw new Error(`the demo ${role} account must exist first`);
  return id;
}

async function ensureSetter(deps: MoneyDeps, email: string, name: string): Promise<string> {
  const existing = userIdByEmail(deps, email);
  if (existing) return existing;
  const created = await deps.auth.api.createUser({ body: { email, password: demoPassword, name, role: 'setter', data: { emailVerified: true } } });
  return created.user.id;
}

export async function seedDemoPayouts(deps: MoneyDeps): Promise<void> {
  const selma = demoUserId(deps, 'setter');
  const editor = demoUserId(deps, 'editor');
  const tobias = await ensureSetter(deps, secondDemoSetter.email, secondDemoSetter.name);

  const now = deps.clock.now();
  const y = now.getUTCFullYear();
  const m = now.getUTCMonth();
  const lastMonth = [isoDay(y, m - 1, 3), isoDay(y, m - 1, 10), isoDay(y, m - 1, 17)];
  const fee = (editionId: string, date: string, setterId: string, puzzles: { kind: 'assembly' | 'deduction'; amountMinor: number }[], publicationId = 'demo-ledger-saturday-quadrant') =>
    deps.db.transaction((tx) =>
      recordPublicationFees(tx, {
        editionId,
        publicationId,
        date,
        entries: puzzles.map((p, i) => ({ puzzleId: `${editionId}-puzzle-${i + 1}`, setterId, kind: p.kind, amountMinor: p.amountMinor, currency: 'GBP' })),
      }),
    );

  // Tobias: three Saturday Quadrant columns last month, all paid out.
  lastMonth.forEach((date, i) => fee(`demo-ledger-sq-${date}`, date, tobias, [{ kind: i % 2 ? 'deduction' : 'assembly', amountMinor: i % 2 ? 4500 : 3500 }]));
  // Selma: fees still owed (unless the print demo already published editions with her puzzles).
  const selmaHasFees = deps.db.select({ id: ledgerEntry.id }).from(ledgerEntry).where(eq(ledgerEntry.setterId, selma)).limit(1).get();
  if (!selmaHasFees) {
    fee(`demo-ledger-sam-${isoDay(y, m - 1, 1)}`, isoDay(y, m - 1, 1), selma, [
      { kind: 'deduction', amountMinor: 6000 },
      { kind: 'assembly', amountMinor: 5000 },
    ], 'demo-ledger-squared-away-monthly');
    fee(`demo-ledger-sq-${isoDay(y, m, 1)}`, isoDay(y, m, 1), selma, [{ kind: 'assembly', amountMinor: 3500 }]);
  }

  const provider = deps.payments;
  const fakeUrl = deps.env.PAYMENTS_API_URL;
  if (!provider?.isLocalFake || !fakeUrl) {
    deps.log.info('demo payouts: no local fake provider, so both demo setters stay owed');
    return;
  }
  // Tobias's payout details at the fake: an account, finished as on the provider's page.
  const account = await provider.createAccount({ email: secondDemoSetter.email, country: 'GB', setterId: tobias });
  const done = await fetch(`${fakeUrl}/__fake/accounts/${account.id}/complete-onboarding`, { method: 'POST' });
  if (!done.ok) throw new Error(`the local fake provider did not finish onboarding (${done.status})`);
  const summary = await provider.getAccount(account.id);
  deps.db
    .insert(payoutAccount)
    .values({ setterId: tobias, providerAccountId: account.id, status: summary.ready ? 'ready' : 'onboarding', displayHint: summary.hint })
    .onConflictDoNothing()
    .run();
  const payouts = payoutsDepsFrom(deps, provider);
  await createPayoutRun(payouts, editor, { requestKey: '00000000-0000-4000-8000-00000000d3a0', setterIds: [tobias] });
  // The fake settles in a moment; read the result back so the demo starts with it paid.
  await new Promise((r) => setTimeout(r, 1_700));
  await resumePendingPayouts(payouts);
}
