import { spawn, spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { hostname, tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { startServer } from '../../../server/bootstrap';
import { LOCK_FILE } from '../../../server/platform/instance-lock';
import { until } from './jobs/helpers';

// One server per data folder: a second server on the same DATA_DIR refuses to start before it
// touches anything (it used to mark the live server's running jobs interrupted first).

const dirs: string[] = [];
function dataDir() {
  const d = mkdtempSync(join(tmpdir(), 'sw-lock-'));
  dirs.push(d);
  return d;
}
afterAll(() => {
  for (const d of dirs) rmSync(d, { recursive: true, force: true });
});

const base = { PORT: '0', LOG_LEVEL: 'silent', NODE_ENV: 'test', DEMO: '0' };

describe('one server per data folder', () => {
  it('a second server on the same DATA_DIR refuses to start, and the first one\'s running job goes on', async () => {
    const dir = dataDir();
    const first = await startServer({ source: { ...base, DATA_DIR: dir }, seeders: [], quiet: true });
    try {
      expect(existsSync(join(dir, LOCK_FILE))).toBe(true);
      const id = first.deps.jobs.submit({ kind: 'test-count', params: { to: 100_000, stepMs: 1 } });
      await until(() => first.deps.jobs.get(id)?.state === 'running');
      const dbFile = join(dir, 'squarewright.db');
      const before = statSync(dbFile).mtimeMs;
      await expect(startServer({ source: { ...base, DATA_DIR: dir }, seeders: [], quiet: true })).rejects.toThrow(
        new RegExp(`Another Squarewright server \\(pid ${process.pid}, since .*\\) is running on ${dir.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}`),
      );
      // nothing was touched: the job is still running, the database file was not written
      expect(first.deps.jobs.get(id)?.state).toBe('running');
      expect(statSync(dbFile).mtimeMs).toBe(before);
      first.deps.jobs.cancel(id);
    } finally {
      await first.close();
    }
    // stopping releases the folder: the next server starts
    expect(existsSync(join(dir, LOCK_FILE))).toBe(false);
    const next = await startServer({ source: { ...base, DATA_DIR: dir }, seeders: [], quiet: true });
    await next.close();
  });

  it('refuses when the lock names a live process of another program run', async () => {
    const dir = dataDir();
    const other = spawn(process.execPath, ['-e', 'setInterval(() => {}, 1000)'], { stdio: 'ignore' });
    try {
      writeFileSync(join(dir, LOCK_FILE), JSON.stringify({ pid: other.pid, host: hostname(), startedAt: '2026-12-04T10:00:00.000Z' }));
      await expect(startServer({ source: { ...base, DATA_DIR: dir }, seeders: [], quiet: true })).rejects.toThrow(`pid ${other.pid}`);
      expect(existsSync(join(dir, 'squarewright.db'))).toBe(false);
    } finally {
      other.kill('SIGKILL');
    }
  });

  it('takes over a lock left by a server that died', async () => {
    const dir = dataDir();
    // a pid that ran and is gone
    const gone = spawnSync(process.execPath, ['-e', 'process.stdout.write(String(process.pid))']).stdout.toString();
    writeFileSync(join(dir, LOCK_FILE), JSON.stringify({ pid: Number(gone), host: hostname(), startedAt: '2026-12-04T10:00:00.000Z' }));
    const server = await startServer({ source: { ...base, DATA_DIR: dir }, seeders: [], quiet: true });
    expect(JSON.parse(readFileSync(join(dir, LOCK_FILE), 'utf8')).pid).toBe(process.pid);
    await server.close();
  });
});
