import { createHash } from 'node:crypto';
import { sql } from 'drizzle-orm';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { errorBodySchema, type Role } from '../../../shared/contracts/common';
import { permissions } from '../../../server/platform/auth/permissions';
import { signatureCheckedPaths } from '../../../server/app';
import { allowedOrigins, crossSiteReason } from '../../../server/platform/http/same-origin';
import { createTestApp, type TestApp } from '../helpers/test-app';

// Cross-site request forgery (issue 15): with a valid session cookie, a state-changing request
// whose Origin is another site's, or that carries neither Origin nor Referer, is refused with
// 403 in our error shape on EVERY such route of the permission table (server/platform/auth/
// permissions.ts), better-auth's own POSTs included, and changes nothing in the database.
// The rule is OWASP's "verifying origin with standard headers" (CSRF Prevention Cheat Sheet).

let t: TestApp;
const cookies = new Map<Role, string>();
const OWN = 'http://localhost:3000';
const EVIL = 'http://evil.example';

async function cookieOf(role: Role): Promise<string> {
  const known = cookies.get(role);
  if (known) return known;
  const agent = await t.signInAs(role);
  const jar = agent.jar.getCookies({ domain: '127.0.0.1', path: '/', secure: false, script: false });
  const cookie = jar.map((c) => `${c.name}=${c.value}`).join('; ');
  cookies.set(role, cookie);
  return cookie;
}

/** A role the table lets call the route ('public' and 'signed-in' routes: an admin). */
function roleFor(key: string): Role {
  const access = permissions[key];
  if (access === undefined || typeof access === 'string') return 'admin';
  if (access.includes('editor') || access.includes('admin')) return 'admin';
  return access[0] ?? 'admin';
}

const samplePath = (path: string) => path.replace(/:([A-Za-z_]+)/g, (_m, name: string) => (name === 'token' ? 'abc' : name === 'month' ? '2026-03' : '1'));

/** Every row of every table, hashed: a refused request must leave it as it was. */
function databaseHash(): string {
  const tables = t.db.all<{ name: string }>(sql`select name from sqlite_master where type = 'table' and name not like 'sqlite_%' and name not like '__drizzle%' order by name`);
  const h = createHash('sha256');
  for (const { name } of tables) h.update(name).update(JSON.stringify(t.db.all(sql.raw(`select * from "${name}" order by rowid`))));
  return h.digest('hex');
}

const authPosts = ['/api/auth/sign-in/email', '/api/auth/sign-out', '/api/auth/request-password-reset', '/api/auth/reset-password', '/api/auth/admin/set-role', '/api/auth/admin/ban-user', '/api/auth/update-user', '/api/auth/change-password'];

beforeAll(async () => {
  // payments configured (the provider is never called here), so the webhook checks signatures
  t = await createTestApp({ env: { PAYMENTS_API_URL: 'http://127.0.0.1:9', PAYMENTS_WEBHOOK_SECRET: 'whsec_test_squarewright_0123456789abcdef' } });
  for (const role of ['admin', 'editor', 'setter', 'printer'] as const) await cookieOf(role);
});
afterAll(() => t.close());

describe('state-changing routes refuse forged requests', () => {
  const stateChanging = () => [...t.app.api.registered].filter((k) => !k.startsWith('GET ') && !signatureCheckedPaths.includes(k.split(' ')[1]!));

  it('the permission table has state-changing routes to walk', () => {
    expect(stateChanging().length).toBeGreaterThan(25);
  });

  for (const variant of ['foreign Origin', 'no Origin or Referer', 'Origin null', 'foreign Referer'] as const) {
    it(`every state-changing route of the permission table: ${variant} -> 403, nothing changes`, async () => {
      const before = databaseHash();
      const failures: string[] = [];
      for (const key of stateChanging()) {
        const [method, path] = key.split(' ') as [string, string];
        let req = request(t.rawApp)[method.toLowerCase() as 'post' | 'patch' | 'put' | 'delete'](samplePath(path)).set('Cookie', await cookieOf(roleFor(key)));
        if (variant === 'foreign Origin') req = req.set('Origin', EVIL);
        if (variant === 'Origin null') req = req.set('Origin', 'null');
        if (variant === 'foreign Referer') req = req.set('Referer', `${EVIL}/page`);
        const res = path.endsWith('/upload') ? await req.attach('file', Buffer.from('9 33 32 (18,15)(7,8)(14,4)(10,1)(9)\n'), 'codes.txt') : await req.send({});
        const body = errorBodySchema.safeParse(res.body);
        if (res.status !== 403 || !body.success || body.data.error.code !== 'forbidden' || !/Cross-site request refused/.test(body.data.error.message)) failures.push(`${key}: ${res.status} ${JSON.stringify(res.body).slice(0, 120)}`);
      }
      expect(failures).toEqual([]);
      expect(databaseHash()).toBe(before);
    });
  }

  it("better-auth's own POSTs (sign-in, sign-out, reset, admin) are refused the same way", async () => {
    const before = databaseHash();
    for (const path of authPosts) {
      for (const origin of [EVIL, undefined]) {
        let req = request(t.rawApp).post(path).set('Cookie', await cookieOf('admin'));
        if (origin) req = req.set('Origin', origin);
        const res = await req.send({ email: 'admin@test.squarewright.test', password: 'test-password-123' });
        expect(res.status, `${path} from ${origin ?? 'nowhere'}`).toBe(403);
        expect(errorBodySchema.parse(res.body).error.message).toMatch(/Cross-site request refused/);
      }
    }
    expect(databaseHash()).toBe(before);
  });

  it('our own origin (Origin, or Referer when Origin is missing) is let through', async () => {
    const cookie = await cookieOf('admin');
    const viaOrigin = await request(t.rawApp).post('/api/invitations').set('Cookie', cookie).set('Origin', OWN).send({ email: 'welcome@example.test', role: 'printer' });
    expect(viaOrigin.status).toBe(201);
    const viaReferer = await request(t.rawApp).post('/api/invitations').set('Cookie', cookie).set('Referer', `${OWN}/admin/users?x=1`).send({ email: 'welcome2@example.test', role: 'printer' });
    expect(viaReferer.status).toBe(201);
    // localhost and 127.0.0.1 on the same port are the same server for a local user
    const loopback = await request(t.rawApp).post('/api/invitations').set('Cookie', cookie).set('Origin', 'http://127.0.0.1:3000').send({ email: 'welcome3@example.test', role: 'printer' });
    expect(loopback.status).toBe(201);
    // sign-in from our own page works; the same from another site does not
    await request(t.rawApp).post('/api/auth/sign-in/email').set('Origin', OWN).send({ email: 'admin@test.squarewright.test', password: 'test-password-123' }).expect(200);
  });

  it('safe methods are never refused for their origin', async () => {
    const res = await request(t.rawApp).get('/api/me').set('Cookie', await cookieOf('editor')).set('Origin', EVIL);
    expect(res.status).toBe(200);
  });

  it('the payments webhook (signature-checked) and Bearer requests are exempt from the origin check', async () => {
    const hook = await request(t.rawApp).post('/api/payments/webhook').set('Origin', EVIL).set('content-type', 'application/json').send('{}');
    // refused for its missing signature, not for its origin
    expect(hook.status).toBe(400);
    expect(errorBodySchema.parse(hook.body).error.message).toMatch(/signature/);
    // a Bearer request is not refused for its origin; the key itself is checked where it is used
    expect(crossSiteReason({ method: 'POST', path: '/api/submissions', headers: { authorization: 'Bearer sw_abc', origin: EVIL } }, { origins: [OWN] })).toBeNull();
    expect(crossSiteReason({ method: 'POST', path: '/api/submissions', headers: { authorization: 'Basic abc', origin: EVIL } }, { origins: [OWN] })).not.toBeNull();
  });
});

describe('allowed origins', () => {
  it('are PUBLIC_URL, plus the loopback names on the same port only for a loopback PUBLIC_URL', () => {
    expect(allowedOrigins({ PUBLIC_URL: 'https://desk.example.com', PORT: 3000 })).toEqual(['https://desk.example.com']);
    expect(allowedOrigins({ PUBLIC_URL: 'http://localhost:3000', PORT: 3000 }).sort()).toEqual(['http://127.0.0.1:3000', 'http://[::1]:3000', 'http://localhost:3000']);
  });
});
