import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, rmSync, symlinkSync, copyFileSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import type { TestProject } from 'vitest/node';

// vitest globalSetup of the e2e project: build the app once, start the production bundle
// (node dist/server/index.js) on a free port with a fresh DATA_DIR in demo mode, wait for
// /api/health, and hand the base URL to the tests (inject('baseUrl')).
//
// Several people may run e2e tests on one machine at once: the build runs under a lock
// (flock, when present) and the built app is copied into a private app root, so a
// concurrent rebuild of dist/ cannot change the files this run serves.
//   E2E_SKIP_BUILD=1   reuse dist/ when it exists
//   E2E_KEEP_DATA=1    keep the temporary data folder (its path is printed)
//   E2E_HEALTH_TIMEOUT_MS  how long to wait for the demo server to be healthy (default 120 s: seeding proves puzzles)

declare module 'vitest' {
  export interface ProvidedContext {
    baseUrl: string;
    e2eDataDir: string;
  }
}

const root = resolve(import.meta.dirname, '..', '..');

function freePort(): Promise<number> {
  return new Promise((resolvePort, reject) => {
    const srv = createServer();
    srv.once('error', reject);
    srv.listen(0, '127.0.0.1', () => {
      const address = srv.address();
      const port = typeof address === 'object' && address ? address.port : 0;
      srv.close(() => resolvePort(port));
    });
  });
}

function hasFlock(): boolean {
  return spawnSync('flock', ['--version'], { stdio: 'ignore' }).status === 0;
}

/** Build (unless skipped) and copy dist/ into `target`, holding the build lock throughout. */
function buildAndCopy(target: string): void {
  const skip = process.env.E2E_SKIP_BUILD === '1' && existsSync(join(root, 'dist', 'server', 'index.js')) && existsSync(join(root, 'dist', 'client', 'index.html'));
  const script = [
    skip ? 'true' : 'npm run -s build',
    `cp -R dist ${JSON.stringify(target)}`,
  ].join(' && ');
  const t0 = Date.now();
  const args = hasFlock() ? ['flock', '/tmp/squarewright-e2e-build.lock', 'sh', '-c', script] : ['sh', '-c', script];
  const [cmd, ...rest] = args as [string, ...string[]];
  // build as `npm start` does: vitest sets NODE_ENV=test, which would make Vite bundle React's development build
  const r = spawnSync(cmd, rest, { cwd: root, stdio: ['ignore', 'pipe', 'pipe'], encoding: 'utf8', env: { ...process.env, NODE_ENV: 'production' } });
  if (r.status !== 0) {
    throw new Error(`e2e: building the app failed (exit ${r.status}):\n${r.stdout}\n${r.stderr}`);
  }
  console.log(`e2e: ${skip ? 'reused' : 'built'} the app in ${((Date.now() - t0) / 1000).toFixed(1)} s`);
}

/** A private app root: our package.json, the copied dist/, links to what the server reads at run time. */
function makeAppRoot(): string {
  const appRoot = mkdtempSync(join(tmpdir(), 'sw-e2e-root-'));
  copyFileSync(join(root, 'package.json'), join(appRoot, 'package.json'));
  for (const name of ['node_modules', 'drizzle', 'templates', 'fonts']) {
    if (existsSync(join(root, name))) symlinkSync(join(root, name), join(appRoot, name));
  }
  buildAndCopy(join(appRoot, 'dist'));
  return appRoot;
}

async function waitForHealth(baseUrl: string, child: ChildProcess, output: () => string, timeoutMs = Number(process.env.E2E_HEALTH_TIMEOUT_MS ?? 120_000)): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    if (child.exitCode !== null) throw new Error(`e2e: the server exited with ${child.exitCode} before it was healthy:\n${output()}`);
    try {
      const res = await fetch(`${baseUrl}/api/health`);
      if (res.ok) return;
    } catch {
      // not listening yet
    }
    await new Promise((r) => setTimeout(r, 150));
  }
  throw new Error(`e2e: no healthy answer from ${baseUrl}/api/health within ${timeoutMs / 1000} s:\n${output()}`);
}

export default async function setup(project: TestProject) {
  const appRoot = makeAppRoot();
  const dataDir = mkdtempSync(join(tmpdir(), 'sw-e2e-data-'));
  mkdirSync(dataDir, { recursive: true });
  const port = await freePort();
  const baseUrl = `http://127.0.0.1:${port}`;
  const env: Record<string, string | undefined> = {
    ...process.env,
    NODE_ENV: 'production',
    APP_ROOT: appRoot,
    DATA_DIR: dataDir,
    DEMO: '1',
    PORT: String(port),
    HOST: '127.0.0.1',
    PUBLIC_URL: baseUrl,
    LOG_LEVEL: process.env.E2E_LOG_LEVEL ?? 'warn',
    SMTP_URL: '',
  };
  let log = '';
  const child = spawn(process.execPath, [join(appRoot, 'dist', 'server', 'index.js')], {
    cwd: appRoot,
    env,
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  child.stdout?.on('data', (chunk: Buffer) => {
    log += chunk.toString();
  });
  child.stderr?.on('data', (chunk: Buffer) => {
    log += chunk.toString();
  });
  const t0 = Date.now();
  try {
    await waitForHealth(baseUrl, child, () => log);
  } catch (error) {
    child.kill('SIGKILL');
    rmSync(appRoot, { recursive: true, force: true });
    rmSync(dataDir, { recursive: true, force: true });
    throw error;
  }
  console.log(`e2e: server healthy at ${baseUrl} after ${((Date.now() - t0) / 1000).toFixed(1)} s (data in ${dataDir})`);
  project.provide('baseUrl', baseUrl);
  project.provide('e2eDataDir', dataDir);

  return async () => {
    if (child.exitCode === null) {
      const exited = new Promise<void>((r) => child.once('exit', () => r()));
      child.kill('SIGTERM');
      const timer = setTimeout(() => child.kill('SIGKILL'), 5_000);
      await exited;
      clearTimeout(timer);
    }
    if (process.env.E2E_SHOW_SERVER_LOG === '1') console.log(log);
    rmSync(appRoot, { recursive: true, force: true });
    if (process.env.E2E_KEEP_DATA === '1') console.log(`e2e: kept ${dataDir}`);
    else rmSync(dataDir, { recursive: true, force: true });
  };
}
