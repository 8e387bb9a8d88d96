import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { emitEvent, verifySignature } from '../../../server/areas/integrations/index';
import { webhookDelivery, webhookEndpoint } from '../../../server/areas/integrations/schema';
import { closeDatabase, openDatabase, type Db } from '../../../server/platform/db/client';

// A delivery survives a server kill (issue 18): the event is in the outbox (SQLite) before the
// server runs; the server tries once while the endpoint is down and is killed (SIGKILL, no
// shutdown); the endpoint comes up; a new server on the same data folder delivers it, once,
// with the same event id and a valid signature.

const root = resolve(import.meta.dirname, '../../..');
const dir = mkdtempSync(join(tmpdir(), 'sw-webhook-restart-'));
const children: ChildProcess[] = [];
afterAll(() => {
  for (const c of children) if (c.exitCode === null) c.kill('SIGKILL');
  rmSync(dir, { recursive: true, force: true });
});

function startChild(): Promise<ChildProcess> {
  const child = spawn(process.execPath, ['--import', 'tsx', join(root, 'tests/server/integrations/fixtures/server-child.ts')], {
    cwd: root,
    env: { ...process.env, DATA_DIR: dir, PORT: '0', HOST: '127.0.0.1', DEMO: '0', LOG_LEVEL: 'error', NODE_ENV: 'test', AUTH_SECRET: 'restart-test-secret-restart-test-secret-0' },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  children.push(child);
  return new Promise((resolveStart, reject) => {
    let out = '';
    let err = '';
    child.stdout!.on('data', (b: Buffer) => {
      out += b.toString();
      if (out.includes('started')) resolveStart(child);
    });
    child.stderr!.on('data', (b: Buffer) => (err += b.toString()));
    child.once('exit', (code) => reject(new Error(`server exited (${code}) before it started: ${err}`)));
  });
}

async function until(test: () => boolean, timeoutMs: number, what: string) {
  const deadline = Date.now() + timeoutMs;
  while (!test()) {
    if (Date.now() > deadline) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 50));
  }
}

function deliveryOf(db: Db) {
  return db.select({ status: webhookDelivery.status, attempts: webhookDelivery.attempts }).from(webhookDelivery).get();
}

describe('a webhook delivery and a server kill', () => {
  it('arrives once after the restart, with its idempotency key', async () => {
    // a port for the endpoint, free for now (connections are refused until it listens)
    const probe = createServer();
    await new Promise<void>((r) => probe.listen(0, '127.0.0.1', () => r()));
    const port = (probe.address() as AddressInfo).port;
    await new Promise<void>((r) => probe.close(() => r()));

    // the change and its event, written before any server runs
    const db = openDatabase(join(dir, 'squarewright.db'));
    const secret = 'whsq_restart-test-secret';
    db.insert(webhookEndpoint).values({ id: 'ep-1', url: `http://127.0.0.1:${port}/hook`, eventsJson: JSON.stringify(['submission.reviewed']), secret }).run();
    const eventId = db.transaction((tx) => emitEvent(tx, 'submission.reviewed', { submission: { id: '42', status: 'accepted', stockId: '9', order: 9 } }, new Date()));
    expect(eventId).toMatch(/^evt_/);

    const first = await startChild();
    await until(() => (deliveryOf(db)?.attempts ?? 0) >= 1, 20_000, 'the first (refused) attempt');
    expect(deliveryOf(db)).toMatchObject({ status: 'pending', attempts: 1 });
    first.kill('SIGKILL');
    await new Promise((r) => first.once('exit', r));

    const caught: { headers: Record<string, string | string[] | undefined>; body: string }[] = [];
    const endpoint: Server = createServer((req, res) => {
      const chunks: Buffer[] = [];
      req.on('data', (c: Buffer) => chunks.push(c));
      req.on('end', () => {
        caught.push({ headers: req.headers, body: Buffer.concat(chunks).toString('utf8') });
        res.writeHead(200).end('ok');
      });
    });
    await new Promise<void>((r) => endpoint.listen(port, '127.0.0.1', () => r()));
    try {
      const second = await startChild();
      // the retry is due after the first backoff (5 s)
      await until(() => caught.length >= 1, 30_000, 'the delivery after the restart');
      await until(() => deliveryOf(db)?.status === 'delivered', 5_000, 'the delivery marked delivered');
      // and nothing more comes
      await new Promise((r) => setTimeout(r, 3_000));
      expect(caught).toHaveLength(1);
      const got = caught[0]!;
      expect(JSON.parse(got.body).id).toBe(eventId);
      expect(got.headers['squarewright-event-id']).toBe(eventId);
      expect(verifySignature(secret, got.headers['squarewright-timestamp'] as string, got.headers['squarewright-signature'] as string, got.body, Math.floor(Date.now() / 1000))).toBe(true);
      expect(deliveryOf(db)).toMatchObject({ status: 'delivered', attempts: 2 });
      second.kill('SIGTERM');
      await new Promise((r) => second.once('exit', r));
    } finally {
      endpoint.closeAllConnections();
      await new Promise<void>((r) => endpoint.close(() => r()));
      closeDatabase(db);
    }
    expect(db.$client.open).toBe(false);
  }, 90_000);
});
