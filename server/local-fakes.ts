import type { Db } from './platform/db/client';
import type { Env } from './platform/env';
import type { Logger } from './platform/log';
import { localPaymentsFake } from './areas/payouts/runtime';

// Local stand-ins for outside services, started by server/index.ts and server/dev.ts
// (the fake SMTP server is started there directly, since mail needs its URL first).
// An area adds one line: { name: 'payments', shouldStart: (env) => ..., start: startPaymentsFake }.
// `envOverrides` are merged into the environment the app is built with (e.g. the fake's URL).

export type LocalFakeHandle = {
  /** shown at start-up, e.g. 'http://127.0.0.1:41234' */
  url: string;
  stop(): Promise<void>;
  envOverrides?: Record<string, string>;
};

export type LocalFake = {
  name: string;
  shouldStart(env: Env): boolean;
  start(ctx: { env: Env; db: Db; log: Logger }): Promise<LocalFakeHandle>;
};

export const localFakes: LocalFake[] = [localPaymentsFake];
