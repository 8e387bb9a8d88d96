import type { AppDeps } from './app-deps';
import { seedDemoEditions, seedDemoPublications } from './areas/editions/index';
import { seedDemoFoundry } from './areas/foundry/index';
import { seedDemoStock } from './areas/intake/index';
import { seedDemoWebhooks } from './areas/integrations/index';
import { seedDemoPayouts } from './areas/payouts/index';
import { seedDemoPuzzles } from './areas/puzzles/index';
import { seedDemoSolves } from './areas/reader/index';

// Demo seeders of each area, run in this order on a new database in demo mode, after the
// four demo accounts exist (find them by e-mail in demoAccounts, server/areas/accounts/demo-accounts.ts).
// Add one line per area: { name: 'publications', seed: seedDemoPublications }.
export type DemoSeeder = { name: string; seed: (deps: AppDeps) => Promise<void> | void };

export const seeders: DemoSeeder[] = [
  // first: the local receiver's endpoint, so the other seeders' events show as deliveries
  { name: 'webhooks', seed: seedDemoWebhooks },
  // stock first: puzzles and editions are made from stock tilings
  { name: 'stock', seed: seedDemoStock },
  { name: 'foundry', seed: seedDemoFoundry },
  { name: 'publications', seed: seedDemoPublications },
  { name: 'puzzles', seed: seedDemoPuzzles },
  // editions after the puzzles seeder (it drives the proof round with printable puzzles)
  { name: 'editions', seed: seedDemoEditions },
  // readers' solves of the published demo editions (generated, marked demo)
  { name: 'reader', seed: seedDemoSolves },
  // keep payouts last: it pays what earlier seeders' published editions earned
  { name: 'payouts', seed: seedDemoPayouts },
];
