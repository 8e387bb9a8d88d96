import express from 'express';
import multer from 'multer';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { APIError } from 'better-auth/api';
import { eq } from 'drizzle-orm';
import { invitation } from '../../../server/areas/accounts/schema';
import { z } from 'zod';
import { isAllowed, permissions } from '../../../server/platform/auth/permissions';
import { apiNotFound, errorHandler } from '../../../server/platform/http/error-handler';
import { Conflict, Forbidden, NotFound, Unprocessable } from '../../../server/platform/http/errors';
import { createApiRouter, route } from '../../../server/platform/http/route';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { errorBodySchema } from '../../../shared/contracts/common';

// route() and the one error handler, on a small app with routes made for this test.
let t: TestApp;
let app: express.Express;
const testKeys = [
  'GET /api/test/boom',
  'GET /api/test/domain/:kind',
  'POST /api/test/upload',
  'GET /api/test/editors',
  'GET /api/test/bad-response',
  'POST /api/test/echo',
];

beforeAll(async () => {
  t = await createTestApp();
  permissions['GET /api/test/boom'] = 'public';
  permissions['GET /api/test/domain/:kind'] = 'public';
  permissions['POST /api/test/upload'] = 'signed-in';
  permissions['GET /api/test/editors'] = ['editor'];
  permissions['GET /api/test/bad-response'] = 'public';
  permissions['POST /api/test/echo'] = 'public';
  const router = createApiRouter(t.deps);
  route(router, { method: 'GET', path: '/api/test/boom', summary: 'throws' }, () => {
    throw new Error('secret internal detail /var/lib/db');
  });
  route(
    router,
    { method: 'GET', path: '/api/test/domain/:kind', summary: 'domain errors', params: z.object({ kind: z.enum(['nf', 'cf', 'fb', 'un']) }) },
    ({ params }) => {
      if (params.kind === 'nf') throw new NotFound('No tiling 7.');
      if (params.kind === 'cf') throw new Conflict('Edition is in proof.');
      if (params.kind === 'fb') throw new Forbidden();
      throw new Unprocessable('The squares do not fill the frame.', [{ path: 'code', message: 'square 3 overlaps square 4' }]);
    },
  );
  const upload = multer({ storage: multer.memoryStorage(), limits: { fileSize: 10 } }).single('file');
  route(router, { method: 'POST', path: '/api/test/upload', summary: 'upload', middleware: [upload], bodyType: 'multipart', response: z.object({ size: z.number() }) }, ({ req }) => ({
    size: req.file?.size ?? -1,
  }));
  route(router, { method: 'GET', path: '/api/test/editors', summary: 'editors only', response: z.object({ role: z.string() }) }, ({ user }) => ({ role: user.role }));
  route(router, { method: 'GET', path: '/api/test/bad-response', summary: 'breaks its contract', response: z.object({ n: z.number() }) }, () => ({ n: 'seven' }) as unknown as { n: number });
  route(
    router,
    { method: 'POST', path: '/api/test/echo', summary: 'echo', body: z.object({ n: z.coerce.number().int() }), query: z.object({ x: z.string().optional() }), response: z.object({ n: z.number(), x: z.string().nullable() }) },
    ({ body, query }) => ({ n: body.n, x: query.x ?? null }),
  );
  app = express();
  app.use(express.json({ limit: '100b' }));
  app.use(router.express);
  app.use('/api', apiNotFound());
  app.use(errorHandler(t.deps.log));
});
afterAll(async () => {
  for (const k of testKeys) delete permissions[k];
  await t.close();
});

describe('route()', () => {
  it('refuses a route that has no entry in the permission table', () => {
    const router = createApiRouter(t.deps);
    expect(() => route(router, { method: 'GET', path: '/api/unlisted', summary: 'x' }, () => ({}))).toThrow(/no entry in server\/platform\/auth\/permissions\.ts/);
  });

  it('an admin may do what an editor may; other roles may not', async () => {
    expect(isAllowed(['editor'], 'admin')).toBe(true);
    expect(isAllowed(['setter'], 'admin')).toBe(false);
    expect(isAllowed(['editor'], 'printer')).toBe(false);
    expect(isAllowed('signed-in', null)).toBe(false);
    const adminCookie = (await t.signInAs('admin')).jar.getCookies({ domain: '127.0.0.1', path: '/', secure: false, script: false });
    const cookie = adminCookie.map((c) => `${c.name}=${c.value}`).join('; ');
    await request(app).get('/api/test/editors').set('Cookie', cookie).expect(200, { role: 'admin' });
    await request(app).get('/api/test/editors').expect(401);
  });

  it('parses body and query with zod', async () => {
    await request(app).post('/api/test/echo?x=hi').send({ n: '12' }).expect(200, { n: 12, x: 'hi' });
    const res = await request(app).post('/api/test/echo').send({ n: 'twelve' }).expect(400);
    expect(res.body.error.details).toEqual([expect.objectContaining({ path: 'body.n' })]);
  });

  it('a handler answer that breaks its response schema is a logged 500 (outside production)', async () => {
    const spy = vi.spyOn(console, 'error').mockImplementation(() => undefined);
    await request(app).get('/api/test/bad-response').expect(500);
    expect(String(spy.mock.calls[0]?.[1])).toMatch(/does not match its schema/);
    spy.mockRestore();
  });
});

describe('the error handler', () => {
  it('an unknown error is a logged 500 without internals', async () => {
    const spy = vi.spyOn(console, 'error').mockImplementation(() => undefined);
    const res = await request(app).get('/api/test/boom').expect(500);
    expect(errorBodySchema.parse(res.body).error.code).toBe('internal');
    expect(JSON.stringify(res.body)).not.toContain('secret internal detail');
    expect(spy).toHaveBeenCalledTimes(1);
    spy.mockRestore();
  });

  it.each([
    ['nf', 404, 'not_found'],
    ['cf', 409, 'conflict'],
    ['fb', 403, 'forbidden'],
    ['un', 422, 'unprocessable'],
  ])('domain error %s -> %i %s', async (kind, status, code) => {
    const res = await request(app).get(`/api/test/domain/${kind}`).expect(status);
    expect(errorBodySchema.parse(res.body).error.code).toBe(code);
  });

  it('keeps domain details (where the problem is)', async () => {
    const res = await request(app).get('/api/test/domain/un').expect(422);
    expect(res.body.error.details).toEqual([{ path: 'code', message: 'square 3 overlaps square 4' }]);
  });

  it('a bad path parameter is a 400 naming params.kind', async () => {
    const res = await request(app).get('/api/test/domain/zz').expect(400);
    expect(res.body.error.details).toEqual([expect.objectContaining({ path: 'params.kind' })]);
  });

  it('an upload over the size limit is 413; a JSON body over the limit too', async () => {
    const agent = await t.signInAs('setter');
    const cookie = agent.jar
      .getCookies({ domain: '127.0.0.1', path: '/', secure: false, script: false })
      .map((c) => `${c.name}=${c.value}`)
      .join('; ');
    await request(app).post('/api/test/upload').set('Cookie', cookie).attach('file', Buffer.from('tiny'), 'a.txt').expect(200, { size: 4 });
    const big = await request(app).post('/api/test/upload').set('Cookie', cookie).attach('file', Buffer.from('x'.repeat(100)), 'b.txt').expect(413);
    expect(big.body.error.code).toBe('payload_too_large');
    await request(app).post('/api/test/upload').attach('file', Buffer.from('x'), 'c.txt').expect(401);
    const json = await request(app).post('/api/test/echo').send({ n: 1, pad: 'y'.repeat(200) }).expect(413);
    expect(json.body.error.code).toBe('payload_too_large');
  });
});

describe('errors from better-auth calls inside our handlers', () => {
  it('keep their 4xx status, in our error shape', async () => {
    const app2 = express();
    app2.get('/api/x', () => {
      throw new APIError('BAD_REQUEST', { message: 'Password too long', code: 'PASSWORD_TOO_LONG' });
    });
    app2.get('/api/y', () => {
      throw new APIError('FORBIDDEN', { message: 'You are banned' });
    });
    app2.use(errorHandler(t.deps.log));
    const x = await request(app2).get('/api/x').expect(400);
    // in our words (server/platform/http/auth-words.ts), never the library's
    expect(errorBodySchema.parse(x.body).error).toEqual({ code: 'bad_request', message: 'The password is too long: use at most 128 characters.' });
    const y = await request(app2).get('/api/y').expect(403);
    expect(y.body.error.code).toBe('forbidden');
    expect(y.body.error.message).not.toMatch(/banned/i);
  });

  it('an existing account makes an invitation unusable with 409, and the claim is released', async () => {
    const admin = await t.signInAs('admin');
    await admin.post('/api/invitations').send({ email: 'raced@example.test', role: 'setter' }).expect(201);
    const token = t.mailbox.linkIn(await t.mailbox.waitFor({ to: 'raced@example.test' }), '/invite/').slice('/invite/'.length);
    await t.createUser('setter', { email: 'raced@example.test' });
    const res = await request(t.app).post(`/api/invitations/${token}/accept`).send({ name: 'Raced', password: 'a-good-long-password' }).expect(409);
    expect(errorBodySchema.parse(res.body).error.code).toBe('conflict');
    // the claim was released, and the link now says it cannot be used
    expect((await request(t.app).get(`/api/invitations/${token}`).expect(200)).body).toMatchObject({ valid: false, reason: 'used' });
    expect(t.db.select({ acceptedAt: invitation.acceptedAt }).from(invitation).where(eq(invitation.email, 'raced@example.test')).get()?.acceptedAt).toBeNull();
  });
});
