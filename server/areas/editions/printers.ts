import { and, asc, eq, inArray, isNull, or } from 'drizzle-orm';
import type { SessionUser } from '../../../shared/contracts/auth';
import type { PublicationPrinter } from '../../../shared/contracts/publications';
import { user as userTable } from '../../platform/auth/schema';
import type { DbOrTx } from '../../platform/db/client';
import type { PlatformDeps } from '../../platform/deps';
import { NotFound, Unprocessable } from '../../platform/http/errors';
import { publication, publicationPrinter } from './publication-schema';
import { editionProof } from './schema';

// Printers per publication: an admin assigns printers to a publication; a printer sees,
// downloads and decides the proofs of those publications only (every route asks
// printerMaySee), and the proof mail goes to them only. To any other printer an edition
// does not exist (404, the same answer as for an unknown id).

const active = or(isNull(userTable.banned), eq(userTable.banned, false));

/** The active printers assigned to a publication (who gets its proof mail). */
export function printersOf(db: DbOrTx, publicationId: string): PublicationPrinter[] {
  return db
    .select({ id: userTable.id, name: userTable.name, email: userTable.email })
    .from(publicationPrinter)
    .innerJoin(userTable, eq(userTable.id, publicationPrinter.userId))
    .where(and(eq(publicationPrinter.publicationId, publicationId), eq(userTable.role, 'printer'), active))
    .orderBy(asc(userTable.name))
    .all();
}

/** Every active printer (who could be assigned). */
export function activePrinters(db: DbOrTx): PublicationPrinter[] {
  return db.select({ id: userTable.id, name: userTable.name, email: userTable.email }).from(userTable).where(and(eq(userTable.role, 'printer'), active)).orderBy(asc(userTable.name)).all();
}

/** The publications a printer is assigned to. */
export function publicationsOfPrinter(db: DbOrTx, userId: string): Set<string> {
  return new Set(
    db
      .select({ id: publicationPrinter.publicationId })
      .from(publicationPrinter)
      .where(eq(publicationPrinter.userId, userId))
      .all()
      .map((r) => r.id),
  );
}

/** Whether a printer may see an edition: it has been sent to proof, and the printer is one of its publication's. */
export function printerMaySee(db: DbOrTx, who: Pick<SessionUser, 'id'>, e: { id: string; publicationId: string }): boolean {
  const assigned = db
    .select({ u: publicationPrinter.userId })
    .from(publicationPrinter)
    .where(and(eq(publicationPrinter.publicationId, e.publicationId), eq(publicationPrinter.userId, who.id)))
    .get();
  if (!assigned) return false;
  return db.select({ id: editionProof.id }).from(editionProof).where(eq(editionProof.editionId, e.id)).limit(1).get() !== undefined;
}

/** Throws 404 (as for an unknown id) when the user is a printer who may not see the edition. */
export function requirePrinterMaySee(db: DbOrTx, who: Pick<SessionUser, 'id' | 'role'>, e: { id: string; publicationId: string }): void {
  if (who.role === 'printer' && !printerMaySee(db, who, e)) throw new NotFound(`No edition ${e.id}.`);
}

/** Replaces a publication's printers (admin); every id must be an active printer. */
export function setPublicationPrinters(deps: Pick<PlatformDeps, 'db'>, publicationId: string, userIds: string[]): PublicationPrinter[] {
  return deps.db.transaction((tx) => {
    if (!tx.select({ id: publication.id }).from(publication).where(eq(publication.id, publicationId)).get()) throw new NotFound(`No publication ${publicationId}.`);
    const wanted = [...new Set(userIds)];
    const found =
      wanted.length === 0
        ? []
        : tx
            .select({ id: userTable.id })
            .from(userTable)
            .where(and(inArray(userTable.id, wanted), eq(userTable.role, 'printer'), active))
            .all();
    const ok = new Set(found.map((u) => u.id));
    const bad = wanted.map((id, i) => ({ id, i })).filter(({ id }) => !ok.has(id));
    if (bad.length > 0) throw new Unprocessable(`${bad.length} of the users are not active printers.`, bad.map(({ id, i }) => ({ path: `body.userIds.${i}`, message: `${id} is not an active printer` })));
    tx.delete(publicationPrinter).where(eq(publicationPrinter.publicationId, publicationId)).run();
    if (wanted.length > 0) tx.insert(publicationPrinter).values(wanted.map((userId) => ({ publicationId, userId }))).run();
    return printersOf(tx, publicationId);
  });
}

/** Demo data: the demo printer prints both publications of Larkspur & Quill Press. */
export function assignPrinterToAll(db: DbOrTx, userId: string): void {
  const pubs = db.select({ id: publication.id }).from(publication).all();
  if (pubs.length === 0) return;
  db.insert(publicationPrinter)
    .values(pubs.map((p) => ({ publicationId: p.id, userId })))
    .onConflictDoNothing()
    .run();
}
