import type { Role } from '../lib/roles';
import { lazyPage, type LazyPage } from './route-types';

/** A card on a role's Home page. */
export interface HomeCard {
  id: string;
  roles: readonly Role[];
  title: string;
  /** Placeholder text until the feature provides `component`. */
  description: string;
  /** A link under the card. */
  link?: { label: string; to: string };
  /**
   * The card's live content, loaded lazily, e.g.
   * `component: lazyPage(() => import('../features/submissions/components/recent-submissions-card'), 'RecentSubmissionsCard')`.
   */
  component?: () => Promise<LazyPage>;
}

const editors: readonly Role[] = ['editor', 'admin'];

/**
 * THE list of Home cards. Feature engineers replace a placeholder by adding `component`
 * to its entry (small, targeted edits: several people touch this file).
 */
export const homeCards: readonly HomeCard[] = [
  // setter
  { id: 'setter-submissions', roles: ['setter'], title: 'My recent submissions', description: 'Your latest tilings and where each one stands in review.', link: { label: 'All my submissions', to: '/submissions' }, component: lazyPage(() => import('../features/submissions/components/recent-submissions-card'), 'RecentSubmissionsCard') },
  { id: 'setter-earnings', roles: ['setter'], title: 'Earnings this month', description: 'Fees for puzzles printed this month, and your next payout.', link: { label: 'Earnings', to: '/earnings' }, component: lazyPage(() => import('../features/earnings/components/earnings-home-card'), 'EarningsHomeCard') },
  // editor (and admin)
  { id: 'editor-pending', roles: editors, title: 'Pending submissions', description: 'Submissions waiting for a review.', link: { label: 'Review queue', to: '/review' }, component: lazyPage(() => import('../features/review/components/pending-card'), 'PendingSubmissionsCard') },
  { id: 'editor-due', roles: editors, title: 'Editions due soon', description: 'Editions whose date is near, and what they still need.', link: { label: 'Editions', to: '/editions' }, component: lazyPage(() => import('../features/editions/components/home-cards'), 'EditionsDueCard') },
  { id: 'editor-returned', roles: editors, title: 'Proofs returned', description: 'Proofs the printer sent back with notes.', link: { label: 'Editions', to: '/editions' }, component: lazyPage(() => import('../features/editions/components/home-cards'), 'ProofsReturnedCard') },
  { id: 'editor-foundry', roles: editors, title: 'Foundry runs finished', description: 'Runs that have finished since you last looked, and what they added to the stock.', link: { label: 'Foundry', to: '/foundry' }, component: lazyPage(() => import('../features/foundry/components/finished-runs-card'), 'FinishedRunsCard') },
  { id: 'editor-owed', roles: editors, title: 'Setters owed', description: 'Fees accrued and not yet paid out.', link: { label: 'Payouts', to: '/payouts' }, component: lazyPage(() => import('../features/payouts/components/owed-home-card'), 'OwedHomeCard') },
  // admin
  { id: 'admin-users', roles: ['admin'], title: 'People', description: 'Invite setters, editors and printers, change roles, deactivate accounts.', link: { label: 'Users', to: '/admin/users' } },
  { id: 'admin-mailbox', roles: ['admin'], title: 'Mailbox (local)', description: 'Mail caught by the local fake mail server: invitations, resets, proof notices.', link: { label: 'Open the mailbox', to: '/admin/mailbox' } },
];
