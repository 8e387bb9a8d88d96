import type { Express } from 'express';
import { randomBytes } from 'node:crypto';
import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import { createServer, type Server } from 'node:http';
import { isAbsolute, join, resolve } from 'node:path';
import { appRoot } from './platform/app-root';
import { createApp } from './app';
import { buildDeps } from './compose';
import { closeDatabase, openDatabase } from './platform/db/client';
import { demoAccounts, demoPassword } from './areas/accounts/index';
import { markDemoSeeded, resolveDemoMode, wasDemoSeeded } from './platform/db/demo-mode';
import { seedDemo } from './demo-seed';
import type { DemoSeeder } from './demo-seeders';
import { EnvError, loadEnv, type Env } from './platform/env';
import { createLogger } from './platform/log';
import { startFakeSmtp } from './platform/mail/fake-smtp';
import { loadMailTemplates } from './platform/mail/templates';
import { localFakes } from './local-fakes';
import { privateDataDir, privateFile } from './platform/private-files';
import { InstanceLockError, lockDataDir } from './platform/instance-lock';
import { redactUrl } from './platform/jobs/runtime';
import type { LocalFakeHandle } from './platform/local-fake';
import { StockReader } from './areas/stock/index';

// Start-up shared by server/index.ts (production) and server/dev.ts (Vite middleware).

export function resolveDataDir(env: Env): string {
  return isAbsolute(env.DATA_DIR) ? env.DATA_DIR : resolve(appRoot(), env.DATA_DIR);
}

/** AUTH_SECRET, or a secret generated once and kept in DATA_DIR/auth-secret. */
export function resolveAuthSecret(env: Env, dataDir: string): string {
  if (env.AUTH_SECRET) return env.AUTH_SECRET;
  const file = join(dataDir, 'auth-secret');
  if (existsSync(file)) {
    privateFile(file);
    return readFileSync(file, 'utf8').trim();
  }
  const secret = randomBytes(32).toString('base64url');
  writeFileSync(file, `${secret}\n`, { mode: 0o600 });
  return secret;
}

export type StartOptions = {
  source?: Record<string, string | undefined>;
  /** prepare client serving once the HTTP server exists (Vite needs it for its websocket) */
  prepareClient?: (httpServer: Server) => Promise<(app: Express) => void>;
  /** demo seeders to run (default: the list in server/demo-seeders.ts) */
  seeders?: DemoSeeder[];
  /** print the start-up banner (default true) */
  quiet?: boolean;
};

export async function startServer(options: StartOptions = {}) {
  const t0 = Date.now();
  const env = loadEnv(options.source ?? process.env);
  const log = createLogger(env.LOG_LEVEL);
  const dataDir = resolveDataDir(env);
  // the folder 0700: the database and the secret are for this user only (SECURITY.md)
  privateDataDir(dataDir, log);
  // one server per data folder: refuse before touching anything in it (decision 032)
  const lock = lockDataDir(dataDir);
  try {
    return await startLocked(options, env, log, dataDir, lock.release, t0);
  } catch (err) {
    lock.release();
    throw err;
  }
}

async function startLocked(options: StartOptions, envIn: Env, log: ReturnType<typeof createLogger>, dataDir: string, releaseLock: () => void, t0: number) {
  let env = envIn;
  const source = options.source ?? process.env;
  const dbFile = join(dataDir, 'squarewright.db');
  const isNew = !existsSync(dbFile);
  // 0600 before SQLite opens it (its -wal and -shm files take the same mode)
  privateFile(dbFile, [`${dbFile}-wal`, `${dbFile}-shm`]);
  const secret = resolveAuthSecret(env, dataDir);
  loadMailTemplates();
  const db = openDatabase(dbFile);
  const demo = resolveDemoMode(db, isNew, env.DEMO);

  const stops: (() => Promise<void>)[] = [];
  let smtp: { url: string; localFake: boolean };
  if (env.SMTP_URL) {
    smtp = { url: env.SMTP_URL, localFake: false };
  } else {
    const fake = await startFakeSmtp({ db });
    stops.push(() => fake.close());
    smtp = { url: fake.url, localFake: true };
  }
  const started: { name: string; handle: LocalFakeHandle }[] = [];
  for (const fake of localFakes) {
    if (!fake.shouldStart(env)) continue;
    const handle = await fake.start({ env, db, log });
    started.push({ name: fake.name, handle });
    stops.push(() => handle.stop());
  }
  const overrides = Object.assign({}, ...started.map((s) => s.handle.envOverrides ?? {})) as Record<string, string>;
  if (Object.keys(overrides).length > 0) env = loadEnv({ ...source, ...overrides });

  // the stock list's pages are read on a thread of their own (server/areas/stock/stock-reader.ts)
  const stockReader = new StockReader(dbFile, (e, again) => log.warn(`${e.message}; ${again ? 'starting it again in a second' : 'too many restarts: the request thread reads the stock itself from now on'}`));
  stops.push(() => stockReader.close());
  const deps = buildDeps({ env, db, demo, secret, smtp, log, stockReader });
  // once per database: a new one in demo mode, or an older one started with DEMO=1
  if (demo && !wasDemoSeeded(db)) {
    await seedDemo(deps, options.seeders);
    markDemoSeeded(db);
  }

  const httpServer = createServer();
  const mountClient = options.prepareClient ? await options.prepareClient(httpServer) : undefined;
  const app = createApp(deps, mountClient ? { mountClient } : {});
  httpServer.on('request', app);
  try {
    await new Promise<void>((resolveListen, reject) => {
      httpServer.once('error', reject);
      httpServer.listen(env.PORT, env.HOST, () => resolveListen());
    });
  } catch (err) {
    await deps.jobs.close();
    await deps.mail.stop();
    await deps.webhooks.stop();
    for (const stop of stops.reverse()) await stop().catch(() => undefined);
    closeDatabase(db);
    const code = (err as { code?: unknown }).code;
    if (code === 'EADDRINUSE') throw new Error(`Port ${env.PORT} on ${env.HOST} is already in use: stop the other server or set PORT to a free port.`, { cause: err });
    throw err;
  }
  deps.mail.start();
  deps.webhooks.start();

  const lines = [
    `Squarewright ${isNew ? '(new database) ' : ''}is running at ${env.PUBLIC_URL}  (listening on ${env.HOST}:${env.PORT}, ${Date.now() - t0} ms)`,
    `  data: ${dbFile}`,
    `  mail: ${smtp.localFake ? `local fake SMTP at ${smtp.url} (read it in Mailbox (local), signed in as admin)` : 'SMTP_URL'}`,
    `  jobs: ${env.REDIS_URL ? `BullMQ on ${redactUrl(env.REDIS_URL)} (workers: npm run worker${env.JOB_WORKERS ? `; ${env.JOB_WORKERS} thread(s) here too` : ''})` : `${env.JOB_WORKERS ?? 1} worker thread(s) in this process`}`,
    ...started.map((s) => `  ${s.name}: local fake at ${s.handle.url}`),
  ];
  if (demo) {
    lines.push(`  demo sign-ins (password ${demoPassword}):`);
    for (const a of demoAccounts) lines.push(`    ${a.role.padEnd(8)} ${a.email}`);
  }
  if (!options.quiet) console.log(lines.join('\n'));

  let closing: Promise<void> | undefined;
  const close = () =>
    (closing ??= (async () => {
      await new Promise<void>((r) => {
        httpServer.close(() => r());
        httpServer.closeAllConnections();
      });
      await deps.jobs.close();
      await deps.mail.stop();
      await deps.webhooks.stop();
      for (const stop of stops.reverse()) await stop().catch(() => undefined);
      closeDatabase(db);
      releaseLock();
    })());
  return { app, deps, httpServer, close, env };
}

export function exitOnSignals(close: () => Promise<void>) {
  for (const signal of ['SIGINT', 'SIGTERM'] as const) {
    process.once(signal, () => {
      close().finally(() => process.exit(0));
    });
  }
}

/** What to print when start-up fails: the message for the errors we explain, else everything. */
export function startupErrorText(err: unknown): unknown {
  if (err instanceof EnvError || err instanceof InstanceLockError) return err.message;
  if (err instanceof Error && (err.cause as { code?: unknown } | undefined)?.code === 'EADDRINUSE') return err.message;
  return err;
}
