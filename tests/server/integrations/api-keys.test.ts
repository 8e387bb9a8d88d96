import { createHash } from 'node:crypto';
import { eq } from 'drizzle-orm';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { betterAuthLog } from '../../../server/platform/auth/auth';
import { apikey } from '../../../server/platform/auth/schema';
import { scopesToPermissions } from '../../../server/platform/auth/api-keys';
import { createTestApp, type TestApp } from '../helpers/test-app';

// API keys for machines (issue 18): a key acts as its owner through the same permission table
// as a session, limited to its scopes; it is shown once, stored hashed, revocable at once,
// and rate-limited per key.

let t: TestApp;
let editor: Awaited<ReturnType<TestApp['signInAs']>>;
beforeAll(async () => {
  t = await createTestApp();
  editor = await t.signInAs('editor');
});
afterAll(() => t.close());

async function makeKey(scopes: string[], name = 'script') {
  const res = await editor.post('/api/api-keys').send({ name, scopes, expiresInDays: 30 }).expect(201);
  return res.body as { apiKey: { id: string; scopes: string[]; status: string; start: string | null }; secret: string };
}

const bearer = (key: string) => ({ Authorization: `Bearer ${key}` });

describe('a key with stock:read', () => {
  it('reads the stock, and gets 403 on a write and on a route outside its scope', async () => {
    const { secret, apiKey } = await makeKey(['stock:read']);
    expect(apiKey.scopes).toEqual(['stock:read']);
    expect(secret.startsWith('sqw_')).toBe(true);
    const list = await request(t.app).get('/api/stock').set(bearer(secret)).expect(200);
    expect(list.body).toHaveProperty('items');
    // a write, from a script (no Origin header: not a browser, so no cross-site check applies)
    const write = await request(t.app).post('/api/puzzles').set(bearer(secret)).send({}).expect(403);
    expect(write.body.error.code).toBe('forbidden');
    expect(write.body.error.message).toContain('puzzles:write');
    await request(t.app).get('/api/editions').set(bearer(secret)).expect(403);
    // never callable with a key at all (sessions only): managing keys
    const keys = await request(t.app).get('/api/api-keys').set(bearer(secret)).expect(403);
    expect(keys.body.error.message).toContain('cannot be called with an API key');
  });

  it('is shown once and stored only as its SHA-256 hash', async () => {
    const { secret, apiKey } = await makeKey(['stock:read'], 'hash check');
    const row = t.db.select({ key: apikey.key, start: apikey.start }).from(apikey).where(eq(apikey.id, apiKey.id)).get();
    // the stored value is base64url(SHA-256(key)) computed here with node:crypto, not the key
    expect(row?.key).toBe(createHash('sha256').update(secret).digest('base64url'));
    expect(row?.key).not.toContain(secret.slice(4, 20));
    expect(secret.startsWith(row?.start ?? '-')).toBe(true);
    const listed = await editor.get('/api/api-keys').expect(200);
    expect(JSON.stringify(listed.body)).not.toContain(secret);
  });
});

describe('revoking and expiry', () => {
  it('a revoked key answers 401 on its very next request', async () => {
    const { secret, apiKey } = await makeKey(['stock:read'], 'to revoke');
    await request(t.app).get('/api/stock/summary').set(bearer(secret)).expect(200);
    const revoked = await editor.post(`/api/api-keys/${apiKey.id}/revoke`).send({}).expect(200);
    expect(revoked.body.status).toBe('revoked');
    const res = await request(t.app).get('/api/stock/summary').set(bearer(secret)).expect(401);
    expect(res.body.error).toMatchObject({ code: 'unauthorized' });
  });

  it('a refused key is not logged as a server error (better-auth\u2019s other lines still are)', () => {
    const error = vi.spyOn(console, 'error').mockImplementation(() => undefined);
    try {
      betterAuthLog('error', 'Failed to validate API key:', new Error('API Key is disabled'));
      expect(error).not.toHaveBeenCalled();
      betterAuthLog('error', 'Something else went wrong');
      expect(error).toHaveBeenCalledTimes(1);
      expect(String(error.mock.calls[0]![0])).toContain('ERROR [Better Auth]: Something else went wrong');
    } finally {
      error.mockRestore();
    }
  });

  it('an admin revokes an editor\u2019s key, and its next request answers 401', async () => {
    const { secret, apiKey } = await makeKey(['stock:read'], 'left behind');
    await request(t.app).get('/api/stock/summary').set(bearer(secret)).expect(200);
    const admin = await t.signInAs('admin');
    const revoked = await admin.post(`/api/api-keys/${apiKey.id}/revoke`).send({}).expect(200);
    expect(revoked.body).toMatchObject({ id: apiKey.id, status: 'revoked' });
    await request(t.app).get('/api/stock/summary').set(bearer(secret)).expect(401);
    const mine = (await editor.get('/api/api-keys').expect(200)).body.items as { id: string; status: string }[];
    expect(mine.find((k) => k.id === apiKey.id)?.status).toBe('revoked');
  });

  it('an expired key, an unknown key and a malformed header answer 401', async () => {
    const { secret, apiKey } = await makeKey(['stock:read'], 'expiring');
    t.db.update(apikey).set({ expiresAt: new Date(Date.now() - 1000) }).where(eq(apikey.id, apiKey.id)).run();
    expect((await request(t.app).get('/api/stock').set(bearer(secret)).expect(401)).body.error.message).toContain('expired');
    await request(t.app).get('/api/stock').set(bearer(`sqw_${'x'.repeat(48)}`)).expect(401);
    await request(t.app).get('/api/stock').set({ Authorization: 'Bearer' }).expect(401);
  });

  it('a key never borrows the session cookie sent beside it', async () => {
    // the editor's agent carries a valid session cookie; a bad key beside it still fails
    await editor.get('/api/stock').set(bearer(`sqw_${'y'.repeat(48)}`)).expect(401);
  });
});

describe('the last use and the rate per key', () => {
  it('records when a key was last used', async () => {
    const { secret, apiKey } = await makeKey(['stock:read'], 'last use');
    const before = (await editor.get('/api/api-keys').expect(200)).body.items.find((k: { id: string }) => k.id === apiKey.id);
    expect(before.lastUsedAt).toBeNull();
    await request(t.app).get('/api/stock').set(bearer(secret)).expect(200);
    const after = (await editor.get('/api/api-keys').expect(200)).body.items.find((k: { id: string }) => k.id === apiKey.id);
    expect(Date.parse(after.lastUsedAt)).toBeGreaterThan(Date.now() - 60_000);
  });

  it('answers 429 with Retry-After past the key\u2019s rate, and other keys go on', async () => {
    const userId = (await t.createUser('editor'));
    const made = await t.deps.auth.api.createApiKey({ body: { userId, name: 'tight', permissions: scopesToPermissions(['stock:read']), rateLimitMax: 3, rateLimitTimeWindow: 60_000 } });
    const statuses: number[] = [];
    for (let i = 0; i < 4; i++) statuses.push((await request(t.app).get('/api/stock/summary').set(bearer(made.key))).status);
    expect(statuses).toEqual([200, 200, 200, 429]);
    const limited = await request(t.app).get('/api/stock/summary').set(bearer(made.key)).expect(429);
    expect(limited.body.error.code).toBe('rate_limited');
    expect(Number(limited.headers['retry-after'])).toBeGreaterThan(0);
    const { secret } = await makeKey(['stock:read'], 'unaffected');
    await request(t.app).get('/api/stock/summary').set(bearer(secret)).expect(200);
  });
});

describe('who may make which keys', () => {
  it('a key acts as its owner: the permission table still applies', async () => {
    const { secret } = await makeKey(['submissions:write'], 'reviewer');
    // an editor may check tilings; a bearer request is not refused by the cross-site check
    const check = await request(t.app).post('/api/tilings/check').set(bearer(secret)).send({ code: '9 33 32 (18,15)(7,8)(14,4)(10,1)(9)' });
    expect(check.status).toBe(200);
    // submitting is for setters (permission table): the editor's key gets 403
    await request(t.app).post('/api/submissions').set(bearer(secret)).send({ code: '9 33 32 (18,15)(7,8)(14,4)(10,1)(9)', source: 'paste' }).expect(403);
  });

  it('printers and setters may not make keys; editors see only their own, admins every key', async () => {
    await (await t.signInAs('printer')).post('/api/api-keys').send({ name: 'x', scopes: ['editions:read'], expiresInDays: 1 }).expect(403);
    await (await t.signInAs('setter')).get('/api/api-keys').expect(403);
    const admin = await t.signInAs('admin');
    const adminKey = (await admin.post('/api/api-keys').send({ name: 'admin key', scopes: ['editions:read'], expiresInDays: 7 }).expect(201)).body;
    const mine = (await editor.get('/api/api-keys').expect(200)).body.items as { id: string }[];
    expect(mine.map((k) => k.id)).not.toContain(adminKey.apiKey.id);
    await editor.post(`/api/api-keys/${adminKey.apiKey.id}/revoke`).send({}).expect(404);
    const all = (await admin.get('/api/api-keys').expect(200)).body.items as { id: string }[];
    expect(all.length).toBeGreaterThan(mine.length);
  });

  it('refuses bad input with 400 and where', async () => {
    const res = await editor.post('/api/api-keys').send({ name: '', scopes: ['stock:write'], expiresInDays: 400 }).expect(400);
    const paths = (res.body.error.details as { path: string }[]).map((d) => d.path);
    expect(paths).toEqual(expect.arrayContaining(['body.name', 'body.scopes.0', 'body.expiresInDays']));
  });

  it('the plugin\u2019s own endpoints under /api/auth are switched off', async () => {
    const res = await editor.post('/api/auth/api-key/create').send({ name: 'sneaky' });
    expect(res.status).toBe(404);
  });
});
