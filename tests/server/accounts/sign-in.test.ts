import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, testPassword, type TestApp } from '../helpers/test-app';

// Sign-in must be rate-limited (issue 2). Limit here: 3 failed attempts per 60 s per client
// address (issue 15: only failures count, so signing in right never uses up the limit).
let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({ signInLimit: { window: 60, max: 3 } });
  await t.createUser('editor');
});
afterAll(() => t.close());

describe('sign-in', () => {
  it('a wrong password is refused without saying which part was wrong', async () => {
    const res = await request(t.app).post('/api/auth/sign-in/email').send({ email: 'editor@test.squarewright.test', password: 'wrong-password' }).expect(401);
    expect(JSON.stringify(res.body)).not.toMatch(/password is wrong|no such user/i);
  });

  it('sets an httpOnly SameSite session cookie and signs out', async () => {
    const agent = request.agent(t.app);
    const res = await agent.post('/api/auth/sign-in/email').send({ email: 'editor@test.squarewright.test', password: testPassword }).expect(200);
    const cookie = ([] as string[]).concat(res.headers['set-cookie'] ?? []).find((c) => c.includes('session_token'));
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
    await agent.get('/api/me').expect(200);
    await agent.post('/api/auth/sign-out').set('Origin', 'http://localhost:3000').send({}).expect(200);
    await agent.get('/api/me').expect(401);
  });

  it('after 3 failed attempts in the window, further attempts get 429 even with the right password', async () => {
    // failure 1 was above (the sign-in that worked did not count)
    await request(t.app).post('/api/auth/sign-in/email').send({ email: 'editor@test.squarewright.test', password: 'wrong-again' }).expect(401);
    await request(t.app).post('/api/auth/sign-in/email').send({ email: 'editor@test.squarewright.test', password: 'wrong-thrice' }).expect(401);
    const limited = await request(t.app).post('/api/auth/sign-in/email').send({ email: 'editor@test.squarewright.test', password: testPassword });
    expect(limited.status).toBe(429);
    expect(limited.headers['x-retry-after']).toBeDefined();
  });

  it('a client cannot dodge the limit by sending its own address header', async () => {
    const res = await request(t.app)
      .post('/api/auth/sign-in/email')
      .set('X-Squarewright-Client-Ip', '203.0.113.9')
      .set('X-Forwarded-For', '203.0.113.10')
      .send({ email: 'editor@test.squarewright.test', password: testPassword });
    expect(res.status).toBe(429);
  });
});
