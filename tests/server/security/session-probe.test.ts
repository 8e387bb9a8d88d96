import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../helpers/test-app';

// GET /api/session: the app's start-up question "who is signed in?" answers 200 with
// { user: null } to a visitor without a session (a 401 there shows as an error in the browser's
// console on every signed-out page), and the same user as GET /api/me with one. /api/me stays 401.
let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

describe('GET /api/session', () => {
  it('answers { user: null } without a session, and /api/me still 401', async () => {
    const res = await request(t.rawApp).get('/api/session').expect(200);
    expect(res.body).toEqual({ user: null });
    await request(t.rawApp).get('/api/me').expect(401);
  });

  it('answers { user: null } for a forged or stale cookie', async () => {
    const res = await request(t.rawApp).get('/api/session').set('Cookie', 'better-auth.session_token=forged.value').expect(200);
    expect(res.body).toEqual({ user: null });
  });

  it('answers the signed-in user, the same as /api/me', async () => {
    const agent = await t.signInAs('editor');
    const session = (await agent.get('/api/session').expect(200)).body;
    const me = (await agent.get('/api/me').expect(200)).body;
    expect(session.user.role).toBe('editor');
    expect(session).toEqual(me);
  });
});
