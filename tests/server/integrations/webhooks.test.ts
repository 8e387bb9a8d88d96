import { createHmac, timingSafeEqual } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eventEnvelopeSchema } from '../../../shared/contracts/integrations';
import { createTestApp, type TestApp } from '../helpers/test-app';

// Outgoing events (issue 18): signed deliveries through a persistent outbox with retries,
// visible attempts, re-send by hand, only to the registered URL, and the local receiver.

let t: TestApp;
let server: Server;
let base: string;
let admin: Awaited<ReturnType<TestApp['signInAs']>>;

beforeAll(async () => {
  t = await createTestApp({ webhooks: { baseDelayMs: 50, maxDelayMs: 200, maxAttempts: 3, timeoutMs: 800 } });
  // the app itself listens, so the local receiver is a real HTTP endpoint
  server = createServer(t.app);
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', () => r()));
  base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  admin = await t.signInAs('admin');
});
afterAll(async () => {
  server.closeAllConnections();
  await new Promise<void>((r) => server.close(() => r()));
  await t.close();
});

/** THE check a receiver makes (README "Integrations", verifying a signature), written out here with node:crypto. */
function receiverAccepts(secret: string, headers: { timestamp: string; signature: string }, rawBody: string, nowSeconds = Math.floor(Date.now() / 1000)): boolean {
  if (Math.abs(nowSeconds - Number(headers.timestamp)) > 300) return false;
  const expected = 'sha256=' + createHmac('sha256', secret).update(`${headers.timestamp}.${rawBody}`).digest('hex');
  const a = Buffer.from(expected);
  const b = Buffer.from(headers.signature);
  return a.length === b.length && timingSafeEqual(a, b);
}

type Verify = (secret: string, headers: Record<string, string | string[] | undefined>, rawBody: string) => boolean;

/** The README's own snippet (section "Integrations", the js block), run as written, with node:crypto. */
function readmeVerify(): Verify {
  const readme = readFileSync(join(import.meta.dirname, '../../../README.md'), 'utf8');
  const section = readme.slice(readme.indexOf('## Integrations'), readme.indexOf('<!-- integrations:end -->'));
  const code = /```js\n([\s\S]*?)```/.exec(section)?.[1] ?? '';
  expect(code).toContain("import { createHmac, timingSafeEqual } from 'node:crypto';");
  expect(code).toContain('function verify(secret, headers, rawBody)');
  const body = code.replace(/^import .*$/m, '');
  // the point is to run the documented text itself
  const make = new Function('createHmac', 'timingSafeEqual', `${body}\nreturn verify;`) as (h: typeof createHmac, e: typeof timingSafeEqual) => Verify;
  return make(createHmac, timingSafeEqual);
}

type Caught = { headers: Record<string, string | string[] | undefined>; body: string };

/** A receiver of our own: answers with `status` (a function of the call number), keeps what came. */
async function receiver(answer: (n: number) => { status: number; headers?: Record<string, string>; delayMs?: number }) {
  const caught: Caught[] = [];
  const srv = createServer((req, res) => {
    const chunks: Buffer[] = [];
    req.on('data', (c: Buffer) => chunks.push(c));
    req.on('end', () => {
      caught.push({ headers: req.headers, body: Buffer.concat(chunks).toString('utf8') });
      const a = answer(caught.length);
      setTimeout(() => {
        res.writeHead(a.status, a.headers ?? { 'content-type': 'text/plain' });
        res.end(`answer ${caught.length}`);
      }, a.delayMs ?? 0);
    });
  });
  await new Promise<void>((r) => srv.listen(0, '127.0.0.1', () => r()));
  const url = `http://127.0.0.1:${(srv.address() as AddressInfo).port}/hook`;
  return {
    url,
    caught,
    close: async () => {
      srv.closeAllConnections();
      await new Promise<void>((r) => srv.close(() => r()));
    },
  };
}

async function register(url: string, events: string[]) {
  const res = await admin.post('/api/webhooks/endpoints').send({ url, events, description: 'test' }).expect(201);
  return res.body as { endpoint: { id: string }; secret: string };
}

function emitReviewed(id: string) {
  t.deps.db.transaction((tx) => t.deps.events.emit(tx, 'submission.reviewed', { submission: { id, status: 'accepted', stockId: '7', order: 9 } }));
}

describe('a delivery', () => {
  it('is signed as documented, carries the event id, and a tampered body or signature fails the check', async () => {
    const r = await receiver(() => ({ status: 204 }));
    const { secret, endpoint } = await register(r.url, ['submission.reviewed']);
    emitReviewed('101');
    const pass = await t.deps.webhooks.flush();
    expect(pass.delivered).toBe(1);
    expect(r.caught).toHaveLength(1);
    const got = r.caught[0]!;
    const headers = { timestamp: String(got.headers['squarewright-timestamp']), signature: String(got.headers['squarewright-signature']) };
    expect(receiverAccepts(secret, headers, got.body)).toBe(true);
    const envelope = eventEnvelopeSchema.parse(JSON.parse(got.body));
    expect(envelope).toMatchObject({ type: 'submission.reviewed', data: { submission: { id: '101', status: 'accepted' } } });
    expect(got.headers['squarewright-event-id']).toBe(envelope.id);
    // tampered: one character of the body, the signature, the secret, or an old timestamp
    expect(receiverAccepts(secret, headers, got.body.replace('"101"', '"102"'))).toBe(false);
    expect(receiverAccepts(secret, { ...headers, signature: headers.signature.replace(/.$/, (c) => (c === '0' ? '1' : '0')) }, got.body)).toBe(false);
    expect(receiverAccepts('whsq_wrong', headers, got.body)).toBe(false);
    expect(receiverAccepts(secret, headers, got.body, Number(headers.timestamp) + 301)).toBe(false);
    // the README's snippet, run as printed, agrees: the delivery checks, a tampered one does not
    const verify = readmeVerify();
    expect(verify(secret, got.headers, got.body)).toBe(true);
    expect(verify(secret, got.headers, got.body.replace('"101"', '"102"'))).toBe(false);
    expect(verify(secret, { ...got.headers, 'squarewright-signature': headers.signature.replace(/.$/, (c) => (c === '0' ? '1' : '0')) }, got.body)).toBe(false);
    expect(verify('whsq_wrong', got.headers, got.body)).toBe(false);
    expect(verify(secret, { ...got.headers, 'squarewright-timestamp': String(Number(headers.timestamp) - 400) }, got.body)).toBe(false);
    // visible: delivered, one attempt with the endpoint's answer
    const list = await admin.get(`/api/webhooks/deliveries?endpointId=${endpoint.id}`).expect(200);
    expect(list.body.items[0]).toMatchObject({ status: 'delivered', attempts: 1, eventType: 'submission.reviewed', lastAttempt: { status: 204 } });
    await admin.delete(`/api/webhooks/endpoints/${endpoint.id}`).expect(200);
    await r.close();
  });

  it('goes only to endpoints that want the event, and not at all to an inactive one', async () => {
    const r = await receiver(() => ({ status: 200 }));
    const wants = await register(r.url, ['edition.published']);
    emitReviewed('102');
    await t.deps.webhooks.flush();
    expect(r.caught).toHaveLength(0);
    await admin.patch(`/api/webhooks/endpoints/${wants.endpoint.id}`).send({ events: ['submission.reviewed'], active: false }).expect(200);
    emitReviewed('103');
    await t.deps.webhooks.flush();
    expect(r.caught).toHaveLength(0);
    await admin.delete(`/api/webhooks/endpoints/${wants.endpoint.id}`).expect(200);
    await r.close();
  });
});

describe('retries', () => {
  it('retries with backoff until the endpoint answers 2xx, keeping every attempt and the last answer', async () => {
    const r = await receiver((n) => ({ status: n < 3 ? 503 : 200 }));
    const { endpoint } = await register(r.url, ['submission.reviewed']);
    emitReviewed('201');
    const first = await t.deps.webhooks.flush();
    expect(first).toEqual({ delivered: 0, failed: 1 });
    // not due again at once (backoff)
    expect(await t.deps.webhooks.flush()).toEqual({ delivered: 0, failed: 0 });
    for (let i = 0; i < 40 && r.caught.length < 3; i++) {
      await new Promise((res) => setTimeout(res, 60));
      await t.deps.webhooks.flush();
    }
    expect(r.caught.map((c) => c.headers['squarewright-event-id'])).toEqual(Array(3).fill(r.caught[0]!.headers['squarewright-event-id']));
    const list = await admin.get(`/api/webhooks/deliveries?endpointId=${endpoint.id}`).expect(200);
    const d = list.body.items[0];
    expect(d).toMatchObject({ status: 'delivered', attempts: 3, lastAttempt: { status: 200, answer: 'answer 3' } });
    const detail = await admin.get(`/api/webhooks/deliveries/${d.id}`).expect(200);
    expect(detail.body.history.map((a: { status: number }) => a.status)).toEqual([200, 503, 503]);
    expect(JSON.parse(detail.body.payload).id).toBe(d.eventId);
    await admin.delete(`/api/webhooks/endpoints/${endpoint.id}`).expect(200);
    await r.close();
  });

  it('gives up after its attempts, and a re-send by hand delivers the same event again', async () => {
    let up = false;
    const r = await receiver(() => ({ status: up ? 200 : 500 }));
    const { endpoint } = await register(r.url, ['submission.reviewed']);
    emitReviewed('301');
    for (let i = 0; i < 40; i++) {
      await t.deps.webhooks.flush();
      const s = (await admin.get(`/api/webhooks/deliveries?endpointId=${endpoint.id}`)).body.items[0].status;
      if (s === 'failed') break;
      await new Promise((res) => setTimeout(res, 60));
    }
    const failed = (await admin.get(`/api/webhooks/deliveries?endpointId=${endpoint.id}`).expect(200)).body.items[0];
    expect(failed).toMatchObject({ status: 'failed', attempts: 3 });
    expect((await admin.get('/api/webhooks/endpoints').expect(200)).body.items.find((e: { id: string }) => e.id === endpoint.id)).toMatchObject({ failed: 1 });
    up = true;
    await admin.post(`/api/webhooks/deliveries/${failed.id}/resend`).send({}).expect(200);
    await t.deps.webhooks.flush();
    const after = (await admin.get(`/api/webhooks/deliveries/${failed.id}`).expect(200)).body;
    expect(after.status).toBe('delivered');
    expect(new Set(r.caught.map((c) => JSON.parse(c.body).id)).size).toBe(1);
    await admin.delete(`/api/webhooks/endpoints/${endpoint.id}`).expect(200);
    await r.close();
  });

  it('follows no redirect (only the registered URL is called) and gives up on an endpoint that does not answer in time', async () => {
    const elsewhere = await receiver(() => ({ status: 200 }));
    const redirecting = await receiver(() => ({ status: 307, headers: { location: elsewhere.url } }));
    const slow = await receiver(() => ({ status: 200, delayMs: 2_000 }));
    const a = await register(redirecting.url, ['submission.reviewed']);
    const b = await register(slow.url, ['submission.reviewed']);
    emitReviewed('401');
    await t.deps.webhooks.flush();
    expect(redirecting.caught).toHaveLength(1);
    expect(elsewhere.caught).toHaveLength(0);
    const ra = (await admin.get(`/api/webhooks/deliveries?endpointId=${a.endpoint.id}`)).body.items[0];
    expect(ra).toMatchObject({ status: 'pending', lastAttempt: { status: 307 } });
    expect(ra.lastAttempt.answer).toContain('not followed');
    const rb = (await admin.get(`/api/webhooks/deliveries?endpointId=${b.endpoint.id}`)).body.items[0];
    expect(rb).toMatchObject({ status: 'pending', lastAttempt: { status: null } });
    expect(rb.lastAttempt.answer).toContain('no answer within 800 ms');
    for (const id of [a.endpoint.id, b.endpoint.id]) await admin.delete(`/api/webhooks/endpoints/${id}`).expect(200);
    for (const s of [elsewhere, redirecting, slow]) await s.close();
  });
});

describe('the local receiver', () => {
  it('keeps what it was sent and shows whether the signature holds', async () => {
    const url = `${base}/api/webhooks/local-receiver`;
    const { endpoint } = await register(url, ['submission.reviewed']);
    emitReviewed('501');
    expect((await t.deps.webhooks.flush()).delivered).toBe(1);
    const caught = (await admin.get('/api/webhooks/local-receiver').expect(200)).body.items;
    expect(caught[0]).toMatchObject({ eventType: 'submission.reviewed', signatureValid: true });
    expect(JSON.parse(caught[0].body).data.submission.id).toBe('501');
    // a forged delivery (no valid signature) is kept and marked
    const forged = await fetch(url, { method: 'POST', headers: { 'content-type': 'application/json', 'Squarewright-Timestamp': String(Math.floor(Date.now() / 1000)), 'Squarewright-Signature': 'sha256=00' }, body: '{"id":"evt_x","type":"submission.reviewed","createdAt":"2026-01-01T00:00:00.000Z","data":{}}' });
    expect(forged.status).toBe(200);
    expect((await forged.json()).signatureValid).toBe(false);
    await admin.delete(`/api/webhooks/endpoints/${endpoint.id}`).expect(200);
  });
});

describe('registering endpoints', () => {
  it('admins only; bad URLs and unknown events are refused with where', async () => {
    await (await t.signInAs('editor')).get('/api/webhooks/endpoints').expect(403);
    const bad = await admin.post('/api/webhooks/endpoints').send({ url: 'ftp://x.test/a', events: ['edition.nothing'] }).expect(400);
    expect((bad.body.error.details as { path: string }[]).map((d) => d.path)).toEqual(expect.arrayContaining(['body.url', 'body.events.0']));
    await admin.post('/api/webhooks/endpoints').send({ url: 'https://user:pw@x.test/a', events: ['edition.published'] }).expect(400);
  });

  it('an event whose data does not match its schema is refused and rolls the change back', () => {
    expect(() =>
      t.deps.db.transaction((tx) => t.deps.events.emit(tx, 'submission.reviewed', { submission: { id: 1 } } as never)),
    ).toThrow();
  });
});
