import type { Auth } from './auth/auth';
import type { Clock } from './clock';
import type { Db } from './db/client';
import type { Env } from './env';
import type { Logger } from './log';
import type { MailSender } from './mail/outbox';
import type { PaymentsProvider } from '../areas/payouts/provider';
import type { PuzzleSource } from '../areas/editions/editions';

/**
 * What the app is built from (createApp(deps)). Areas that need more (a payments
 * client...) add an optional field here with a small edit.
 */
export type AppDeps = {
  env: Env;
  /** resolved demo mode (DEMO, or "database was new") */
  demo: boolean;
  db: Db;
  auth: Auth;
  mail: MailSender & { transport: 'smtp' | 'local-fake' };
  clock: Clock;
  log: Logger;
  /** payments provider (real, or the local fake); null when not configured */
  payments?: PaymentsProvider | null;
  /** print's view of the puzzle store (the puzzle area wires it); without it no puzzle can be slotted */
  puzzlesForPrint?: PuzzleSource;
};
