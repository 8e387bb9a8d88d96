import { eq } from 'drizzle-orm';
import request from 'supertest';
import { session } from '../../../server/platform/auth/schema';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { errorBodySchema } from '../../../shared/contracts/common';
import { healthResponseSchema, meResponseSchema } from '../../../shared/contracts/auth';
import { createTestApp, type TestApp } from '../helpers/test-app';

// API behaviour promised in product.md ("API shape"): JSON errors with the right status.
let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

describe('foundation API', () => {
  it('health reports version, database and mail (to an admin; anyone else reads ok/degraded only)', async () => {
    expect((await request(t.app).get('/api/health').expect(200)).body).toEqual({ status: 'ok' });
    const res = await (await t.signInAs('admin')).get('/api/health').expect(200);
    const body = healthResponseSchema.parse(res.body);
    expect(body.status).toBe('ok');
    expect(body.database).toBe('ok');
    expect(body.mail?.transport).toBe('local-fake');
    expect(body.version).toMatch(/^\d+\.\d+\.\d+/);
  });

  it('an unknown /api path answers a JSON 404 in the error shape', async () => {
    const res = await request(t.app).get('/api/no-such-thing').expect(404).expect('Content-Type', /json/);
    expect(errorBodySchema.parse(res.body).error.code).toBe('not_found');
  });

  it('answers 401 without a session', async () => {
    const res = await request(t.app).get('/api/me').expect(401);
    expect(errorBodySchema.parse(res.body).error.code).toBe('unauthorized');
  });

  it('signs in and reads /api/me with the role', async () => {
    const agent = await t.signInAs('editor');
    const res = await agent.get('/api/me').expect(200);
    expect(meResponseSchema.parse(res.body).user).toMatchObject({ role: 'editor', email: 'editor@test.squarewright.test' });
  });

  it('an active session past a day old is extended, and the refreshed cookie is passed on', async () => {
    const agent = await t.signInAs('printer');
    const fresh = await agent.get('/api/me').expect(200);
    expect(fresh.headers['set-cookie']).toBeUndefined();
    // sessions last 7 days and are extended after 1 day (server/platform/auth/auth.ts): age this one by 2 days
    const day = 24 * 60 * 60 * 1000;
    t.db.update(session).set({ expiresAt: new Date(Date.now() + 5 * day) }).where(eq(session.userId, fresh.body.user.id)).run();
    const res = await agent.get('/api/me').expect(200);
    expect(([] as string[]).concat(res.headers['set-cookie'] ?? []).join(';')).toMatch(/session_token=.*HttpOnly/i);
    const row = t.db.select({ expiresAt: session.expiresAt }).from(session).where(eq(session.userId, fresh.body.user.id)).get();
    expect(row!.expiresAt.getTime()).toBeGreaterThan(Date.now() + 6 * day);
  });

  it('answers 403 for the wrong role', async () => {
    const setter = await t.signInAs('setter');
    const res = await setter.get('/api/admin/users').expect(403);
    expect(errorBodySchema.parse(res.body).error.code).toBe('forbidden');
  });

  it('turns invalid input into 400 with details that say where', async () => {
    const admin = await t.signInAs('admin');
    const res = await admin.post('/api/invitations').send({ email: 'not-an-email', role: 'emperor' }).expect(400);
    const err = errorBodySchema.parse(res.body).error;
    expect(err.code).toBe('bad_request');
    expect(err.details).toEqual(
      expect.arrayContaining([
        expect.objectContaining({ path: 'body.email' }),
        expect.objectContaining({ path: 'body.role' }),
      ]),
    );
  });

  it('rejects malformed JSON with 400', async () => {
    const admin = await t.signInAs('admin');
    const res = await admin.post('/api/invitations').set('Content-Type', 'application/json').send('{"email":').expect(400);
    expect(errorBodySchema.parse(res.body).error.code).toBe('bad_request');
  });

  it('serves an OpenAPI document listing the routes', async () => {
    const res = await request(t.app).get('/api/openapi.json').expect(200);
    expect(res.body.openapi).toBe('3.1.0');
    expect(Object.keys(res.body.paths)).toEqual(expect.arrayContaining(['/api/health', '/api/invitations/{token}/accept', '/api/admin/users/{id}', '/api/auth/sign-in/email']));
    // Schemas are named components (issue 18): follow each local $ref to the component it names.
    const resolve = (node: unknown): Record<string, unknown> => {
      let n = node as Record<string, unknown> | undefined;
      for (let hops = 0; typeof n?.$ref === 'string'; hops += 1) {
        expect(hops, String(n.$ref)).toBeLessThan(10);
        const [, name] = /^#\/components\/schemas\/(\w+)$/.exec(n.$ref) ?? [];
        expect(name, String(n.$ref)).toBeDefined();
        n = res.body.components.schemas[name!];
        expect(n, String(name)).toBeDefined();
      }
      return n ?? {};
    };
    const body = resolve(res.body.paths['/api/invitations']?.post?.requestBody?.content?.['application/json']?.schema);
    expect(body.required).toEqual(expect.arrayContaining(['email', 'role']));
    const role = resolve((body.properties as Record<string, unknown> | undefined)?.role);
    expect(role.enum).toEqual(['admin', 'editor', 'setter', 'printer']);
  });
});
