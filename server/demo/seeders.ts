import type { AppDeps } from '../deps';
import { seedDemoPayouts } from '../payments/demo-seed';

// Demo seeders of each area, run in this order on a new database in demo mode, after the
// four demo accounts exist (find them by e-mail in demoAccounts, server/demo/accounts.ts).
// Add one line per area: { name: 'publications', seed: seedDemoPublications }.
export type DemoSeeder = { name: string; seed: (deps: AppDeps) => Promise<void> | void };

export const seeders: DemoSeeder[] = [
  // keep payouts last: it pays what earlier seeders' published editions earned
  { name: 'payouts', seed: seedDemoPayouts },
];
