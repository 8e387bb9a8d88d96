import { randomUUID } from 'node:crypto';
import { chmodSync, existsSync, mkdtempSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { eq } from 'drizzle-orm';
import request from 'supertest';
import Stripe from 'stripe';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { errorBodySchema } from '../../../shared/contracts/common';
import { startServer } from '../../../server/bootstrap';
import { signatureTimeProblem, WEBHOOK_TOLERANCE_SEC } from '../../../server/areas/payouts/provider';
import { payout, payoutAccount } from '../../../server/schema';
import { queueMail } from '../../../server/platform/mail/outbox';
import { user } from '../../../server/platform/auth/schema';
import { FAKE_SECRET_KEY } from '../../../server/areas/payouts/fake-provider/index';
import { createTestApp, testPassword, type TestApp } from '../helpers/test-app';
import { createMoneyTestApp, testWebhookSecret, type MoneyTestApp } from '../payouts/money-test-app';

// Safe defaults (issue 15): private data files, a health answer that tells strangers nothing
// internal, webhook signatures inside a 5-minute window either way, events that change nothing
// answered 'ignored', sign-in limited per account too, no reset mail for deactivated accounts,
// and every sign-in error in our own words.

const mode = (p: string) => statSync(p).mode & 0o777;

describe('data files', () => {
  const dirs: string[] = [];
  afterAll(() => {
    for (const d of dirs) rmSync(d, { recursive: true, force: true });
  });

  it('a new data folder is 0700; the database, its WAL files and the secret are 0600', async () => {
    const parent = mkdtempSync(join(tmpdir(), 'sw-perm-'));
    dirs.push(parent);
    const dir = join(parent, 'data');
    const server = await startServer({ source: { PORT: '0', LOG_LEVEL: 'warn', NODE_ENV: 'test', DATA_DIR: dir, DEMO: '0' }, seeders: [], quiet: true });
    try {
      expect(mode(dir)).toBe(0o700);
      for (const f of ['squarewright.db', 'squarewright.db-wal', 'squarewright.db-shm', 'auth-secret']) {
        expect(existsSync(join(dir, f)), f).toBe(true);
        expect(mode(join(dir, f)).toString(8), f).toBe('600');
      }
    } finally {
      await server.close();
    }
  });

  it('an older install (folder 0755, database 0644, secret 0644) is tightened at start-up', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'sw-perm-old-'));
    dirs.push(dir);
    chmodSync(dir, 0o755);
    const first = await startServer({ source: { PORT: '0', LOG_LEVEL: 'warn', NODE_ENV: 'test', DATA_DIR: dir, DEMO: '0' }, seeders: [], quiet: true });
    await first.close();
    chmodSync(dir, 0o755);
    chmodSync(join(dir, 'squarewright.db'), 0o644);
    chmodSync(join(dir, 'auth-secret'), 0o644);
    const second = await startServer({ source: { PORT: '0', LOG_LEVEL: 'warn', NODE_ENV: 'test', DATA_DIR: dir, DEMO: '0' }, seeders: [], quiet: true });
    try {
      expect(mode(dir)).toBe(0o700);
      expect(mode(join(dir, 'squarewright.db'))).toBe(0o600);
      expect(mode(join(dir, 'auth-secret'))).toBe(0o600);
    } finally {
      await second.close();
    }
  });
});

describe('/api/health', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await createTestApp();
  });
  afterAll(() => t.close());

  it('says ok or degraded and nothing internal to strangers and non-admins; admins get the details', async () => {
    expect((await request(t.app).get('/api/health').expect(200)).body).toEqual({ status: 'ok' });
    expect((await (await t.signInAs('editor')).get('/api/health').expect(200)).body).toEqual({ status: 'ok' });
    const admin = (await (await t.signInAs('admin')).get('/api/health').expect(200)).body;
    expect(admin).toMatchObject({ status: 'ok', database: 'ok', mail: { transport: 'local-fake', lastError: null } });
    expect(admin.version).toMatch(/^\d+\.\d+\.\d+/);
  });

  it('with the mail server down: degraded for everyone, the error (host and port) only for admins', async () => {
    const adminAgent = await t.signInAs('admin');
    await t.smtp.close();
    queueMail(t.db, { to: 'someone@example.test', template: 'password-reset', data: { name: 'S', email: 'someone@example.test', link: 'x' } }, t.clock.now());
    await t.deps.mail.flush();
    const stranger = await request(t.app).get('/api/health').expect(200);
    expect(stranger.body).toEqual({ status: 'degraded' });
    expect(JSON.stringify(stranger.body)).not.toMatch(/127\.0\.0\.1|ECONNREFUSED|\d{4,5}/);
    const details = (await adminAgent.get('/api/health').expect(200)).body;
    expect(details.status).toBe('degraded');
    expect(details.mail.lastError).toEqual(expect.any(String));
  });
});

describe('payments webhook', () => {
  let m: MoneyTestApp;
  beforeAll(async () => {
    m = await createMoneyTestApp();
  });
  afterAll(() => m.closeAll());

  const sign = (payload: string, timestamp: number) => new Stripe(FAKE_SECRET_KEY).webhooks.generateTestHeaderString({ payload, secret: testWebhookSecret, timestamp });
  const post = (payload: string, signature: string) => request(m.app).post('/api/payments/webhook').set('content-type', 'application/json').set('stripe-signature', signature).send(payload);
  const nowSec = () => Math.floor(Date.now() / 1000);
  const accountEvent = (id: string, accountId: string) => JSON.stringify({ id, object: 'event', type: 'account.updated', data: { object: { id: accountId, object: 'account', details_submitted: true, payouts_enabled: true, external_accounts: { object: 'list', data: [{ id: 'ba_1', object: 'bank_account', bank_name: 'STRIPE TEST BANK', last4: '6789' }] } } } });

  it(`refuses signatures dated more than ${WEBHOOK_TOLERANCE_SEC / 60} minutes before or after now (400), accepts one inside`, async () => {
    const payload = JSON.stringify({ id: 'evt_window', object: 'event', type: 'balance.available', data: { object: {} } });
    for (const offset of [-600, +600, -301, +301]) {
      const res = await post(payload, sign(payload, nowSec() + offset));
      expect(res.status, `offset ${offset} s`).toBe(400);
      expect(errorBodySchema.parse(res.body).error.message).toMatch(/signature/);
    }
    for (const offset of [-240, +240]) expect((await post(payload, sign(payload, nowSec() + offset))).status, `offset ${offset} s`).toBe(200);
    expect(signatureTimeProblem('t=1000,v1=x', 1000 + 301)).toMatch(/old/);
    expect(signatureTimeProblem('t=1000,v1=x', 1000 - 301)).toMatch(/future/);
    expect(signatureTimeProblem('v1=x', 1000)).toMatch(/no time/);
  });

  it("an event that changes nothing answers 'ignored': an unknown account, an account state we have, a payout already paid", async () => {
    // unknown account
    const unknown = accountEvent('evt_unknown_account', 'acct_nobody');
    expect((await post(unknown, sign(unknown, nowSec()))).body).toEqual({ received: true, result: 'ignored' });
    // a ready setter: the same account state again changes nothing
    const s = await m.newSetter('Iris');
    const accountId = await m.onboard(s.agent, s.id);
    const stored = m.db.select({ status: payoutAccount.status, hint: payoutAccount.displayHint }).from(payoutAccount).where(eq(payoutAccount.setterId, s.id)).get();
    expect(stored?.status).toBe('ready');
    const first = accountEvent('evt_same_state_1', accountId);
    const firstAnswer = (await post(first, sign(first, nowSec()))).body;
    const again = accountEvent('evt_same_state_2', accountId);
    const againAnswer = (await post(again, sign(again, nowSec()))).body;
    // the first may bring a new hint (the fake's bank name); the second has nothing new
    expect(['applied', 'ignored']).toContain(firstAnswer.result);
    expect(againAnswer).toEqual({ received: true, result: 'ignored' });
    // a payout already paid: paid again is ignored
    m.seedFees(s.id, [700]);
    const editor = await m.signInAs('editor');
    await editor.post('/api/payouts/runs').send({ requestKey: randomUUID(), setterIds: [s.id] }).expect(201);
    await m.fake.settleAll();
    const paid = m.db.select({ id: payout.id, state: payout.state, providerPayoutId: payout.providerPayoutId }).from(payout).where(eq(payout.setterId, s.id)).get();
    expect(paid?.state).toBe('paid');
    const repeat = JSON.stringify({ id: 'evt_paid_again', object: 'event', type: 'payout.paid', data: { object: { id: paid?.providerPayoutId, object: 'payout', status: 'paid', amount: 700, currency: 'gbp' } } });
    expect((await post(repeat, sign(repeat, nowSec()))).body).toEqual({ received: true, result: 'ignored' });
  });
});

describe('sign-in and reset', () => {
  let t: TestApp;
  const email = 'locked@test.squarewright.test';
  beforeAll(async () => {
    t = await createTestApp({ signInLimit: { window: 60, max: 1000 } });
    await t.createUser('setter', { email, name: 'Lena Locke' });
  });
  afterAll(() => t.close());

  const signIn = (password: string) => request(t.app).post('/api/auth/sign-in/email').send({ email, password });

  it('ten failed sign-ins lock the account (clear message, a mail to its owner), even for the right password; a reset unlocks it', async () => {
    for (let i = 0; i < 10; i += 1) expect((await signIn(`wrong-password-${i}`)).status).toBe(401);
    const locked = await signIn(testPassword);
    expect(locked.status).toBe(429);
    const err = errorBodySchema.parse(locked.body).error;
    expect(err.code).toBe('rate_limited');
    expect(err.message).toMatch(/This account is locked for 15 more minutes after 10 failed sign-ins/);
    expect(Number(locked.headers['x-retry-after'])).toBeGreaterThan(800);
    const mail = await t.mailbox.waitFor({ to: email, subject: 'locked' });
    expect(mail.text).toContain('10 times');
    expect(mail.text).toContain('http://localhost:3000/forgot-password');
    // a reset lifts the lock at once
    await request(t.app).post('/api/auth/request-password-reset').send({ email, redirectTo: '/reset-password' }).expect(200);
    const reset = await t.mailbox.waitFor({ to: email, subject: 'Reset' });
    const token = new URL(`http://x${t.mailbox.linkIn(reset, '/reset-password')}`).searchParams.get('token');
    await request(t.app).post('/api/auth/reset-password').send({ token, newPassword: 'a-brand-new-password' }).expect(200);
    expect((await signIn('a-brand-new-password')).status).toBe(200);
  });

  it('the lock ends by itself after 15 minutes', async () => {
    for (let i = 0; i < 10; i += 1) await signIn(`wrong-again-${i}`);
    expect((await signIn('a-brand-new-password')).status).toBe(429);
    t.clock.advance(15 * 60 * 1000 + 1000);
    expect((await signIn('a-brand-new-password')).status).toBe(200);
  });

  it('a deactivated account gets no reset mail (and the answer does not say so)', async () => {
    const banned = 'gone@test.squarewright.test';
    const id = await t.createUser('printer', { email: banned });
    t.db.update(user).set({ banned: true }).where(eq(user.id, id)).run();
    const res = await request(t.app).post('/api/auth/request-password-reset').send({ email: banned, redirectTo: '/reset-password' }).expect(200);
    const unknown = await request(t.app).post('/api/auth/request-password-reset').send({ email: 'nobody@test.squarewright.test', redirectTo: '/reset-password' }).expect(200);
    expect(res.body).toEqual(unknown.body);
    await t.deps.mail.flush();
    expect(t.mailbox.all().filter((m) => m.to.includes(banned))).toEqual([]);
  });

  it.each([
    ['a wrong password', () => request(t.app).post('/api/auth/sign-in/email').send({ email: 'nobody@test.squarewright.test', password: 'wrong-password' }), 401, 'The e-mail address or the password is not right.'],
    ['a deactivated account', () => request(t.app).post('/api/auth/sign-in/email').send({ email: 'gone@test.squarewright.test', password: testPassword }), 403, 'This account has been deactivated. Ask an admin of your desk if you need it again.'],
    ['a reset link used twice or made up', () => request(t.app).post('/api/auth/reset-password').send({ token: 'made-up-token', newPassword: 'another-long-password' }), 400, 'This link is not valid any more: it was used already, or it has expired. Ask for a new one.'],
    ['a password too short', () => request(t.app).post('/api/auth/reset-password').send({ token: 'made-up-token', newPassword: 'short' }), 400, 'The password is too short: use at least 10 characters.'],
    ['a missing e-mail', () => request(t.app).post('/api/auth/sign-in/email').send({ password: 'whatever-password' }), 400, 'Some fields are missing or not valid: check the e-mail address and the password.'],
    ['an unknown sign-in path', () => request(t.app).post('/api/auth/no-such-thing').send({}), 404, 'There is no such sign-in page or account.'],
    ['a body that is not JSON', () => request(t.app).post('/api/auth/sign-in/email').set('content-type', 'application/json').send('{"email":'), 400, 'The request body is not valid JSON.'],
  ])('%s: our words, in our error shape', async (_what, call, status, message) => {
    const res = await call();
    expect(res.status).toBe(status);
    const err = errorBodySchema.parse(res.body).error;
    expect(err.message).toBe(message);
    expect(JSON.stringify(res.body)).not.toMatch(/banned|Invalid email|Invalid token|support/i);
  });
});
