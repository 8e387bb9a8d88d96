import {
  acceptInvitationBodySchema,
  acceptInvitationResponseSchema,
  createInvitationBodySchema,
  createInvitationResponseSchema,
  invitationLookupResponseSchema,
  invitationTokenParamSchema,
  meResponseSchema,
  publicConfigResponseSchema,
  requestPasswordResetBodySchema,
  resetPasswordBodySchema,
  signInBodySchema,
} from '../../../shared/contracts/auth';
import { idParamSchema } from '../../../shared/contracts/common';
import {
  adminUserListResponseSchema,
  invitationIdParamSchema,
  invitationListResponseSchema,
  resendInvitationResponseSchema,
  sessionResponseSchema,
  updateUserBodySchema,
  updateUserResponseSchema,
} from '../../../shared/contracts/users';
import type { PlatformDeps } from '../../platform/deps';
import { route, type ApiRouter } from '../../platform/http/route';
import { demoAccounts, demoPassword } from './demo-accounts';
import { acceptInvitation, createInvitation, listPendingInvitations, lookupInvitation, resendInvitation, revokeInvitation } from './invitations';
import { listUsers, updateUser } from './users';

// Who is signed in, the sign-in page's settings, invitations, admin users.
export function registerAccountRoutes(router: ApiRouter, deps: PlatformDeps) {
  route(router, { method: 'GET', path: '/api/public/config', summary: 'Public settings for the sign-in page', response: publicConfigResponseSchema }, () =>
    deps.demo
      ? { demo: true, demoAccounts: demoAccounts.map(({ email, role }) => ({ email, role })), demoPassword }
      : { demo: false },
  );

  route(router, { method: 'GET', path: '/api/me', summary: 'The signed-in user', response: meResponseSchema }, ({ user }) => ({ user }));

  route(router, { method: 'GET', path: '/api/session', summary: 'The signed-in user, or null when there is no session (never 401: the app asks this at start-up)', response: sessionResponseSchema }, ({ maybeUser }) => ({ user: maybeUser }));

  // better-auth's endpoints the client uses (served by better-auth, documented here)
  const authDoc = (path: string, summary: string, body?: typeof signInBodySchema | typeof requestPasswordResetBodySchema | typeof resetPasswordBodySchema) =>
    router.openapi.add({ method: 'POST', path, summary, tags: ['auth'], access: 'public (better-auth)', ...(body ? { body } : {}) });
  authDoc('/api/auth/sign-in/email', 'Sign in with e-mail and password (sets the session cookie; rate-limited)', signInBodySchema);
  authDoc('/api/auth/sign-out', 'Sign out (ends the session)');
  authDoc('/api/auth/request-password-reset', 'Mail a password-reset link', requestPasswordResetBodySchema);
  authDoc('/api/auth/reset-password', 'Set a new password with the token from the mail', resetPasswordBodySchema);

  route(
    router,
    { method: 'POST', path: '/api/invitations', summary: 'Invite an e-mail with a role (sends a one-time link)', body: createInvitationBodySchema, response: createInvitationResponseSchema, status: 201 },
    ({ user, body }) => ({ invitation: createInvitation(deps, user, body).invitation }),
  );

  route(
    router,
    { method: 'GET', path: '/api/invitations/:token', summary: 'What an invitation link is for, and whether it still works', params: invitationTokenParamSchema, response: invitationLookupResponseSchema },
    ({ params }) => lookupInvitation(deps, params.token),
  );

  route(
    router,
    { method: 'POST', path: '/api/invitations/:token/accept', summary: 'Accept an invitation: set name and password, signs in', params: invitationTokenParamSchema, body: acceptInvitationBodySchema, response: acceptInvitationResponseSchema, status: 201 },
    async ({ params, body, res }) => {
      const { user, setCookies } = await acceptInvitation(deps, params.token, body);
      for (const c of setCookies) res.append('Set-Cookie', c);
      return { user };
    },
  );

  route(router, { method: 'GET', path: '/api/invitations', summary: 'Invitations not yet accepted (expired ones too)', response: invitationListResponseSchema }, () => ({ invitations: listPendingInvitations(deps) }));

  route(
    router,
    { method: 'POST', path: '/api/invitations/:id/resend', summary: 'Resend an invitation: a new one-time link valid for another week; the old link stops working', params: invitationIdParamSchema, response: resendInvitationResponseSchema },
    ({ user, params }) => ({ invitation: resendInvitation(deps, user, params.id) }),
  );

  route(
    router,
    { method: 'POST', path: '/api/invitations/:id/revoke', summary: 'Revoke an invitation: its link stops working', params: invitationIdParamSchema },
    ({ params }) => revokeInvitation(deps, params.id),
  );

  route(router, { method: 'GET', path: '/api/admin/users', summary: 'All users with role and whether active', response: adminUserListResponseSchema }, () => ({ users: listUsers(deps) }));

  route(
    router,
    { method: 'PATCH', path: '/api/admin/users/:id', summary: 'Change a user role or (de)activate them', params: idParamSchema, body: updateUserBodySchema, response: updateUserResponseSchema },
    ({ user, params, body }) => ({ user: updateUser(deps, user, params.id, body) }),
  );
}
