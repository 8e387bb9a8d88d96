import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { invitation } from '../../../server/areas/accounts/schema';
import { hashToken, invitationLifetimeMs } from '../../../server/areas/accounts/invitations';
import { errorBodySchema } from '../../../shared/contracts/common';
import { adminUserListResponseSchema, mailboxListResponseSchema, mailboxMessageResponseSchema } from '../../../shared/contracts/users';
import { createTestApp, testPassword, type TestApp } from '../helpers/test-app';

// Invitations, password reset, admin users and the Mailbox (local), end to end through the
// local fake SMTP server (the mails are read back as the invitee would read them).
let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

describe('invitations', () => {
  it('an invited user gets a mail whose one-time link completes sign-up and signs in', async () => {
    const admin = await t.signInAs('admin');
    const created = await admin.post('/api/invitations').send({ email: 'New.Printer@Example.test', role: 'printer' }).expect(201);
    expect(created.body.invitation).toMatchObject({ email: 'new.printer@example.test', role: 'printer' });

    const mail = await t.mailbox.waitFor({ to: 'new.printer@example.test' });
    expect(mail.subject).toContain('printer');
    const link = t.mailbox.linkIn(mail, '/invite/');
    const token = link.slice('/invite/'.length);

    // only the hash of the token is stored
    const stored = t.db.select({ tokenHash: invitation.tokenHash }).from(invitation).all();
    expect(stored.map((s) => s.tokenHash)).toContain(hashToken(token));
    expect(stored.map((s) => s.tokenHash)).not.toContain(token);

    const lookup = await request(t.app).get(`/api/invitations/${token}`).expect(200);
    expect(lookup.body).toEqual({ email: 'new.printer@example.test', role: 'printer', valid: true });

    const invitee = request.agent(t.app);
    const accepted = await invitee.post(`/api/invitations/${token}/accept`).send({ name: 'Nell Printer', password: 'a-good-long-password' }).expect(201);
    expect(accepted.body.user).toMatchObject({ email: 'new.printer@example.test', role: 'printer', name: 'Nell Printer' });
    const cookies = ([] as string[]).concat(accepted.headers['set-cookie'] ?? []);
    expect(cookies.join(';')).toMatch(/HttpOnly/i);
    expect(cookies.join(';')).toMatch(/SameSite=Lax/i);
    const me = await invitee.get('/api/me').expect(200);
    expect(me.body.user.role).toBe('printer');

    // single use
    const again = await request(t.app).post(`/api/invitations/${token}/accept`).send({ name: 'X', password: 'another-long-password' }).expect(409);
    expect(errorBodySchema.parse(again.body).error.code).toBe('conflict');
    const used = await request(t.app).get(`/api/invitations/${token}`).expect(200);
    expect(used.body).toMatchObject({ valid: false, reason: 'used' });
  });

  it('an expired invitation cannot be accepted', async () => {
    const admin = await t.signInAs('admin');
    await admin.post('/api/invitations').send({ email: 'late@example.test', role: 'setter' }).expect(201);
    const token = t.mailbox.linkIn(await t.mailbox.waitFor({ to: 'late@example.test' }), '/invite/').slice('/invite/'.length);
    t.clock.advance(invitationLifetimeMs + 1000);
    try {
      const lookup = await request(t.app).get(`/api/invitations/${token}`).expect(200);
      expect(lookup.body).toMatchObject({ valid: false, reason: 'expired' });
      await request(t.app).post(`/api/invitations/${token}/accept`).send({ name: 'Late', password: 'a-good-long-password' }).expect(409);
    } finally {
      t.clock.advance(-(invitationLifetimeMs + 1000));
    }
  });

  it('an unknown token is a 404; a short password is a 400 that names the field', async () => {
    await request(t.app).get(`/api/invitations/${'x'.repeat(43)}`).expect(404);
    const admin = await t.signInAs('admin');
    await admin.post('/api/invitations').send({ email: 'short@example.test', role: 'editor' }).expect(201);
    const token = t.mailbox.linkIn(await t.mailbox.waitFor({ to: 'short@example.test' }), '/invite/').slice('/invite/'.length);
    const res = await request(t.app).post(`/api/invitations/${token}/accept`).send({ name: 'S', password: 'short' }).expect(400);
    expect(res.body.error.details).toEqual([expect.objectContaining({ path: 'body.password' })]);
    // the failed attempt did not use up the invitation
    const row = t.db.select({ acceptedAt: invitation.acceptedAt }).from(invitation).where(eq(invitation.email, 'short@example.test')).get();
    expect(row?.acceptedAt).toBeNull();
  });

  it('inviting an existing user is a conflict; only admins invite', async () => {
    const admin = await t.signInAs('admin');
    await t.createUser('setter', { email: 'exists@example.test' });
    await admin.post('/api/invitations').send({ email: 'exists@example.test', role: 'setter' }).expect(409);
    const editor = await t.signInAs('editor');
    await editor.post('/api/invitations').send({ email: 'nope@example.test', role: 'setter' }).expect(403);
  });
});

describe('cross-site requests', () => {
  it('a session request with a cookie from a foreign origin is refused; our own origin is accepted', async () => {
    const agent = await t.signInAs('editor');
    await agent.post('/api/auth/sign-out').set('Origin', 'http://evil.example.test').send({}).expect(403);
    await agent.get('/api/me').expect(200);
    await agent.post('/api/auth/sign-out').set('Origin', 'http://127.0.0.1:3000').send({}).expect(200);
    await agent.get('/api/me').expect(401);
  });
});

describe('password reset', () => {
  it('the reset mail arrives and its link sets a new password', async () => {
    await t.createUser('setter', { email: 'forgetful@example.test' });
    await request(t.app)
      .post('/api/auth/request-password-reset')
      .send({ email: 'forgetful@example.test', redirectTo: '/reset-password' })
      .expect(200);
    const mail = await t.mailbox.waitFor({ to: 'forgetful@example.test', subject: 'Reset' });
    const link = t.mailbox.linkIn(mail, '/reset-password?token=');
    const token = decodeURIComponent(link.slice('/reset-password?token='.length));
    await request(t.app).post('/api/auth/reset-password').send({ token, newPassword: 'my-brand-new-password' }).expect(200);

    await request(t.app).post('/api/auth/sign-in/email').send({ email: 'forgetful@example.test', password: testPassword }).expect(401);
    await request(t.app).post('/api/auth/sign-in/email').send({ email: 'forgetful@example.test', password: 'my-brand-new-password' }).expect(200);
    // the token works once
    await request(t.app).post('/api/auth/reset-password').send({ token, newPassword: 'yet-another-password' }).expect(400);
  });
});

describe('admin users', () => {
  it('lists users with role and active, changes a role, deactivates and ends the sessions', async () => {
    const admin = await t.signInAs('admin');
    const victim = await t.signInAs('editor', { email: 'moving@example.test' });
    await victim.get('/api/me').expect(200);
    const list = adminUserListResponseSchema.parse((await admin.get('/api/admin/users').expect(200)).body);
    const row = list.users.find((u) => u.email === 'moving@example.test');
    expect(row).toMatchObject({ role: 'editor', active: true });

    const changed = await admin.patch(`/api/admin/users/${row?.id}`).send({ role: 'printer' }).expect(200);
    expect(changed.body.user.role).toBe('printer');
    expect((await victim.get('/api/me').expect(200)).body.user.role).toBe('printer');

    const off = await admin.patch(`/api/admin/users/${row?.id}`).send({ active: false }).expect(200);
    expect(off.body.user.active).toBe(false);
    await victim.get('/api/me').expect(401);
    await request(t.app).post('/api/auth/sign-in/email').send({ email: 'moving@example.test', password: testPassword }).expect(403);
  });

  it('an admin cannot demote or deactivate themself', async () => {
    const admin = await t.signInAs('admin');
    const me = (await admin.get('/api/me').expect(200)).body.user;
    await admin.patch(`/api/admin/users/${me.id}`).send({ role: 'editor' }).expect(409);
    await admin.patch(`/api/admin/users/${me.id}`).send({ active: false }).expect(409);
    await admin.patch(`/api/admin/users/${me.id}`).send({}).expect(400);
    await admin.patch('/api/admin/users/no-such-user').send({ active: true }).expect(404);
  });
});

describe('Mailbox (local)', () => {
  it('admins read caught mails; other roles may not', async () => {
    const admin = await t.signInAs('admin');
    await admin.post('/api/invitations').send({ email: 'mailbox@example.test', role: 'setter' }).expect(201);
    await t.mailbox.waitFor({ to: 'mailbox@example.test' });
    const list = mailboxListResponseSchema.parse((await admin.get('/api/mailbox').expect(200)).body);
    const summary = list.messages.find((m) => m.to.includes('mailbox@example.test'));
    expect(summary).toBeDefined();
    const one = mailboxMessageResponseSchema.parse((await admin.get(`/api/mailbox/${summary?.id}`).expect(200)).body);
    expect(one.message.text).toContain('/invite/');
    await admin.get('/api/mailbox/999999').expect(404);
    await (await t.signInAs('editor')).get('/api/mailbox').expect(403);
  });
});
