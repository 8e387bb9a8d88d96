import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { errorBodySchema } from '../../../shared/contracts/common';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { quadrantPublication } from '../editions/fixtures';

// The hostile inputs that answered 500 on main before issue 15 (measured then: 45 of ~1,770),
// each now a 4xx in our error shape that says what and where.

let t: TestApp;
let publicationId: string;
let editionId: string;

beforeAll(async () => {
  t = await createTestApp();
  const admin = await t.signInAs('admin');
  publicationId = (await admin.post('/api/publications').send(quadrantPublication).expect(201)).body.id;
  const editor = await t.signInAs('editor');
  editionId = (await editor.post('/api/editions').send({ publicationId, number: 1, date: '2026-03-07' }).expect(201)).body.id;
});
afterAll(() => t.close());

function expectError(res: { status: number; body: unknown }, status: number) {
  expect(res.status, JSON.stringify(res.body)).toBe(status);
  return errorBodySchema.parse(res.body).error;
}

describe('invalid dates', () => {
  it.each([['x'], [''], ['2026-02-30'], ['2026-13-01'], ['20260307'], ['2026-03-07T00:00:00Z']])('POST /api/editions with date %j is a 400 naming body.date', async (date) => {
    const editor = await t.signInAs('editor');
    const err = expectError(await editor.post('/api/editions').send({ publicationId, number: 2, date }), 400);
    expect(err.details).toEqual(expect.arrayContaining([expect.objectContaining({ path: 'body.date' })]));
  });

  it.each([['x'], [''], ['9999-99-99']])('PATCH /api/editions/:id with date %j is a 400 naming body.date', async (date) => {
    const editor = await t.signInAs('editor');
    const err = expectError(await editor.patch(`/api/editions/${editionId}`).send({ date }), 400);
    expect(err.details).toEqual(expect.arrayContaining([expect.objectContaining({ path: 'body.date' })]));
  });
});

describe('bad percent-encoding in a path', () => {
  it.each([['/api/stock/%ZZ'], ['/api/editions/%E0%A4%A'], ['/api/submissions/%'], ['/api/invitations/%C0%AF']])('GET %s is a 400', async (path) => {
    const editor = await t.signInAs('editor');
    const res = await editor.get(path);
    // an unknown invitation token is a 404; every other answer here is the 400
    expect([400, 404]).toContain(res.status);
    if (path !== '/api/invitations/%C0%AF') expectError(res, 400);
    else expect(errorBodySchema.safeParse(res.body).success).toBe(true);
  });
});

describe('deep and malformed rich text', () => {
  const deep = (levels: number) => {
    let node: Record<string, unknown> = { type: 'text', text: 'x' };
    for (let i = 0; i < levels; i += 1) node = { type: i % 2 ? 'bulletList' : 'listItem', content: [node] };
    return { type: 'doc', content: [node] };
  };

  it('rich text nested 500 levels deep (about 33 kB) is a 422 that says where', async () => {
    const editor = await t.signInAs('editor');
    const body = { introduction: deep(500) };
    expect(JSON.stringify(body).length).toBeGreaterThan(15_000);
    const err = expectError(await editor.patch(`/api/editions/${editionId}`).send(body), 422);
    expect(JSON.stringify(err.details)).toContain('body.introduction');
  });

  it('a doc inside a paragraph is refused by the editor schema (422), and nothing is stored', async () => {
    const editor = await t.signInAs('editor');
    const bad = { type: 'doc', content: [{ type: 'paragraph', content: [{ type: 'doc' }] }] };
    const err = expectError(await editor.patch(`/api/editions/${editionId}`).send({ introduction: bad }), 422);
    expect(err.details).toEqual(expect.arrayContaining([expect.objectContaining({ path: expect.stringMatching(/^body\.introduction/) })]));
    const stored = (await editor.get(`/api/editions/${editionId}`).expect(200)).body;
    expect(JSON.stringify(stored.introduction)).not.toContain('"paragraph","content":[{"type":"doc"');
  });

  it('a JSON body nested 10,000 levels deep is a 422 with the path, not a stack overflow', async () => {
    const editor = await t.signInAs('editor');
    const text = `{"introduction":${'['.repeat(10_000)}${']'.repeat(10_000)}}`;
    const err = expectError(await editor.patch(`/api/editions/${editionId}`).set('content-type', 'application/json').send(text), 422);
    expect(err.details).toEqual([expect.objectContaining({ path: expect.stringMatching(/^body\.introduction\.0\.0/) })]);
  });
});

describe('multipart uploads that cannot be read', () => {
  it('a truncated multipart body is a 400 with a message', async () => {
    const setter = await t.signInAs('setter');
    const boundary = 'sw-boundary-1';
    const truncated = `--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="a.txt"\r\nContent-Type: text/plain\r\n\r\n9 33 32 (18,15)(7,8)(14`;
    const err = expectError(await setter.post('/api/submissions/upload').set('content-type', `multipart/form-data; boundary=${boundary}`).send(truncated), 400);
    expect(err.message).toMatch(/upload could not be read/i);
  });

  it('a multipart body without a boundary is a 400 with a message', async () => {
    const setter = await t.signInAs('setter');
    const err = expectError(await setter.post('/api/submissions/upload').set('content-type', 'multipart/form-data').send('--x\r\n\r\nhello'), 400);
    expect(err.message).toMatch(/boundary/i);
  });

  it('a file over the limit is a 413 before it is read; an empty form is a 422 naming the field', async () => {
    const setter = await t.signInAs('setter');
    const big = await setter.post('/api/submissions/upload').set('content-type', 'multipart/form-data; boundary=b').set('content-length', String(50 * 1024 * 1024)).send('--b--');
    expect(expectError(big, 413).code).toBe('payload_too_large');
    const empty = await setter.post('/api/submissions/upload').set('content-type', 'multipart/form-data; boundary=b').send('--b--\r\n');
    expect([400, 422]).toContain(empty.status);
    errorBodySchema.parse(empty.body);
  });
});

describe('races', () => {
  it('two invitations for the same e-mail accepted at once: one account, the other a 409', async () => {
    const admin = await t.signInAs('admin');
    const email = 'twice@example.test';
    await admin.post('/api/invitations').send({ email, role: 'setter' }).expect(201);
    await admin.post('/api/invitations').send({ email, role: 'setter' }).expect(201);
    await t.mailbox.waitFor((m) => m.to.includes(email) && t.mailbox.all().filter((x) => x.to.includes(email)).length === 2);
    const tokens = t.mailbox.all().filter((m) => m.to.includes(email)).map((m) => t.mailbox.linkIn(m, '/invite/').slice('/invite/'.length));
    expect(new Set(tokens).size).toBe(2);
    const answers = await Promise.all(tokens.map((token) => request(t.app).post(`/api/invitations/${token}/accept`).send({ name: 'Twice', password: 'a-good-long-password' })));
    expect(answers.map((a) => a.status).sort()).toEqual([201, 409]);
    expect(expectError(answers.find((a) => a.status === 409)!, 409).message).toMatch(/already/i);
  });
});

describe('echoed values', () => {
  it('a 64 kB number is not echoed back: the message quotes a short prefix', async () => {
    const setter = await t.signInAs('setter');
    const code = `9 33 32 (${'9'.repeat(65_536)},15)(7,8)(14,4)(10,1)(9)`;
    const res = await setter.post('/api/tilings/check').send({ code });
    expect(res.status).toBeLessThan(500);
    expect(JSON.stringify(res.body).length).toBeLessThan(4_000);
  });

  it('an unknown API path is not echoed in full', async () => {
    const res = await request(t.app).get(`/api/${'a'.repeat(8_000)}`).expect(404);
    expect(JSON.stringify(res.body).length).toBeLessThan(1_000);
  });
});
