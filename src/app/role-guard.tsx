import type { ReactNode } from 'react';
import { Outlet, useRouteLoaderData } from 'react-router-dom';
import type { SessionUser } from '../../shared/contracts/auth';
import { ButtonLink } from '../components/button';
import { Page } from '../components/page';
import { roleLabel, type Role } from '../lib/roles';
import { homePathFor } from './nav';

/** The signed-in user, as loaded by the app route's loader (requireSession). */
export function useSessionUser(): SessionUser {
  const user = useRouteLoaderData('app') as SessionUser | undefined;
  if (!user) throw new Error('useSessionUser is used outside the signed-in part of the app');
  return user;
}

/** True when `role` may open a page meant for `allowed`. */
export function canOpen(role: Role, allowed: readonly Role[]): boolean {
  return allowed.includes(role);
}

/**
 * Shows its children (or the child route) only to the given roles; others get a plain
 * "not available" page. This only hides: the server enforces every rule.
 */
export function RoleGuard({ roles, children }: { roles: readonly Role[]; children?: ReactNode }) {
  const user = useSessionUser();
  if (!canOpen(user.role, roles)) {
    return (
      <Page title="Not available for your role">
        <p className="max-w-prose text-ink-muted">
          You are signed in as {user.email} ({roleLabel[user.role]}). This page is for{' '}
          {roles.map((r) => roleLabel[r]).join(' and ')} accounts. If you need it, ask an admin to change your role.
        </p>
        <div>
          <ButtonLink to={homePathFor(user.role)} variant="primary">
            Go to your home page
          </ButtonLink>
        </div>
      </Page>
    );
  }
  return children ?? <Outlet />;
}
