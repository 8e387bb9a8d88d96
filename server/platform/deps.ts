import type { Auth } from './auth/auth';
import type { Clock } from './clock';
import type { Db } from './db/client';
import type { Env } from './env';
import type { EventSink } from './events';
import type { Jobs } from './jobs/port';
import type { Logger } from './log';
import type { MailSender } from './mail/outbox';

/**
 * The shared machinery every area may use. Each area adds what it needs from other areas
 * (their ports) in its own `ports.ts` (`StockDeps`, `EditionsDeps`, ...); the composition
 * root (server/compose.ts) builds one object that satisfies them all (`AppDeps`).
 */
export type PlatformDeps = {
  env: Env;
  /** resolved demo mode (DEMO, or "database was new") */
  demo: boolean;
  db: Db;
  auth: Auth;
  mail: MailSender & { transport: 'smtp' | 'local-fake' };
  clock: Clock;
  log: Logger;
  /** THE way to run heavy work off the request thread (server/platform/jobs/port.ts) */
  jobs: Jobs;
  /** outgoing events (webhooks): emit inside the transaction of the change, kick after it */
  events: EventSink;
};
