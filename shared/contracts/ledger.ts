import { z } from 'zod';

// The setters' fee ledger: integer minor units and an ISO 4217 currency on every entry.
// One schema per contract: the server parses with it, the client parses answers with it.

/** ISO 4217 alphabetic code, upper case (GBP, EUR, USD...). */
export const currencySchema = z
  .string({ error: 'currency must be a three-letter ISO 4217 code such as GBP' })
  .regex(/^[A-Z]{3}$/, 'currency must be a three-letter ISO 4217 code in capitals, such as GBP');

/** Money as a whole number of minor units (pence, cents). Never a float. */
export const amountMinorSchema = z
  .number({ error: 'amount must be a whole number of minor units (pence, cents)' })
  .int('amount must be a whole number of minor units (pence, cents), not a decimal')
  .min(-100_000_000, 'amount is out of range')
  .max(100_000_000, 'amount is out of range');

/** A calendar date, YYYY-MM-DD. */
export const isoDateSchema = z
  .string({ error: 'date must be a string YYYY-MM-DD' })
  .regex(/^\d{4}-(0[1-9]|1[0-2])-(0[1-9]|[12]\d|3[01])$/, 'date must be YYYY-MM-DD')
  .refine((v) => !Number.isNaN(Date.parse(`${v}T00:00:00Z`)) && new Date(`${v}T00:00:00Z`).toISOString().startsWith(v), 'date does not exist in the calendar');

/** A statement month, YYYY-MM. */
export const monthSchema = z
  .string({ error: 'month must be a string YYYY-MM' })
  .regex(/^\d{4}-(0[1-9]|1[0-2])$/, 'month must be YYYY-MM, for example 2026-11');

export const puzzleKindSchema = z.enum(['assembly', 'deduction'], { error: 'kind must be assembly or deduction' });

const idSchema = (what: string) => z.string({ error: `${what} is required` }).min(1, `${what} must not be empty`).max(200);

/** One printed puzzle's fee, as the publish step hands it to the ledger. */
export const publicationFeeEntrySchema = z
  .object({
    puzzleId: idSchema('puzzleId'),
    setterId: idSchema('setterId'),
    kind: puzzleKindSchema,
    amountMinor: amountMinorSchema.min(0, 'a fee must not be negative'),
    currency: currencySchema,
  })
  .strict();

/** Input of recordPublicationFees(tx, input), called inside the publish transaction. */
export const publicationFeesInputSchema = z
  .object({
    editionId: idSchema('editionId'),
    publicationId: idSchema('publicationId'),
    /** The edition's publication date: the date the fees accrue on. */
    date: isoDateSchema,
    entries: z.array(publicationFeeEntrySchema).max(500),
  })
  .strict()
  .superRefine((input, ctx) => {
    const seen = new Set<string>();
    input.entries.forEach((entry, index) => {
      if (seen.has(entry.puzzleId)) {
        ctx.addIssue({ code: 'custom', path: ['entries', index, 'puzzleId'], message: `puzzle ${entry.puzzleId} is listed twice; one fee per printed puzzle` });
      }
      seen.add(entry.puzzleId);
    });
  });
export type PublicationFeesInput = z.infer<typeof publicationFeesInputSchema>;

export const ledgerEntryKindSchema = z.enum(['fee', 'correction']);

export const ledgerEntrySchema = z.object({
  id: z.string(),
  kind: ledgerEntryKindSchema,
  setterId: z.string(),
  editionId: z.string().nullable(),
  publicationId: z.string().nullable(),
  puzzleId: z.string().nullable(),
  puzzleKind: puzzleKindSchema.nullable(),
  amountMinor: z.number().int(),
  currency: currencySchema,
  date: isoDateSchema,
  reason: z.string().nullable(),
  correctsEntryId: z.string().nullable(),
  createdAt: z.string(),
});
export type LedgerEntry = z.infer<typeof ledgerEntrySchema>;

/** POST /api/ledger/corrections: a correction is a new entry, never an edit. */
export const ledgerCorrectionInputSchema = z
  .object({
    setterId: idSchema('setterId'),
    amountMinor: amountMinorSchema.refine((v) => v !== 0, 'a correction of 0 changes nothing'),
    currency: currencySchema,
    reason: z.string({ error: 'reason is required' }).trim().min(3, 'reason must say why (at least 3 characters)').max(500, 'reason may be at most 500 characters'),
    correctsEntryId: idSchema('correctsEntryId').optional(),
    date: isoDateSchema.optional(),
  })
  .strict();
export type LedgerCorrectionInput = z.infer<typeof ledgerCorrectionInputSchema>;

export const ledgerCorrectionResponseSchema = z.object({ entry: ledgerEntrySchema });

export const currencyTotalSchema = z.object({ currency: currencySchema, amountMinor: z.number().int() });
export type CurrencyTotal = z.infer<typeof currencyTotalSchema>;

/** A setter's statement for one month. */
export const statementSchema = z.object({
  setterId: z.string(),
  setterName: z.string(),
  month: monthSchema,
  entries: z.array(ledgerEntrySchema),
  /** Sum of the month's entries per currency. */
  totals: z.array(currencyTotalSchema),
  /** Payouts confirmed paid in the month, per currency. */
  paid: z.array(currencyTotalSchema),
});
export type Statement = z.infer<typeof statementSchema>;

export const statementSummarySchema = z.object({
  month: monthSchema,
  entryCount: z.number().int(),
  totals: z.array(currencyTotalSchema),
});

export const statementSendResponseSchema = z.object({ month: monthSchema, to: z.string(), queued: z.boolean() });

/** Digits after the decimal point for a currency (2 for GBP, 0 for JPY), from Intl. */
export function minorDigits(currency: string): number {
  try {
    return new Intl.NumberFormat('en-GB', { style: 'currency', currency }).resolvedOptions().maximumFractionDigits ?? 2;
  } catch {
    return 2;
  }
}

/** Formats minor units for people: formatMoney(1250, 'GBP') -> "£12.50". */
export function formatMoney(amountMinor: number, currency: string): string {
  const digits = minorDigits(currency);
  return new Intl.NumberFormat('en-GB', { style: 'currency', currency, minimumFractionDigits: digits, maximumFractionDigits: digits }).format(amountMinor / 10 ** digits);
}

/** Minor units as a plain decimal string for files: toDecimalString(-1250, 'GBP') -> "-12.50". Exact, no floats. */
export function toDecimalString(amountMinor: number, currency: string): string {
  const digits = minorDigits(currency);
  const sign = amountMinor < 0 ? '-' : '';
  const abs = Math.abs(amountMinor).toString();
  if (digits === 0) return `${sign}${abs}`;
  const padded = abs.padStart(digits + 1, '0');
  return `${sign}${padded.slice(0, -digits)}.${padded.slice(-digits)}`;
}
