import { z } from 'zod';
import { amountMinorSchema, currencySchema, toDecimalString } from './ledger';
import { templateIdSchema } from './templates';

// Publications: a title (weekly column, monthly magazine, book) with its page template,
// cadence, solution rule, reuse window and fee rates (read by payouts).

export const cadences = ['weekly', 'fortnightly', 'monthly', 'quarterly', 'irregular'] as const;
export const cadenceSchema = z.enum(cadences, { error: `cadence must be one of ${cadences.join(', ')}` });
export type Cadence = z.infer<typeof cadenceSchema>;

export const solutionRules = ['same_edition', 'next_edition'] as const;
export const solutionRuleSchema = z.enum(solutionRules, { error: 'solution rule must be same_edition or next_edition' });
export type SolutionRule = z.infer<typeof solutionRuleSchema>;

const feeSchema = amountMinorSchema.min(0, 'a fee must not be negative');

export const publicationInputSchema = z
  .object({
    title: z.string({ error: 'title is required' }).trim().min(1, 'title must not be empty').max(120, 'title may be at most 120 characters'),
    publisher: z.string().trim().min(1, 'publisher must not be empty').max(120),
    templateId: templateIdSchema,
    cadence: cadenceSchema,
    solutionRule: solutionRuleSchema,
    reuseWindowDays: z.number({ error: 'reuse window must be a number of days' }).int('reuse window must be whole days').min(0, 'reuse window must not be negative').max(3650, 'reuse window may be at most 3650 days'),
    currency: currencySchema,
    feeAssemblyMinor: feeSchema,
    feeDeductionMinor: feeSchema,
  })
  .strict();
export type PublicationInput = z.infer<typeof publicationInputSchema>;

export const publicationPatchSchema = publicationInputSchema.partial().strict().refine((p) => Object.keys(p).length > 0, 'send at least one field to change');
export type PublicationPatch = z.infer<typeof publicationPatchSchema>;

/** A printer assigned to a publication: sees, downloads and decides its proofs, gets its proof mail. */
export const publicationPrinterSchema = z.object({ id: z.string(), name: z.string(), email: z.string() });
export type PublicationPrinter = z.infer<typeof publicationPrinterSchema>;

/** PUT /api/publications/:id/printers: the whole list (an empty list leaves the publication without printers). */
export const publicationPrintersInputSchema = z
  .object({ userIds: z.array(z.string().min(1).max(100), { error: 'userIds must be a list of user ids' }).max(50, 'at most 50 printers') })
  .strict();
export type PublicationPrintersInput = z.infer<typeof publicationPrintersInputSchema>;
export const publicationPrintersSchema = z.object({ items: z.array(publicationPrinterSchema) });
/** GET /api/publications/:id/printers: the assigned printers and every active printer who could be. */
export const publicationPrinterChoicesSchema = z.object({ items: z.array(publicationPrinterSchema), candidates: z.array(publicationPrinterSchema) });
export type PublicationPrinterChoices = z.infer<typeof publicationPrinterChoicesSchema>;

export const publicationSchema = publicationInputSchema.extend({
  id: z.string(),
  /** the printers assigned to it */
  printers: z.array(publicationPrinterSchema),
  createdAt: z.string(),
  updatedAt: z.string(),
});
export type Publication = z.infer<typeof publicationSchema>;

export const publicationListSchema = z.object({ items: z.array(publicationSchema) });
export type PublicationList = z.infer<typeof publicationListSchema>;

export const publicationIdParamsSchema = z.object({ id: z.string().min(1).max(100) });

/** A fee in minor units for display: formatFee(150, 'GBP') -> "1.50 GBP" (exact, via the ledger's formatter). */
export function formatFee(minor: number, currency: string): string {
  return `${toDecimalString(minor, currency)} ${currency}`;
}
