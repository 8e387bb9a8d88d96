import { eq } from 'drizzle-orm';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { parseCookieHeader, verifySignedToken } from '../../../server/platform/auth/session-reader';
import { session, user } from '../../../server/platform/auth/schema';
import { createTestApp, testPassword, type TestApp } from '../helpers/test-app';

// route() reads the session straight from the database on every request (no cache) and hands
// every case but a live, well-signed session that needs no extension to better-auth. These
// checks hold the fast path to better-auth's own behaviour: its cookies, its sign-out, its
// daily extension (session.updateAge) and its clean-up of expired sessions.

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

const DAY = 24 * 60 * 60 * 1000;

async function signIn(email: string): Promise<string> {
  await t.createUser('editor', { email });
  const res = await request(t.app).post('/api/auth/sign-in/email').send({ email, password: testPassword }).expect(200);
  const cookie = ([] as string[]).concat(res.headers['set-cookie'] ?? []).find((c) => c.includes('session_token'));
  if (!cookie) throw new Error('no session cookie');
  return cookie.split(';')[0]!;
}

function tokenOf(cookie: string): string {
  const value = parseCookieHeader(cookie).values().next().value!;
  return value.slice(0, value.lastIndexOf('.'));
}

describe('the session read by route()', () => {
  it('accepts the cookie better-auth signs and refuses one with a changed signature or token', async () => {
    const cookie = await signIn('fast-1@example.test');
    const [name, value] = [...parseCookieHeader(cookie)][0]!;
    const secret = (await t.deps.auth.$context).secret;
    // the token better-auth signed is the one it stored for the session
    const token = verifySignedToken(value, secret);
    expect(token).not.toBeNull();
    expect(t.db.select({ id: session.id }).from(session).where(eq(session.token, token!)).get()).toBeDefined();
    await request(t.app).get('/api/me').set('Cookie', cookie).expect(200);

    const sig = value.slice(value.lastIndexOf('.') + 1);
    const badSig = `${token}.${sig[0] === 'A' ? 'B' : 'A'}${sig.slice(1)}`;
    expect(verifySignedToken(badSig, secret)).toBeNull();
    await request(t.app).get('/api/me').set('Cookie', `${name}=${encodeURIComponent(badSig)}`).expect(401);
    const otherToken = `${token!.slice(0, -1)}${token!.endsWith('x') ? 'y' : 'x'}.${sig}`;
    await request(t.app).get('/api/me').set('Cookie', `${name}=${encodeURIComponent(otherToken)}`).expect(401);
  });

  it('a cookie replayed after sign-out is refused at once', async () => {
    const cookie = await signIn('fast-2@example.test');
    await request(t.app).get('/api/me').set('Cookie', cookie).expect(200);
    await request(t.app).post('/api/auth/sign-out').set('Cookie', cookie).set('Origin', 'http://localhost:3000').send({}).expect(200);
    await request(t.app).get('/api/me').set('Cookie', cookie).expect(401);
  });

  it('a ban or a role change written to the database counts on the very next request', async () => {
    const cookie = await signIn('fast-3@example.test');
    const id = t.db.select({ id: user.id }).from(user).where(eq(user.email, 'fast-3@example.test')).get()!.id;
    expect((await request(t.app).get('/api/me').set('Cookie', cookie).expect(200)).body.user.role).toBe('editor');
    t.db.update(user).set({ role: 'printer' }).where(eq(user.id, id)).run();
    expect((await request(t.app).get('/api/me').set('Cookie', cookie).expect(200)).body.user.role).toBe('printer');
    t.db.update(user).set({ banned: true }).where(eq(user.id, id)).run();
    await request(t.app).get('/api/me').set('Cookie', cookie).expect(401);
  });

  it('a session due for its daily extension is extended by better-auth and the new cookie is passed on', async () => {
    const cookie = await signIn('fast-4@example.test');
    const token = tokenOf(cookie);
    // sessions last 7 days and are extended once a day old (server/platform/auth/auth.ts): make this one 2 days old
    const old = new Date(Date.now() + 5 * DAY);
    t.db.update(session).set({ expiresAt: old }).where(eq(session.token, token)).run();
    const res = await request(t.app).get('/api/me').set('Cookie', cookie).expect(200);
    expect(([] as string[]).concat(res.headers['set-cookie'] ?? []).some((c) => c.includes('session_token'))).toBe(true);
    const after = t.db.select({ expiresAt: session.expiresAt }).from(session).where(eq(session.token, token)).get()!;
    expect(after.expiresAt.getTime()).toBeGreaterThan(Date.now() + 6 * DAY);
  });

  it('an expired session is refused and removed, as better-auth does', async () => {
    const cookie = await signIn('fast-5@example.test');
    const token = tokenOf(cookie);
    t.db.update(session).set({ expiresAt: new Date(Date.now() - 1000) }).where(eq(session.token, token)).run();
    await request(t.app).get('/api/me').set('Cookie', cookie).expect(401);
    expect(t.db.select({ id: session.id }).from(session).where(eq(session.token, token)).get()).toBeUndefined();
  });
});

describe('parseCookieHeader', () => {
  // cookie syntax: RFC 6265 section 4.2.1 (name=value pairs separated by "; "; a value may be quoted)
  it('reads pairs, quoted and percent-encoded values, and keeps the first of a repeated name', () => {
    const m = parseCookieHeader('a=1; b="two"; c=x%2By%3D; a=3; junk; d=');
    expect(m.get('a')).toBe('1');
    expect(m.get('b')).toBe('two');
    expect(m.get('c')).toBe('x+y=');
    expect(m.get('d')).toBe('');
    expect(m.has('junk')).toBe(false);
  });
});
