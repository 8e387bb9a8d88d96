import { emptyState, noFailures, readStateFile, writeStateFile, type FakeFailures, type FakeState } from './state';
import type { PaymentsFakeOptions, PaymentsFakeStats } from './types';
import { createWebhookSender, type WebhookSender } from './webhooks';

// What the parts of the fake share: its objects, the failure switches, the counters, the
// webhook sender, the log, and save() for the state file. Made once per started fake.

export type FakeContext = {
  state: FakeState;
  failures: FakeFailures;
  stats: PaymentsFakeStats;
  webhooks: WebhookSender;
  log: (line: string) => void;
  /** Writes the state file, when the fake keeps one. */
  save(): void;
};

/** The context of a new fake; with a state file, its objects are read back from it (FakeStateFileError if that fails). */
export function createFakeContext(options: PaymentsFakeOptions): FakeContext {
  const log = options.log ?? (() => {});
  const { stateFile } = options;
  const stats: PaymentsFakeStats = {
    requests: 0,
    replays: 0,
    created: { accounts: 0, accountLinks: 0, transfers: 0, payouts: 0 },
    webhooksDelivered: 0,
    webhooksFailed: 0,
  };
  const stored = stateFile ? readStateFile(stateFile) : null;
  if (stored) log(`state loaded from ${stateFile}: ${stored.accounts.size} accounts, ${stored.payouts.size} payouts`);
  const state = stored ?? emptyState();
  return {
    state,
    failures: noFailures(),
    stats,
    webhooks: createWebhookSender({ secret: options.webhookSecret, url: options.webhookUrl, stats, log }),
    log,
    save: () => {
      if (stateFile) writeStateFile(stateFile, state);
    },
  };
}
