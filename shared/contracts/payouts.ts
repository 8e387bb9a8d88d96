import { z } from 'zod';
import { currencySchema, currencyTotalSchema, ledgerEntrySchema, monthSchema, statementSummarySchema } from './ledger';

// Payout runs and setters' payout details. The provider holds the bank details; we keep
// only its account id and a display hint.

export const payoutStateSchema = z.enum(['pending', 'paid', 'failed']);
export type PayoutState = z.infer<typeof payoutStateSchema>;

export const payoutSchema = z.object({
  id: z.string(),
  runId: z.string(),
  setterId: z.string(),
  setterName: z.string(),
  amountMinor: z.number().int(),
  currency: currencySchema,
  state: payoutStateSchema,
  /** 1 for the first try; each retry of a failed payout adds one. */
  attempt: z.number().int().min(1),
  failureMessage: z.string().nullable(),
  createdAt: z.string(),
  updatedAt: z.string(),
  paidAt: z.string().nullable(),
});
export type Payout = z.infer<typeof payoutSchema>;

export const payoutRunSchema = z.object({
  id: z.string(),
  createdAt: z.string(),
  createdByName: z.string(),
  payouts: z.array(payoutSchema),
});
export type PayoutRun = z.infer<typeof payoutRunSchema>;

export const payoutDetailsStatusSchema = z.enum(['onboarding', 'ready']);

/** What is owed to one setter in one currency. */
export const owedRowSchema = z.object({
  setterId: z.string(),
  setterName: z.string(),
  email: z.string(),
  currency: currencySchema,
  owedMinor: z.number().int(),
  detailsStatus: payoutDetailsStatusSchema.nullable(),
  detailsHint: z.string().nullable(),
});
export type OwedRow = z.infer<typeof owedRowSchema>;

/** GET /api/payouts (editor). */
export const payoutsOverviewSchema = z.object({
  owed: z.array(owedRowSchema),
  runs: z.array(payoutRunSchema),
});
export type PayoutsOverview = z.infer<typeof payoutsOverviewSchema>;

/**
 * POST /api/payouts/runs (editor). `requestKey` is made once per confirmation dialog, so a
 * repeated click or a retried request returns the same run instead of making another.
 */
export const createPayoutRunInputSchema = z
  .object({
    requestKey: z.uuid({ error: 'requestKey must be a UUID made once per confirmation' }),
    /** Only these setters; all setters owed (with payout details) when left out. */
    setterIds: z.array(z.string().min(1)).min(1, 'setterIds, when given, must name at least one setter').max(500).optional(),
  })
  .strict();
export type CreatePayoutRunInput = z.infer<typeof createPayoutRunInputSchema>;

export const skippedSetterSchema = z.object({
  setterId: z.string(),
  setterName: z.string(),
  reason: z.string(),
});

export const createPayoutRunResponseSchema = z.object({
  run: payoutRunSchema,
  /** True when the requestKey had been seen: the earlier run is returned, nothing new is paid. */
  replayed: z.boolean(),
  skipped: z.array(skippedSetterSchema),
});
export type CreatePayoutRunResponse = z.infer<typeof createPayoutRunResponseSchema>;

export const payoutResponseSchema = z.object({ payout: payoutSchema });

export const payoutIdParamsSchema = z.object({ id: z.string().min(1).max(100) }).strict();

/** A setter's payout details as we keep them: the provider's account, never bank numbers. */
export const payoutDetailsSchema = z.object({
  status: payoutDetailsStatusSchema,
  hint: z.string(),
  updatedAt: z.string(),
});
export type PayoutDetails = z.infer<typeof payoutDetailsSchema>;

/** POST /api/earnings/payout-details (setter). */
export const payoutDetailsInputSchema = z
  .object({
    country: z
      .string({ error: 'country must be a two-letter ISO 3166 code such as GB' })
      .regex(/^[A-Z]{2}$/, 'country must be a two-letter ISO 3166 code in capitals, such as GB'),
  })
  .strict();
export type PayoutDetailsInput = z.infer<typeof payoutDetailsInputSchema>;

export const payoutDetailsResponseSchema = z.object({
  details: payoutDetailsSchema,
  /** The provider's hosted page where the setter enters bank details. */
  onboardingUrl: z.string().nullable(),
});

/** GET /api/earnings (setter). */
export const earningsSchema = z.object({
  /** The current month by the server's clock, YYYY-MM. */
  month: monthSchema,
  entries: z.array(ledgerEntrySchema),
  statements: z.array(statementSummarySchema),
  payouts: z.array(payoutSchema),
  owed: z.array(currencyTotalSchema),
  details: payoutDetailsSchema.nullable(),
});
export type Earnings = z.infer<typeof earningsSchema>;
