import { eq } from 'drizzle-orm';
import { user } from '../../platform/auth/schema';
import { ledgerEntry, payoutAccount } from './schema';
import { demoPassword } from '../accounts/index';
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
const demoSetterEmail = 'setter@demo.squarewright.test';
const demoEditorEmail = 'editor@demo.squarewright.test';

function isoDay(year: number, month: number, day: number): string {
  return new Date(Date.UTC(year, month, day)).toISOString().slice(0, 10);
}

async function ensureUser(deps: MoneyDeps, email: string, name: string): Promise<string> {
  const existing = deps.db.select({ id: user.id }).from(user).where(eq(user.email, email)).get();
  if (existing) return existing.id;
  const created = await deps.auth.api.createUser({ body: { email, password: demoPassword, name, role: 'setter', data: { emailVerified: true } } });
  return created.user.id;
}

export async function seedDemoPayouts(deps: MoneyDeps): Promise<void> {
  const selma = deps.db.select({ id: user.id }).from(user).where(eq(user.email, demoSetterEmail)).get();
  const editor = deps.db.select({ id: user.id }).from(user).where(eq(user.email, demoEditorEmail)).get();
  if (!selma || !editor) throw new Error('the demo setter and editor accounts must exist first');
  const tobias = await ensureUser(deps, secondDemoSetter.email, secondDemoSetter.name);

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
  const selmaHasFees = deps.db.select({ id: ledgerEntry.id }).from(ledgerEntry).where(eq(ledgerEntry.setterId, selma.id)).limit(1).get();
  if (!selmaHasFees) {
    fee(`demo-ledger-sam-${isoDay(y, m - 1, 1)}`, isoDay(y, m - 1, 1), selma.id, [
      { kind: 'deduction', amountMinor: 6000 },
      { kind: 'assembly', amountMinor: 5000 },
    ], 'demo-ledger-squared-away-monthly');
    fee(`demo-ledger-sq-${isoDay(y, m, 1)}`, isoDay(y, m, 1), selma.id, [{ kind: 'assembly', amountMinor: 3500 }]);
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
  await createPayoutRun(payouts, editor.id, { requestKey: '00000000-0000-4000-8000-00000000d3a0', setterIds: [tobias] });
  // The fake settles in a moment; read the result back so the demo starts with it paid.
  await new Promise((r) => setTimeout(r, 1_700));
  await resumePendingPayouts(payouts);
}
