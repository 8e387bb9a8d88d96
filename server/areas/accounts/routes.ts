import { desc, eq } from 'drizzle-orm';
import {
  acceptInvitationBodySchema,
  acceptInvitationResponseSchema,
  createInvitationBodySchema,
  createInvitationResponseSchema,
  invitationLookupResponseSchema,
  invitationTokenParamSchema,
} from '../../../shared/contracts/auth';
import { idParamSchema, numericIdParamSchema } from '../../../shared/contracts/common';
import {
  adminUserListResponseSchema,
  mailboxListResponseSchema,
  mailboxMessageResponseSchema,
  updateUserBodySchema,
  updateUserResponseSchema,
} from '../../../shared/contracts/users';
import { mailboxMessage } from '../../platform/mail/schema';
import type { AppDeps } from '../../platform/deps';
import { NotFound } from '../../platform/http/errors';
import { route, type ApiRouter } from '../../platform/http/route';
import { acceptInvitation, createInvitation, lookupInvitation } from './invitations';
import { listUsers, updateUser } from './users';

// Invitations, admin users, Mailbox (local).
export function registerAccountRoutes(router: ApiRouter, deps: AppDeps) {
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

  route(router, { method: 'GET', path: '/api/admin/users', summary: 'All users with role and whether active', response: adminUserListResponseSchema }, () => ({ users: listUsers(deps) }));

  route(
    router,
    { method: 'PATCH', path: '/api/admin/users/:id', summary: 'Change a user role or (de)activate them', params: idParamSchema, body: updateUserBodySchema, response: updateUserResponseSchema },
    ({ user, params, body }) => ({ user: updateUser(deps, user, params.id, body) }),
  );

  const summaryColumns = { id: mailboxMessage.id, from: mailboxMessage.from, to: mailboxMessage.to, subject: mailboxMessage.subject, receivedAt: mailboxMessage.receivedAt };

  route(router, { method: 'GET', path: '/api/mailbox', summary: 'Mailbox (local): mails the local fake SMTP server caught', response: mailboxListResponseSchema }, () => ({
    messages: deps.db
      .select(summaryColumns)
      .from(mailboxMessage)
      .orderBy(desc(mailboxMessage.id))
      .limit(500)
      .all()
      .map((m) => ({ ...m, receivedAt: m.receivedAt.toISOString() })),
  }));

  route(
    router,
    { method: 'GET', path: '/api/mailbox/:id', summary: 'Mailbox (local): one caught mail', params: numericIdParamSchema, response: mailboxMessageResponseSchema },
    ({ params }) => {
      const m = deps.db
        .select({ ...summaryColumns, text: mailboxMessage.text, html: mailboxMessage.html })
        .from(mailboxMessage)
        .where(eq(mailboxMessage.id, params.id))
        .get();
      if (!m) throw new NotFound(`No caught mail ${params.id}.`);
      return { message: { ...m, receivedAt: m.receivedAt.toISOString() } };
    },
  );
}
