import { desc, eq } from 'drizzle-orm';
import { numericIdParamSchema } from '../../../shared/contracts/common';
import { mailboxListResponseSchema, mailboxMessageResponseSchema } from '../../../shared/contracts/users';
import type { PlatformDeps } from '../../platform/deps';
import { NotFound } from '../../platform/http/errors';
import { route, type ApiRouter } from '../../platform/http/route';
import { mailboxMessage } from '../../platform/mail/schema';

// Mailbox (local): what the local fake SMTP server caught (admins only).
export function registerMailboxRoutes(router: ApiRouter, deps: PlatformDeps) {
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
