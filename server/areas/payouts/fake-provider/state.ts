import { existsSync, mkdirSync, readFileSync, renameSync, writeFileSync } from 'node:fs';
import { dirname } from 'node:path';
import { z } from 'zod';

// What the fake keeps: the provider objects it made (accounts, onboarding links, transfers,
// payouts), balances per connected account, and the idempotency cache; and, optionally,
// the JSON file they are kept in across restarts. The file is read back through the
// schemas below (the shapes the fake writes), so a damaged or foreign file is an error
// naming it, not a half-loaded state. Failure flags are test switches and are not kept.

const metadataSchema = z.record(z.string(), z.string());

const bankAccountSchema = z.object({
  id: z.string(),
  object: z.literal('bank_account'),
  bank_name: z.string(),
  last4: z.string(),
  currency: z.string(),
  // Absent in files written before onboarding and completeOnboarding() shared one code path.
  country: z.string().optional(),
});

export const accountSchema = z.object({
  id: z.string(),
  object: z.literal('account'),
  type: z.string(),
  country: z.string(),
  email: z.string().nullable(),
  metadata: metadataSchema,
  created: z.number().int(),
  details_submitted: z.boolean(),
  payouts_enabled: z.boolean(),
  charges_enabled: z.boolean(),
  capabilities: z.object({ transfers: z.enum(['inactive', 'active']) }),
  external_accounts: z.object({
    object: z.literal('list'),
    data: z.array(bankAccountSchema),
    has_more: z.boolean(),
    url: z.string().optional(),
  }),
});
export type Account = z.infer<typeof accountSchema>;

const onboardingLinkSchema = z.object({ account: z.string(), returnUrl: z.string(), refreshUrl: z.string(), expiresAt: z.number().int() });
export type OnboardingLink = z.infer<typeof onboardingLinkSchema>;

const transferSchema = z.object({
  id: z.string(),
  object: z.literal('transfer'),
  amount: z.number().int(),
  currency: z.string(),
  destination: z.string(),
  created: z.number().int(),
  metadata: metadataSchema,
  transfer_group: z.string().nullable(),
  reversed: z.boolean(),
  livemode: z.boolean(),
});
export type Transfer = z.infer<typeof transferSchema>;

const payoutSchema = z.object({
  id: z.string(),
  object: z.literal('payout'),
  amount: z.number().int(),
  currency: z.string(),
  status: z.enum(['pending', 'paid', 'failed']),
  created: z.number().int(),
  arrival_date: z.number().int(),
  metadata: metadataSchema,
  failure_code: z.string().nullable(),
  failure_message: z.string().nullable(),
  method: z.string(),
  type: z.string(),
  livemode: z.boolean(),
});
export type Payout = z.infer<typeof payoutSchema>;

/** A payout and the connected account it pays out from. */
const payoutEntrySchema = z.object({ payout: payoutSchema, account: z.string() });
export type PayoutEntry = z.infer<typeof payoutEntrySchema>;

/** The answer to an idempotent request, replayed for the same key. */
const storedAnswerSchema = z.object({ fingerprint: z.string(), status: z.number().int(), body: z.string() });
export type StoredAnswer = z.infer<typeof storedAnswerSchema>;

export type FakeState = {
  accounts: Map<string, Account>;
  links: Map<string, OnboardingLink>;
  transfers: Map<string, Transfer>;
  payouts: Map<string, PayoutEntry>;
  /** connected account -> currency (lower case) -> minor units */
  balances: Map<string, Map<string, number>>;
  /** `${Stripe-Account or 'platform'}\0${Idempotency-Key}` -> the first answer */
  idempotency: Map<string, StoredAnswer>;
};

/** Test switches (not kept in the state file). */
export type FakeFailures = {
  /** account -> the message its transfers are refused with */
  transfers: Map<string, string>;
  /** account -> the failure message its payouts settle with */
  payouts: Map<string, string>;
  /** `${METHOD} ${path}` of requests to answer 500 once */
  nextRequest: Set<string>;
};

export function emptyState(): FakeState {
  return { accounts: new Map(), links: new Map(), transfers: new Map(), payouts: new Map(), balances: new Map(), idempotency: new Map() };
}

export function noFailures(): FakeFailures {
  return { transfers: new Map(), payouts: new Map(), nextRequest: new Set() };
}

/** An account's balances per currency (made empty on first use). */
export function balanceOf(state: FakeState, account: string): Map<string, number> {
  let b = state.balances.get(account);
  if (!b) state.balances.set(account, (b = new Map()));
  return b;
}

export function addToBalance(state: FakeState, account: string, currency: string, amount: number): void {
  const b = balanceOf(state, account);
  b.set(currency, (b.get(currency) ?? 0) + amount);
}

// The state file: the maps as arrays of values or [key, value] pairs.
const stateFileSchema = z.object({
  accounts: z.array(accountSchema),
  links: z.array(z.tuple([z.string(), onboardingLinkSchema])),
  transfers: z.array(transferSchema),
  payouts: z.array(payoutEntrySchema),
  balances: z.array(z.tuple([z.string(), z.array(z.tuple([z.string(), z.number().int()]))])),
  idempotency: z.array(z.tuple([z.string(), storedAnswerSchema])),
});
type StateFile = z.infer<typeof stateFileSchema>;

/** The fake's state file could not be read back; the message names the file and what is wrong. */
export class FakeStateFileError extends Error {
  constructor(
    readonly file: string,
    readonly problem: string,
  ) {
    super(`the payments fake's state file ${file} cannot be read: ${problem}\nMove or delete that file to start the fake empty.`);
    this.name = 'FakeStateFileError';
  }
}

/** Reads the state file; null when there is none yet. Throws FakeStateFileError for a file it cannot use. */
export function readStateFile(file: string): FakeState | null {
  if (!existsSync(file)) return null;
  let raw: unknown;
  try {
    raw = JSON.parse(readFileSync(file, 'utf8'));
  } catch (error) {
    throw new FakeStateFileError(file, `not valid JSON (${error instanceof Error ? error.message : String(error)})`);
  }
  const parsed = stateFileSchema.safeParse(raw);
  if (!parsed.success) throw new FakeStateFileError(file, `not the fake's state\n${z.prettifyError(parsed.error)}`);
  const data = parsed.data;
  return {
    accounts: new Map(data.accounts.map((a) => [a.id, a])),
    links: new Map(data.links),
    transfers: new Map(data.transfers.map((t) => [t.id, t])),
    payouts: new Map(data.payouts.map((p) => [p.payout.id, p])),
    balances: new Map(data.balances.map(([account, amounts]) => [account, new Map(amounts)])),
    idempotency: new Map(data.idempotency),
  };
}

/** Writes the state file whole (a temporary file renamed over it, so a crash never leaves half a file). */
export function writeStateFile(file: string, state: FakeState): void {
  const data: StateFile = {
    accounts: [...state.accounts.values()],
    links: [...state.links.entries()],
    transfers: [...state.transfers.values()],
    payouts: [...state.payouts.values()],
    balances: [...state.balances.entries()].map(([account, amounts]) => [account, [...amounts.entries()]]),
    idempotency: [...state.idempotency.entries()],
  };
  mkdirSync(dirname(file), { recursive: true });
  const tmp = `${file}.${process.pid}.tmp`;
  writeFileSync(tmp, JSON.stringify(data));
  renameSync(tmp, file);
}
