import { existsSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { AddressInfo } from 'node:net';
import request from 'supertest';
import { afterAll, describe, expect, it } from 'vitest';
import { startServer } from '../../../server/bootstrap';
import { user } from '../../../server/platform/auth/schema';

// Start-up as `npm start` does it (without the client): data folder, database, secret,
// local fake SMTP, demo seed once, listen.
const dirs: string[] = [];
function dataDir() {
  const d = mkdtempSync(join(tmpdir(), 'sw-boot-'));
  dirs.push(d);
  return d;
}
afterAll(() => {
  for (const d of dirs) rmSync(d, { recursive: true, force: true });
});

const base = { PORT: '0', LOG_LEVEL: 'warn', NODE_ENV: 'test' };

describe('startServer', () => {
  it('creates the database in demo mode on first run, keeps the secret, and stays in demo mode on restart', async () => {
    const dir = dataDir();
    const first = await startServer({ source: { ...base, DATA_DIR: dir }, seeders: [], quiet: true });
    const port = (first.httpServer.address() as AddressInfo).port;
    const health = await request(`http://127.0.0.1:${port}`).get('/api/health').expect(200);
    expect(health.body).toEqual({ status: 'ok' });
    expect(first.deps.mail.transport).toBe('local-fake');
    expect((await request(first.app).get('/api/public/config')).body.demo).toBe(true);
    expect(first.deps.db.select({ id: user.id }).from(user).all()).toHaveLength(4);
    await first.close();
    expect(existsSync(join(dir, 'squarewright.db'))).toBe(true);
    const secret = readFileSync(join(dir, 'auth-secret'), 'utf8');
    expect(secret.trim().length).toBeGreaterThanOrEqual(32);

    const second = await startServer({ source: { ...base, DATA_DIR: dir }, seeders: [], quiet: true });
    expect((await request(second.app).get('/api/public/config')).body.demo).toBe(true);
    expect(second.deps.db.select({ id: user.id }).from(user).all()).toHaveLength(4);
    await second.close();
    expect(readFileSync(join(dir, 'auth-secret'), 'utf8')).toBe(secret);
  });

  it('DEMO=0 on a new database creates no demo accounts', async () => {
    const server = await startServer({ source: { ...base, DATA_DIR: dataDir(), DEMO: '0' }, seeders: [], quiet: true });
    expect((await request(server.app).get('/api/public/config')).body).toEqual({ demo: false });
    expect(server.deps.db.select({ id: user.id }).from(user).all()).toHaveLength(0);
    await server.close();
  });

  it('refuses to start with a bad environment, naming the variables', async () => {
    await expect(startServer({ source: { PORT: 'x', LOG_LEVEL: 'loud' }, quiet: true })).rejects.toThrow(/PORT[\s\S]*LOG_LEVEL/);
  });
});

describe('startServer on a busy port', () => {
  it('says the port is in use and how to choose another', async () => {
    const first = await startServer({ source: { ...base, DATA_DIR: dataDir(), DEMO: '0' }, seeders: [], quiet: true });
    const port = String((first.httpServer.address() as AddressInfo).port);
    await expect(startServer({ source: { ...base, PORT: port, DATA_DIR: dataDir(), DEMO: '0' }, seeders: [], quiet: true })).rejects.toThrow(/already in use.*set PORT/);
    await first.close();
  });
});
