import { randomUUID } from 'node:crypto';
import { asc, eq } from 'drizzle-orm';
import type { Publication, PublicationInput, PublicationPatch } from '../../../shared/contracts/publications';
import type { DbOrTx } from '../../platform/db/client';
import { publication } from './publication-schema';
import type { PlatformDeps } from '../../platform/deps';
import { Conflict, NotFound, Unprocessable } from '../../platform/http/errors';
import { pageTemplates } from '../print/index';
import { user as userTable } from '../../platform/auth/schema';
import { demoAccounts } from '../accounts/index';
import { assignPrinterToAll, printersOf } from './printers';

type Row = typeof publication.$inferSelect;

export function toPublication(db: DbOrTx, r: Row): Publication {
  return {
    id: r.id,
    printers: printersOf(db, r.id),
    title: r.title,
    publisher: r.publisher,
    templateId: r.templateId,
    cadence: r.cadence,
    solutionRule: r.solutionRule,
    reuseWindowDays: r.reuseWindowDays,
    currency: r.currency,
    feeAssemblyMinor: r.feeAssemblyMinor,
    feeDeductionMinor: r.feeDeductionMinor,
    createdAt: r.createdAt.toISOString(),
    updatedAt: r.updatedAt.toISOString(),
  };
}

function checkTemplate(templateId: string | undefined) {
  if (templateId === undefined) return;
  if (!pageTemplates().has(templateId)) {
    throw new Unprocessable(`There is no page template "${templateId}".`, [
      { path: 'body.templateId', message: `must be one of ${[...pageTemplates().keys()].join(', ')}` },
    ]);
  }
}

export function listPublications(db: DbOrTx): Publication[] {
  return db.select().from(publication).orderBy(asc(publication.title)).all().map((r) => toPublication(db, r));
}

export function getPublicationRow(db: DbOrTx, id: string): Row {
  const row = db.select().from(publication).where(eq(publication.id, id)).get();
  if (!row) throw new NotFound(`No publication ${id}.`);
  return row;
}

function titleTaken(db: DbOrTx, title: string, exceptId?: string): boolean {
  const row = db.select({ id: publication.id }).from(publication).where(eq(publication.title, title)).get();
  return row !== undefined && row.id !== exceptId;
}

export function createPublication(deps: Pick<PlatformDeps, 'db' | 'clock'>, input: PublicationInput): Publication {
  checkTemplate(input.templateId);
  return deps.db.transaction((tx) => {
    if (titleTaken(tx, input.title)) throw new Conflict(`A publication called "${input.title}" exists already.`, [{ path: 'body.title', message: 'is taken' }]);
    const now = deps.clock.now();
    const row = tx
      .insert(publication)
      .values({ id: randomUUID(), ...input, createdAt: now, updatedAt: now })
      .returning()
      .get();
    return toPublication(tx, row);
  });
}

export function updatePublication(deps: Pick<PlatformDeps, 'db' | 'clock'>, id: string, patch: PublicationPatch): Publication {
  checkTemplate(patch.templateId);
  return deps.db.transaction((tx) => {
    getPublicationRow(tx, id);
    if (patch.title !== undefined && titleTaken(tx, patch.title, id)) throw new Conflict(`A publication called "${patch.title}" exists already.`, [{ path: 'body.title', message: 'is taken' }]);
    const row = tx
      .update(publication)
      .set({ ...patch, updatedAt: deps.clock.now() })
      .where(eq(publication.id, id))
      .returning()
      .get();
    if (!row) throw new NotFound(`No publication ${id}.`);
    return toPublication(tx, row);
  });
}

/** The fee for one printed puzzle of a kind, in the publication's currency (minor units). */
export function feeFor(p: Pick<Row, 'feeAssemblyMinor' | 'feeDeductionMinor' | 'currency'>, kind: 'assembly' | 'deduction'): { amountMinor: number; currency: string } {
  return { amountMinor: kind === 'assembly' ? p.feeAssemblyMinor : p.feeDeductionMinor, currency: p.currency };
}

/** Demo data: the two publications of Larkspur & Quill Press (our fictional publisher). */
export const demoPublications: PublicationInput[] = [
  {
    title: 'The Saturday Quadrant',
    publisher: 'Larkspur & Quill Press',
    templateId: 'newspaper-column',
    cadence: 'weekly',
    solutionRule: 'next_edition',
    reuseWindowDays: 180,
    currency: 'GBP',
    feeAssemblyMinor: 4000,
    feeDeductionMinor: 5500,
  },
  {
    title: 'Squared Away Monthly',
    publisher: 'Larkspur & Quill Press',
    templateId: 'a4',
    cadence: 'monthly',
    solutionRule: 'same_edition',
    reuseWindowDays: 365,
    currency: 'GBP',
    feeAssemblyMinor: 6000,
    feeDeductionMinor: 7500,
  },
];

export function seedDemoPublications(deps: Pick<PlatformDeps, 'db' | 'clock'>): void {
  for (const p of demoPublications) {
    if (!titleTaken(deps.db, p.title)) createPublication(deps, p);
  }
  // the demo printer prints both publications
  const printer = demoAccounts.find((a) => a.role === 'printer');
  const row = printer ? deps.db.select({ id: userTable.id }).from(userTable).where(eq(userTable.email, printer.email)).get() : undefined;
  if (row) assignPrinterToAll(deps.db, row.id);
}
