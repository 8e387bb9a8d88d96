import request from 'supertest';
import type TestAgent from 'supertest/lib/agent';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../helpers/test-app';

// Issue 16: pending invitations, listed for admins, resent (a new link for another week;
// the old link stops working) and revoked (the link stops working).

let t: TestApp;
let admin: TestAgent;
beforeAll(async () => {
  t = await createTestApp();
  admin = await t.signInAs('admin');
});
afterAll(() => t.close());

const tokenOf = (mail: Parameters<TestApp['mailbox']['linkIn']>[0]) => t.mailbox.linkIn(mail, '/invite/').slice('/invite/'.length);

describe('pending invitations', () => {
  it('lists invitations not yet accepted, with expired ones, and not the accepted ones', async () => {
    await admin.post('/api/invitations').send({ email: 'setter.one@example.test', role: 'setter' }).expect(201);
    await admin.post('/api/invitations').send({ email: 'taken@example.test', role: 'printer' }).expect(201);
    const token = tokenOf(await t.mailbox.waitFor({ to: 'taken@example.test' }));
    await request(t.app).post(`/api/invitations/${token}/accept`).send({ name: 'Pat Press', password: 'a-long-enough-password' }).expect(201);
    const list = (await admin.get('/api/invitations').expect(200)).body.invitations;
    expect(list.map((i: { email: string; role: string; expired: boolean }) => `${i.email}:${i.role}:${i.expired}`)).toEqual(['setter.one@example.test:setter:false']);
    expect(list[0].invitedByName).toBeTruthy();
    // a week later the link has expired; it is still listed, as expired
    t.clock.advance(8 * 86_400_000);
    expect((await admin.get('/api/invitations').expect(200)).body.invitations[0].expired).toBe(true);
  });

  it('resends: a new link that works for another week, and the old one no longer does', async () => {
    const old = tokenOf(await t.mailbox.waitFor({ to: 'setter.one@example.test' }));
    const id = (await admin.get('/api/invitations').expect(200)).body.invitations[0].id;
    const before = t.mailbox.all().filter((m) => m.to.includes('setter.one@example.test')).length;
    const res = await admin.post(`/api/invitations/${id}/resend`).expect(200);
    expect(res.body.invitation).toMatchObject({ email: 'setter.one@example.test', expired: false });
    await expect.poll(async () => (await t.mailbox.waitFor({ to: 'setter.one@example.test' }), t.mailbox.all().filter((m) => m.to.includes('setter.one@example.test')).length)).toBe(before + 1);
    const fresh = tokenOf(t.mailbox.all().filter((m) => m.to.includes('setter.one@example.test')).at(-1)!);
    expect(fresh).not.toBe(old);
    await request(t.app).get(`/api/invitations/${old}`).expect(404);
    expect((await request(t.app).get(`/api/invitations/${fresh}`).expect(200)).body).toMatchObject({ valid: true, role: 'setter' });
  });

  it('revokes: the link stops working and the invitation leaves the list; only admins may', async () => {
    await admin.post('/api/invitations').send({ email: 'second.thoughts@example.test', role: 'editor' }).expect(201);
    const token = tokenOf(await t.mailbox.waitFor({ to: 'second.thoughts@example.test' }));
    const id = (await admin.get('/api/invitations').expect(200)).body.invitations.find((i: { email: string }) => i.email === 'second.thoughts@example.test').id;
    const editor = await t.signInAs('editor');
    await editor.get('/api/invitations').expect(403);
    await editor.post(`/api/invitations/${id}/revoke`).expect(403);
    await admin.post(`/api/invitations/${id}/revoke`).expect(204);
    await request(t.app).get(`/api/invitations/${token}`).expect(404);
    await request(t.app).post(`/api/invitations/${token}/accept`).send({ name: 'Too Late', password: 'a-long-enough-password' }).expect(404);
    expect((await admin.get('/api/invitations').expect(200)).body.invitations.map((i: { email: string }) => i.email)).not.toContain('second.thoughts@example.test');
    await admin.post(`/api/invitations/${id}/revoke`).expect(404);
    await admin.post('/api/invitations/not-a-uuid/resend').expect(400);
  });
});
