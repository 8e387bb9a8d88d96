// What callers of the local fake provider see: its options, its counters and its handle.
// (The fake itself: ./index.ts.)

/** The only API key the fake accepts; the SDK pointed at the fake uses it. */
export const FAKE_SECRET_KEY = 'sk_test_squarewright_local_fake';

export type PaymentsFakeOptions = {
  /** Secret the webhooks are signed with (our PAYMENTS_WEBHOOK_SECRET). */
  webhookSecret: string;
  /** Where webhooks go; may be set later with setWebhookUrl (our port is known after listen). */
  webhookUrl?: string;
  /** Delay before a pending payout settles (ms). Default 300. */
  settleDelayMs?: number;
  /** Settle payouts on a timer (default true); tests may turn it off and call settleAll(). */
  autoSettle?: boolean;
  /** Log line sink; default silent. */
  log?: (line: string) => void;
  /**
   * Keep the fake's objects (accounts, transfers, payouts, balances, idempotency cache) in
   * this JSON file, so a restarted dev server finds the accounts and keys it made before.
   * Failure flags are not kept. Default: memory only. A file that cannot be read back is an
   * error naming it (FakeStateFileError), never silently replaced.
   */
  stateFile?: string;
};

export type PaymentsFakeStats = {
  /** Every API request received (replays included). */
  requests: number;
  /** Idempotent replays answered from the cache. */
  replays: number;
  created: { accounts: number; accountLinks: number; transfers: number; payouts: number };
  webhooksDelivered: number;
  webhooksFailed: number;
};

export type PaymentsFake = {
  host: string;
  port: number;
  url: string;
  /** The API key the fake accepts. */
  secretKey: string;
  setWebhookUrl(url: string): void;
  /** Refuse transfers to this account (a synchronous provider error). */
  failTransfersFor(accountId: string, message?: string): void;
  /** Let this account's payouts fail when they settle (reported by webhook). */
  failPayoutsFor(accountId: string, message?: string): void;
  clearFailures(accountId: string): void;
  /** The next request to this method+path answers 500 (a transient provider error). */
  failNextRequest(method: string, path: string): void;
  /** Marks an account as onboarded (what the hosted page does). */
  completeOnboarding(accountId: string): void;
  /** Settles every pending payout now and waits for the webhooks to be delivered. */
  settleAll(): Promise<void>;
  stats(): PaymentsFakeStats;
  /** Sum of paid payouts per currency (lower case) for an account: what reached the bank. */
  paidOutTo(accountId: string): Record<string, number>;
  /** Connected account balance per currency (lower case). */
  balanceOf(accountId: string): Record<string, number>;
  stop(): Promise<void>;
};
