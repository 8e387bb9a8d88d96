import { eq } from 'drizzle-orm';
import type { Express } from 'express';
import { mkdtempSync, rmSync } from 'node:fs';
import type { IncomingMessage, ServerResponse } from 'node:http';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import request from 'supertest';
import type TestAgent from 'supertest/lib/agent';
import type { Role } from '../../../shared/contracts/common';
import { createApp } from '../../../server/app';
import type { Clock } from '../../../server/platform/clock';
import { buildDeps, createAppJobs } from '../../../server/compose';
import { StockReader } from '../../../server/areas/stock/index';
import { closeDatabase, openDatabase, type Db } from '../../../server/platform/db/client';
import { user } from '../../../server/platform/auth/schema';
import { mailboxMessage } from '../../../server/platform/mail/schema';
import type { AppDeps } from '../../../server/app-deps';
import type { ApiRouter } from '../../../server/platform/http/route';
import { loadEnv, type EnvInput } from '../../../server/platform/env';
import { startFakeSmtp, type FakeSmtp } from '../../../server/platform/mail/fake-smtp';
import { seedDemo } from '../../../server/demo-seed';
import type { DemoSeeder } from '../../../server/demo-seeders';

// The server test harness. See DEVELOPERS.md ("The server test harness").
//
//   const t = await createTestApp();
//   afterAll(() => t.close());
//   const editor = await t.signInAs('editor');        // supertest agent with a session cookie
//   await editor.get('/api/stock').expect(200);
//   await request(t.app).get('/api/stock').expect(401);
//   const mail = await t.mailbox.waitFor({ to: 'x@y.test' });

export const testPassword = 'test-password-123';

/** A clock that runs with real time plus an offset you can move. */
export type TestClock = Clock & { advance(ms: number): void; set(date: Date): void };

export function createTestClock(): TestClock {
  let offset = 0;
  return {
    now: () => new Date(Date.now() + offset),
    advance: (ms) => {
      offset += ms;
    },
    set: (date) => {
      offset = date.getTime() - Date.now();
    },
  };
}

export type CaughtMail = { id: number; from: string; to: string; subject: string; text: string; html: string | null };

export type TestMailbox = {
  /** every mail the local fake SMTP server caught, oldest first */
  all(): CaughtMail[];
  /** deliver the outbox, then wait (default 5 s) for a caught mail matching `match` */
  waitFor(match: { to?: string; subject?: string | RegExp } | ((m: CaughtMail) => boolean), timeoutMs?: number): Promise<CaughtMail>;
  /** the first link in a mail's text that starts with PUBLIC_URL + pathPrefix, as a path ('/invite/abc') */
  linkIn(mail: CaughtMail, pathPrefix: string): string;
};

export type TestApp = {
  /**
   * the Express app as our own pages call it: like a browser, a state-changing request
   * without Origin or Referer gets `Origin: PUBLIC_URL` (set either header yourself to send
   * another); `app.api.registered` lists every registered `METHOD /path`
   */
  app: Express & { api: ApiRouter };
  /** the same app with nothing added: what a non-browser client or a forged request sends */
  rawApp: Express & { api: ApiRouter };
  db: Db;
  deps: AppDeps;
  clock: TestClock;
  mailbox: TestMailbox;
  smtp: FakeSmtp;
  /** a supertest agent signed in as a user of that role (created on first use; `${role}@test.squarewright.test`) */
  signInAs(role: Role, options?: { email?: string; name?: string }): Promise<TestAgent>;
  /** create a user directly (no sign-in); returns its id */
  createUser(role: Role, options?: { email?: string; name?: string; password?: string }): Promise<string>;
  /** stop the job system as a server stop would, and start a new one on the same database (t.deps.jobs is the new one) */
  restartJobs(): Promise<void>;
  close(): Promise<void>;
};

export type CreateTestAppOptions = {
  /** environment variables on top of the test defaults */
  env?: EnvInput;
  /** demo mode: seed the demo accounts and run the given seeders (default: none) */
  demo?: boolean | { seeders: DemoSeeder[] };
  /** sign-in attempts per window (default 1000 per 60 s, so tests do not trip it) */
  signInLimit?: { window: number; max: number };
  /** outbox retry settings */
  mail?: { baseDelayMs?: number; maxDelayMs?: number; maxAttempts?: number };
  /** webhook outbox settings (retry delays, attempts, timeout); the sender is not started: call t.deps.webhooks.flush() */
  webhooks?: { baseDelayMs?: number; maxDelayMs?: number; maxAttempts?: number; timeoutMs?: number };
  /** read stock list pages on a reader thread, as the server does (default: on the request thread) */
  stockReader?: boolean;
};

/**
 * Browsers send `Origin` with every POST, PUT, PATCH and DELETE, and the app refuses such a
 * request without it (server/platform/http/same-origin.ts). Tests act as our own pages: this
 * adds the app's origin when a test set neither Origin nor Referer.
 */
function asBrowserPage(app: Express & { api: ApiRouter }, publicUrl: string): Express & { api: ApiRouter } {
  const origin = new URL(publicUrl).origin;
  const handler = (req: IncomingMessage, res: ServerResponse) => {
    const safe = req.method === 'GET' || req.method === 'HEAD' || req.method === 'OPTIONS';
    if (!safe && req.headers.origin === undefined && req.headers.referer === undefined) req.headers.origin = origin;
    app(req, res);
  };
  return Object.assign(handler, { api: app.api }) as unknown as Express & { api: ApiRouter };
}

export async function createTestApp(options: CreateTestAppOptions = {}): Promise<TestApp> {
  const dir = mkdtempSync(join(tmpdir(), 'sw-test-'));
  const env = loadEnv({
    NODE_ENV: 'test',
    DATA_DIR: dir,
    PUBLIC_URL: 'http://localhost:3000',
    LOG_LEVEL: 'warn',
    AUTH_SECRET: 'test-secret-test-secret-test-secret-0123',
    ...options.env,
  } as Record<string, string | undefined>);
  const db = openDatabase(join(dir, 'squarewright.db'));
  const smtp = await startFakeSmtp({ db });
  const clock = createTestClock();
  const stockReader = options.stockReader ? new StockReader(join(dir, 'squarewright.db')) : null;
  const demo = options.demo !== undefined && options.demo !== false;
  const deps = buildDeps({
    env,
    db,
    demo,
    secret: env.AUTH_SECRET ?? '',
    smtp: { url: smtp.url, localFake: true },
    clock,
    signInLimit: options.signInLimit ?? { window: 60, max: 1000 },
    stockReader,
    ...(options.mail ? { mail: options.mail } : {}),
    ...(options.webhooks ? { webhooks: options.webhooks } : {}),
  });
  // The sender loop is not started: waitFor() delivers the outbox itself.
  deps.mail.kick = () => undefined;
  if (demo) await seedDemo(deps, typeof options.demo === 'object' ? options.demo.seeders : []);
  const rawApp = createApp(deps);
  const app = asBrowserPage(rawApp, env.PUBLIC_URL);

  const mailbox: TestMailbox = {
    all: () =>
      db
        .select({ id: mailboxMessage.id, from: mailboxMessage.from, to: mailboxMessage.to, subject: mailboxMessage.subject, text: mailboxMessage.text, html: mailboxMessage.html })
        .from(mailboxMessage)
        .orderBy(mailboxMessage.id)
        .all(),
    async waitFor(match, timeoutMs = 5_000) {
      const test =
        typeof match === 'function'
          ? match
          : (m: CaughtMail) =>
              (match.to === undefined || m.to.toLowerCase().includes(match.to.toLowerCase())) &&
              (match.subject === undefined || (typeof match.subject === 'string' ? m.subject.includes(match.subject) : match.subject.test(m.subject)));
      const deadline = Date.now() + timeoutMs;
      for (;;) {
        await deps.mail.flush();
        const found = mailbox.all().find(test);
        if (found) return found;
        if (Date.now() > deadline) {
          throw new Error(`no caught mail matched within ${timeoutMs} ms; caught: ${JSON.stringify(mailbox.all().map((m) => ({ to: m.to, subject: m.subject })))}`);
        }
        await new Promise((r) => setTimeout(r, 25));
      }
    },
    linkIn(mail, pathPrefix) {
      const base = env.PUBLIC_URL;
      const escaped = (base + pathPrefix).replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
      const m = new RegExp(`${escaped}[^\\s]*`).exec(mail.text);
      if (!m) throw new Error(`no link ${base}${pathPrefix}... in mail "${mail.subject}"`);
      return m[0].slice(base.length);
    },
  };

  async function createUser(role: Role, o: { email?: string; name?: string; password?: string } = {}) {
    const email = o.email ?? `${role}@test.squarewright.test`;
    const existing = db.select({ id: user.id }).from(user).where(eq(user.email, email)).get();
    if (existing) return existing.id;
    const created = await deps.auth.api.createUser({
      body: { email, password: o.password ?? testPassword, name: o.name ?? `Test ${role}`, role },
    });
    return created.user.id;
  }

  async function signInAs(role: Role, o: { email?: string; name?: string } = {}) {
    const email = o.email ?? `${role}@test.squarewright.test`;
    await createUser(role, { email, ...(o.name ? { name: o.name } : {}) });
    const agent = request.agent(app);
    const res = await agent.post('/api/auth/sign-in/email').send({ email, password: testPassword });
    if (res.status !== 200) throw new Error(`signInAs(${role}) failed: ${res.status} ${JSON.stringify(res.body)}`);
    return agent;
  }

  return {
    app,
    rawApp,
    db,
    deps,
    clock,
    mailbox,
    smtp,
    signInAs,
    createUser,
    async restartJobs() {
      await deps.jobs.close();
      deps.jobs = createAppJobs({ db, env });
    },
    async close() {
      await deps.jobs.close();
      await stockReader?.close();
      await deps.mail.stop();
      await smtp.close();
      closeDatabase(db);
      rmSync(dir, { recursive: true, force: true });
    },
  };
}
