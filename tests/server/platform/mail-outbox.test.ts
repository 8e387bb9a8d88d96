import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mailOutbox } from '../../../server/platform/mail/schema';
import { startFakeSmtp, type FakeSmtp } from '../../../server/platform/mail/fake-smtp';
import { queueMail, retryDelayMs } from '../../../server/platform/mail/outbox';
import { loadMailTemplates, parseMailTemplate, renderMail } from '../../../server/platform/mail/templates';
import { createTestApp, type TestApp } from '../helpers/test-app';

// The outbox promise (issue 2): mail is written in the same transaction as its event and a
// mail server that is down loses nothing.
let t: TestApp;
let revived: FakeSmtp | undefined;
beforeAll(async () => {
  t = await createTestApp({ mail: { baseDelayMs: 1_000, maxDelayMs: 60_000, maxAttempts: 5 } });
});
afterAll(async () => {
  await revived?.close();
  await t.close();
});

describe('mail outbox', () => {
  it('a mail queued in a transaction that rolls back is never sent', () => {
    expect(() =>
      t.db.transaction((tx) => {
        queueMail(tx, { to: 'ghost@example.test', template: 'password-reset', data: { name: 'G', email: 'ghost@example.test', link: 'x' } });
        throw new Error('event failed');
      }),
    ).toThrow('event failed');
    expect(t.db.select({ id: mailOutbox.id }).from(mailOutbox).where(eq(mailOutbox.to, 'ghost@example.test')).all()).toEqual([]);
  });

  it('missing template data or an unknown template fails at queue time', () => {
    expect(() => queueMail(t.db, { to: 'a@b.test', template: 'password-reset', data: { name: 'A' } })).toThrow(/missing data for \{\{email\}\}, \{\{link\}\}/);
    expect(() => queueMail(t.db, { to: 'a@b.test', template: 'no-such-template', data: {} })).toThrow(/no mail template/);
  });

  it('retries with backoff after the SMTP server was down, and then delivers', async () => {
    const port = t.smtp.port;
    await t.smtp.close(); // the mail server goes down
    const id = queueMail(t.db, { to: 'patient@example.test', template: 'password-reset', data: { name: 'P', email: 'patient@example.test', link: 'http://localhost:3000/reset-password?token=abc' } }, t.clock.now());

    const first = await t.deps.mail.flush();
    expect(first).toEqual({ sent: 0, failed: 1 });
    let row = t.db.select().from(mailOutbox).where(eq(mailOutbox.id, id)).get();
    expect(row).toMatchObject({ status: 'pending', attempts: 1 });
    expect(row?.lastError).toBeTruthy();
    expect(t.deps.mail.status().lastError).toBeTruthy();

    // not due yet: nothing is tried before the backoff has passed
    expect(await t.deps.mail.flush()).toEqual({ sent: 0, failed: 0 });

    revived = await startFakeSmtp({ db: t.db, port }); // back up, same address
    t.clock.advance(retryDelayMs(1, 1_000, 60_000) + 10);
    expect(await t.deps.mail.flush()).toEqual({ sent: 1, failed: 0 });
    row = t.db.select().from(mailOutbox).where(eq(mailOutbox.id, id)).get();
    expect(row).toMatchObject({ status: 'sent', attempts: 2 });
    const caught = await t.mailbox.waitFor({ to: 'patient@example.test' });
    expect(caught.text).toContain('reset-password?token=abc');
  });

  it('the backoff doubles and is capped', () => {
    expect([1, 2, 3, 4, 10].map((a) => retryDelayMs(a, 2_000, 30_000))).toEqual([2_000, 4_000, 8_000, 16_000, 30_000]);
  });
});

describe('mail templates', () => {
  it('every template in templates/mail parses (as at start-up)', () => {
    const all = loadMailTemplates();
    expect([...all.keys()]).toEqual(expect.arrayContaining(['invitation', 'password-reset']));
    expect(all.get('invitation')?.placeholders).toEqual(['expires', 'inviter', 'link', 'role']);
  });

  it('reads the subject line and the placeholders', () => {
    const tpl = parseMailTemplate('x', 'Subject: Hi {{name}}\n\nDear {{ name }}, see {{link}}.\n');
    expect(tpl.subject).toBe('Hi {{name}}');
    expect(tpl.placeholders).toEqual(['link', 'name']);
    expect(renderMail(tpl, { name: 'Ann', link: 'L' })).toEqual({ subject: 'Hi Ann', body: 'Dear Ann, see L.\n' });
  });

  it('rejects a template without a subject line or with a broken placeholder', () => {
    expect(() => parseMailTemplate('bad', 'Hello {{name}}')).toThrow(/must start with "Subject: ..."/);
    expect(() => parseMailTemplate('bad', 'Subject: x\n\nHello {{na me}}')).toThrow(/valid \{\{placeholder\}\}/);
  });
});
