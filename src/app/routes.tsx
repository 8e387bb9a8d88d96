import { lazyPage, type AppRoute } from './route-types';
import type { Role } from '../lib/roles';

const setters: readonly Role[] = ['setter'];
const editors: readonly Role[] = ['editor', 'admin'];
const printers: readonly Role[] = ['printer', 'admin'];
const admins: readonly Role[] = ['admin'];

/**
 * THE list of signed-in pages. To add a feature page, add (or fill in) one entry:
 *   { path: 'stock/:id', title: 'Stock tiling', roles: editors,
 *     page: lazyPage(() => import('../features/stock/components/stock-detail-page'), 'StockDetailPage') },
 * An entry without `page` shows a "coming soon" placeholder. The navigation (nav.ts)
 * links to paths listed here; the home page ('') is composed in home-page.tsx.
 * Keep one entry per line group and edit with small targeted changes: several
 * engineers add to this file.
 */
export const appRoutes: readonly AppRoute[] = [
  // setter
  { path: 'submit', title: 'Submit', roles: setters, page: lazyPage(() => import('../features/submit/components/submit-page'), 'SubmitPage') },
  { path: 'submissions', title: 'My submissions', roles: setters, page: lazyPage(() => import('../features/submissions/components/my-submissions-page'), 'MySubmissionsPage') },
  { path: 'earnings', title: 'Earnings', roles: setters, page: lazyPage(() => import('../features/earnings/components/earnings-page'), 'EarningsPage') },
  // editor (and admin)
  { path: 'review', title: 'Review queue', roles: editors, page: lazyPage(() => import('../features/review/components/review-page'), 'ReviewPage') },
  { path: 'stock', title: 'Stock', roles: editors, page: lazyPage(() => import('../features/stock/components/stock-page'), 'StockPage') },
  { path: 'stock/:id', title: 'Stock tiling', roles: editors, page: lazyPage(() => import('../features/stock/components/stock-detail-page'), 'StockDetailPage') },
  { path: 'puzzles', title: 'Puzzles', roles: editors, summary: 'Assembly and Deduction puzzles with their certificates.', page: lazyPage(() => import('../features/puzzles/components/puzzles-page'), 'PuzzlesPage') },
  { path: 'puzzles/new', title: 'Make a puzzle', roles: editors, page: lazyPage(() => import('../features/puzzles/components/new-puzzle-page'), 'NewPuzzlePage') },
  { path: 'puzzles/:id', title: 'Puzzle', roles: editors, page: lazyPage(() => import('../features/puzzles/components/puzzle-page'), 'PuzzlePage') },
  { path: 'api-keys', title: 'API keys', roles: editors, page: lazyPage(() => import('../features/integrations/components/api-keys-page'), 'ApiKeysPage') },
  { path: 'editions', title: 'Editions', roles: editors, page: lazyPage(() => import('../features/editions/components/editions-page'), 'EditionsPage') },
  { path: 'editions/:id', title: 'Edition', roles: editors, page: lazyPage(() => import('../features/editions/components/edition-page'), 'EditionPage') },
  { path: 'foundry', title: 'Foundry', roles: editors, summary: 'Mint new tilings when the stock runs low.', page: lazyPage(() => import('../features/foundry/components/foundry-page'), 'FoundryPage') },
  { path: 'foundry/runs/:id', title: 'Foundry run', roles: editors, page: lazyPage(() => import('../features/foundry/components/run-results-page'), 'RunResultsPage') },
  { path: 'payouts', title: 'Payouts', roles: editors, page: lazyPage(() => import('../features/payouts/components/payouts-page'), 'PayoutsPage') },
  { path: 'readers', title: 'Readers', roles: editors, summary: 'How readers fared with the published puzzles.', page: lazyPage(() => import('../features/reader/components/readers-page'), 'ReadersPage') },
  { path: 'readers/calibration', title: 'Grade calibration', roles: editors, page: lazyPage(() => import('../features/reader/components/calibration-page'), 'CalibrationPage') },
  // printer
  { path: 'proofs', title: 'Proofs', roles: printers, page: lazyPage(() => import('../features/proofs/components/proofs-page'), 'ProofsPage') },
  { path: 'proofs/:id', title: 'Proof', roles: printers, page: lazyPage(() => import('../features/proofs/components/proof-page'), 'ProofPage') },
  { path: 'press-files', title: 'Press files', roles: printers, page: lazyPage(() => import('../features/proofs/components/proofs-page'), 'PressFilesPage') },
  // admin
  { path: 'admin/users', title: 'Users', roles: admins, page: lazyPage(() => import('../features/admin-users/components/users-page'), 'UsersPage') },
  { path: 'admin/publications', title: 'Publications', roles: admins, page: lazyPage(() => import('../features/publications/components/publications-page'), 'PublicationsPage') },
  { path: 'admin/reader', title: 'Reader edition', roles: admins, page: lazyPage(() => import('../features/reader/components/reader-settings-page'), 'ReaderSettingsPage') },
  { path: 'admin/templates', title: 'Templates', roles: admins, page: lazyPage(() => import('../features/templates/components/templates-page'), 'TemplatesPage') },
  { path: 'admin/webhooks', title: 'Webhooks', roles: admins, page: lazyPage(() => import('../features/integrations/components/webhooks-page'), 'WebhooksPage') },
  { path: 'admin/mailbox', title: 'Mailbox (local)', roles: admins, page: lazyPage(() => import('../features/mailbox/components/mailbox-page'), 'MailboxPage') },
  { path: 'admin/mailbox/:id', title: 'Mailbox (local)', roles: admins, page: lazyPage(() => import('../features/mailbox/components/mail-page'), 'MailPage') },
];
