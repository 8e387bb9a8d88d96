import type { Db } from './db/client';
import type { Env } from './env';
import type { Logger } from './log';

// A local stand-in for an outside service (the payments provider's fake, for example),
// started by server/bootstrap.ts before the app is built. The list of fakes is kept by the
// composition root (server/local-fakes.ts); each area that owns a fake exports one of these.
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
