import { createAuth } from './platform/auth/auth';
import { systemClock, type Clock } from './platform/clock';
import type { Db } from './platform/db/client';
import type { AppDeps } from './app-deps';
import { editionUsage } from './areas/editions/index';
import { submissionHistory } from './areas/intake/index';
import { createWebhookSender, type WebhookSenderOptions } from './areas/integrations/index';
import { feeRecorder, paymentsProviderFromEnv } from './areas/payouts/index';
import { foundryRunSink } from './areas/foundry/index';
import { uploadSink } from './areas/intake/index';
import { createPuzzleSource, createStockUsage, puzzleProofSink } from './areas/puzzles/index';
import { publishedContent } from './areas/reader/index';
import { stockPort, type StockReader } from './areas/stock/index';
import { jobKindNames } from './job-kinds';
import { createJobs } from './platform/jobs/runtime';
import type { Env } from './platform/env';
import type { EventSink } from './platform/events';
import type { Jobs } from './platform/jobs/port';
import { createLogger, type Logger } from './platform/log';
import { createMailSender, type MailSenderOptions } from './platform/mail/outbox';
import { createSmtpTransport } from './platform/mail/transport';

export type BuildDepsInput = {
  env: Env;
  db: Db;
  demo: boolean;
  secret: string;
  smtp: { url: string; localFake: boolean };
  clock?: Clock;
  log?: Logger;
  signInLimit?: { window: number; max: number };
  mail?: Pick<MailSenderOptions, 'baseDelayMs' | 'maxDelayMs' | 'maxAttempts' | 'intervalMs'>;
  /** webhook outbox settings (retry delays, timeout, HTTP client) */
  webhooks?: Pick<WebhookSenderOptions, 'baseDelayMs' | 'maxDelayMs' | 'maxAttempts' | 'intervalMs' | 'timeoutMs' | 'fetch'>;
  /** the job system (tests pass their own); default: createJobs from the environment */
  jobs?: Jobs;
  /** the stock list's reader thread (the server starts one for its database file); none: the request thread reads list pages */
  stockReader?: StockReader | null;
};

/** The app's job system: every job kind's server half (where its results go) with the kinds the workers run. */
export function createAppJobs(o: { db: Db; env: Env; log?: Logger; graceMs?: number; sliceMs?: number; events?: EventSink }): Jobs {
  const sinks = [foundryRunSink(stockPort, o.events), puzzleProofSink, uploadSink(stockPort, o.env)];
  return createJobs({ db: o.db, kinds: jobKindNames, sinks, env: o.env, ...(o.log ? { log: o.log } : {}), ...(o.graceMs ? { graceMs: o.graceMs } : {}), ...(o.sliceMs ? { sliceMs: o.sliceMs } : {}) });
}

/** Wire the dependencies createApp needs (used by server/index.ts, server/dev.ts and the test harness). */
export function buildDeps(input: BuildDepsInput): AppDeps {
  const clock = input.clock ?? systemClock;
  const log = input.log ?? createLogger(input.env.LOG_LEVEL);
  const sender = createMailSender({
    db: input.db,
    transport: createSmtpTransport(input.smtp),
    from: input.env.MAIL_FROM,
    clock,
    log,
    ...input.mail,
  });
  const mail = Object.assign(sender, { transport: input.smtp.localFake ? ('local-fake' as const) : ('smtp' as const) });
  const auth = createAuth({
    db: input.db,
    env: input.env,
    secret: input.secret,
    clock,
    onMailQueued: () => mail.kick(),
    ...(input.signInLimit ? { signInLimit: input.signInLimit } : {}),
  });
  // outgoing events: the webhook outbox is the platform's event sink (server/platform/events.ts)
  const webhooks = createWebhookSender({ db: input.db, clock, log, ...input.webhooks });
  // every job kind's server half: where its results go (server/platform/jobs/port.ts)
  const jobs = input.jobs ?? createAppJobs({ db: input.db, env: input.env, log, events: webhooks });
  const platform = { env: input.env, demo: input.demo, db: input.db, auth, mail, clock, log, jobs, events: webhooks };
  // The areas' ports, wired here and nowhere else: each area gets what it needs from the
  // others as typed interfaces (see server/areas/<area>/ports.ts).
  return {
    ...platform,
    stock: stockPort,
    stockReader: input.stockReader ?? null,
    submissionHistory,
    stockUsage: createStockUsage(editionUsage),
    editionUsage,
    puzzles: createPuzzleSource(stockPort),
    fees: feeRecorder,
    webhooks,
    // the local webhook receiver answers in development, demo and tests
    localReceiver: input.demo || input.env.NODE_ENV !== 'production',
    publishedContent,
    payments: paymentsProviderFromEnv(input.env),
  };
}
