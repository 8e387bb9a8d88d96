import type { Role } from '../lib/roles';

/** One link in the main navigation. `to` is an absolute path that routes.tsx (or '/') serves. */
export interface NavItem {
  label: string;
  to: string;
}

const editorNav: readonly NavItem[] = [
  { label: 'Home', to: '/' },
  { label: 'Review queue', to: '/review' },
  { label: 'Stock', to: '/stock' },
  { label: 'Puzzles', to: '/puzzles' },
  { label: 'Editions', to: '/editions' },
  { label: 'Foundry', to: '/foundry' },
  { label: 'Payouts', to: '/payouts' },
  { label: 'Readers', to: '/readers' },
  { label: 'API keys', to: '/api-keys' },
];

/**
 * The navigation per role (screens.md). Admins get everything an editor has plus the
 * admin pages. This only hides links; the server enforces every rule.
 */
export const navByRole: Record<Role, readonly NavItem[]> = {
  setter: [
    { label: 'Home', to: '/' },
    { label: 'Submit', to: '/submit' },
    { label: 'My submissions', to: '/submissions' },
    { label: 'Earnings', to: '/earnings' },
  ],
  editor: editorNav,
  printer: [
    { label: 'Proofs', to: '/proofs' },
    { label: 'Press files', to: '/press-files' },
  ],
  admin: [
    ...editorNav,
    { label: 'Users', to: '/admin/users' },
    { label: 'Publications', to: '/admin/publications' },
    { label: 'Reader edition', to: '/admin/reader' },
    { label: 'Templates', to: '/admin/templates' },
    { label: 'Webhooks', to: '/admin/webhooks' },
    { label: 'Mailbox (local)', to: '/admin/mailbox' },
  ],
};

/** Where a role lands after signing in: its first navigation entry. */
export function homePathFor(role: Role): string {
  return navByRole[role][0]?.to ?? '/';
}
