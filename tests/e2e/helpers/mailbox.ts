import type { APIRequestContext } from 'playwright-core';

// Reading the local fake SMTP server's catch through the API (GET /api/mailbox, admin only),
// as a signed-in admin's request context: `page.request` after signIn(page, 'admin').

export interface CaughtMail {
  id: number;
  from: string;
  to: string;
  subject: string;
  receivedAt: string;
  text: string;
}

/**
 * Waits until a mail to `to` (and, if given, with a subject matching `subject`) has been
 * caught, and returns it with its text. Mail is delivered by the server's sender loop, so
 * it can take a moment.
 */
export async function waitForMail(
  request: APIRequestContext,
  match: { to: string; subject?: RegExp },
  timeoutMs = 20_000,
): Promise<CaughtMail> {
  const deadline = Date.now() + timeoutMs;
  let lastStatus = 0;
  while (Date.now() < deadline) {
    const list = await request.get('/api/mailbox');
    lastStatus = list.status();
    if (list.ok()) {
      const { messages } = (await list.json()) as { messages: Omit<CaughtMail, 'text'>[] };
      const found = messages.find((m) => m.to.includes(match.to) && (!match.subject || match.subject.test(m.subject)));
      if (found) {
        const detail = await request.get(`/api/mailbox/${found.id}`);
        if (!detail.ok()) throw new Error(`GET /api/mailbox/${found.id} answered ${detail.status()}`);
        const { message } = (await detail.json()) as { message: CaughtMail };
        return message;
      }
    } else if (lastStatus === 401 || lastStatus === 403) {
      throw new Error(`GET /api/mailbox answered ${lastStatus}: read the mailbox as a signed-in admin`);
    }
    await new Promise((r) => setTimeout(r, 300));
  }
  throw new Error(`no mail to ${match.to}${match.subject ? ` matching ${match.subject}` : ''} within ${timeoutMs / 1000} s (last status ${lastStatus})`);
}

/** The first absolute link in a mail's text whose path starts with `pathPrefix` (e.g. '/invite/'). */
export function linkIn(mail: CaughtMail, pathPrefix: string): string {
  for (const m of mail.text.matchAll(/https?:\/\/[^\s<>"')\]]+/g)) {
    const url = m[0].replace(/[.,;:!?]+$/, '');
    if (new URL(url).pathname.startsWith(pathPrefix)) return url;
  }
  throw new Error(`no link to ${pathPrefix}... in the mail "${mail.subject}"`);
}
