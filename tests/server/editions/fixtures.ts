import { eq } from 'drizzle-orm';
import { setPublicationPrinters } from '../../../server/areas/editions/printers';
import { user } from '../../../server/platform/auth/schema';
import type { TestApp } from '../helpers/test-app';

// A publication for the editions tests: The Saturday Quadrant of Larkspur & Quill Press
// (our demo scenario), weekly, solutions in the same edition, fees in GBP minor units.
export const quadrantPublication = {
  title: 'The Saturday Quadrant',
  publisher: 'Larkspur & Quill Press',
  templateId: 'newspaper-column',
  cadence: 'weekly',
  solutionRule: 'same_edition',
  reuseWindowDays: 90,
  currency: 'GBP',
  feeAssemblyMinor: 4500,
  feeDeductionMinor: 6000,
} as const;

/** Assigns every printer to the publication: printers see only their publications' proofs (issue 17). */
export function assignPrinters(t: TestApp, publicationId: string): void {
  const ids = t.db.select({ id: user.id }).from(user).where(eq(user.role, 'printer')).all().map((r) => r.id);
  setPublicationPrinters(t.deps, publicationId, ids);
}
