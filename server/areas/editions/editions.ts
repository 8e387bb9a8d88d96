import { randomUUID } from 'node:crypto';
import { and, asc, desc, eq, inArray, like } from 'drizzle-orm';
import type { SessionUser } from '../../../shared/contracts/auth';
import {
  emptyRichText,
  type Edition,
  type EditionCreate,
  type EditionListQuery,
  type EditionPatch,
  type EditionOverride,
  type EditionSummary,
  type PrinterEdition,
  type Proof,
} from '../../../shared/contracts/editions';
import type { DbOrTx } from '../../platform/db/client';
import { user as userTable } from '../../platform/auth/schema';
import { edition, editionOverride, editionProof, editionSlot } from './schema';
import { publication } from './publication-schema';
import { Conflict, NotFound, Unprocessable } from '../../platform/http/errors';
import type { EditionUsage } from '../puzzles/ports';
import { initialEditionState, requireEditable } from './edition-states';
import type { EditionsDeps, PuzzleForPrint } from './ports';
import { publicationsOfPrinter, requirePrinterMaySee } from './printers';
import { getPublicationRow } from './publications';
import { apiPuzzleId, slotPuzzle, slotRowsFor, slotsOf } from './slots';
import { instructionsOf, introductionOf, preflightOf } from './stored-json';

// Editions: dated issues of a publication with slots for puzzles and an introduction; read,
// listed, created and changed (drafts only) here. Their states and moves live in
// ./edition-states.ts, the print document in ./edition-document.ts, the checks before
// proof in ./edition-checks.ts and the proof round in ./proofs.ts (each imports only the
// ones before it).

// ---- reading ------------------------------------------------------------------------------

export type EditionRow = typeof edition.$inferSelect;

export function getEditionRow(db: DbOrTx, id: string): EditionRow {
  const row = db.select().from(edition).where(eq(edition.id, id)).get();
  if (!row) throw new NotFound(`No edition ${id}.`);
  return row;
}

function names(db: DbOrTx, ids: (string | null)[]): Map<string, string> {
  const wanted = [...new Set(ids.filter((x): x is string => x !== null))];
  if (wanted.length === 0) return new Map();
  return new Map(db.select({ id: userTable.id, name: userTable.name }).from(userTable).where(inArray(userTable.id, wanted)).all().map((u) => [u.id, u.name]));
}

export function proofsOf(db: DbOrTx, editionId: string): Proof[] {
  const rows = db.select().from(editionProof).where(eq(editionProof.editionId, editionId)).orderBy(asc(editionProof.version)).all();
  const who = names(db, rows.flatMap((r) => [r.createdBy, r.decidedBy]));
  return rows.map((r) => ({
    version: r.version,
    sha256: r.sha256,
    bytes: r.bytes,
    pages: r.pages,
    status: r.status,
    notes: r.notes,
    createdAt: r.createdAt.toISOString(),
    createdByName: r.createdBy ? (who.get(r.createdBy) ?? null) : null,
    decidedAt: r.decidedAt ? r.decidedAt.toISOString() : null,
    decidedByName: r.decidedBy ? (who.get(r.decidedBy) ?? null) : null,
    preflight: preflightOf(r),
  }));
}

export function overridesOf(db: DbOrTx, editionId: string): EditionOverride[] {
  const rows = db.select().from(editionOverride).where(eq(editionOverride.editionId, editionId)).orderBy(asc(editionOverride.createdAt), asc(editionOverride.id)).all();
  const who = names(db, rows.map((r) => r.createdBy));
  return rows.map((r) => ({
    kind: r.kind,
    reason: r.reason,
    refused: r.refused,
    proofVersion: r.proofVersion,
    byName: r.createdBy ? (who.get(r.createdBy) ?? null) : null,
    at: r.createdAt.toISOString(),
  }));
}

function pressFileOf(r: EditionRow) {
  if (r.pressVersion === null || r.pressSha256 === null || r.pressBytes === null || r.pressPages === null || r.pressCreatedAt === null) return null;
  return { version: r.pressVersion, sha256: r.pressSha256, bytes: r.pressBytes, pages: r.pressPages, createdAt: r.pressCreatedAt.toISOString() };
}

function sizeText(p: PuzzleForPrint): string {
  if (p.assembly) return `${p.assembly.frame.W} x ${p.assembly.frame.H}`;
  return `${p.solution.tiling.W} x ${p.solution.tiling.H}`;
}

export function toEdition(deps: Pick<EditionsDeps, 'db' | 'puzzles'>, r: EditionRow): Edition {
  const db = deps.db;
  const pub = getPublicationRow(db, r.publicationId);
  const source = deps.puzzles;
  return {
    id: r.id,
    publicationId: r.publicationId,
    publicationTitle: pub.title,
    templateId: pub.templateId,
    number: r.number,
    date: r.editionDate,
    state: r.state,
    introduction: introductionOf(r),
    slots: slotsOf(db, r.id).map((s) => {
      const p = slotPuzzle(source, db, s);
      return {
        position: s.position,
        puzzleId: apiPuzzleId(s.puzzleId),
        instructions: instructionsOf(s),
        puzzle: p ? { kind: p.kind, title: p.title, grade: p.grade, size: sizeText(p), certificateCurrent: p.certificate?.current ?? false } : null,
      };
    }),
    returnNotes: r.returnNotes,
    proofs: proofsOf(db, r.id),
    pressFile: pressFileOf(r),
    publishedAt: r.publishedAt ? r.publishedAt.toISOString() : null,
    overrides: overridesOf(db, r.id),
    createdAt: r.createdAt.toISOString(),
    updatedAt: r.updatedAt.toISOString(),
  };
}

export function toPrinterEdition(db: DbOrTx, r: EditionRow): PrinterEdition {
  const pub = getPublicationRow(db, r.publicationId);
  return {
    id: r.id,
    publicationTitle: pub.title,
    templateId: pub.templateId,
    number: r.number,
    date: r.editionDate,
    state: r.state,
    proofs: proofsOf(db, r.id),
    pressFile: pressFileOf(r),
  };
}


export function getEditionFor(deps: Pick<EditionsDeps, 'db' | 'puzzles'>, who: SessionUser, id: string): Edition | PrinterEdition {
  const row = getEditionRow(deps.db, id);
  if (who.role === 'printer') {
    // a printer sees an edition of their publications once it has been sent to proof (printers.ts)
    requirePrinterMaySee(deps.db, who, row);
    return toPrinterEdition(deps.db, row);
  }
  return toEdition(deps, row);
}

export function listEditions(deps: Pick<EditionsDeps, 'db'>, who: SessionUser, q: EditionListQuery): EditionSummary[] {
  const db = deps.db;
  const conds = [];
  if (q.month) conds.push(like(edition.editionDate, `${q.month}-%`));
  if (q.publicationId) conds.push(eq(edition.publicationId, q.publicationId));
  if (q.state) conds.push(eq(edition.state, q.state));
  const rows = db
    .select({ e: edition, title: publication.title })
    .from(edition)
    .innerJoin(publication, eq(publication.id, edition.publicationId))
    .where(conds.length > 0 ? and(...conds) : undefined)
    .orderBy(asc(edition.editionDate), asc(publication.title), asc(edition.number))
    .all();
  const out: EditionSummary[] = [];
  const printerOf = who.role === 'printer' ? publicationsOfPrinter(db, who.id) : null;
  for (const { e, title } of rows) {
    if (printerOf && !printerOf.has(e.publicationId)) continue;
    const latest = db.select().from(editionProof).where(eq(editionProof.editionId, e.id)).orderBy(desc(editionProof.version)).limit(1).get();
    if (who.role === 'printer' && !latest) continue;
    const pf = latest ? preflightOf(latest) : null;
    out.push({
      id: e.id,
      publicationId: e.publicationId,
      publicationTitle: title,
      number: e.number,
      date: e.editionDate,
      state: e.state,
      slotCount: who.role === 'printer' ? 0 : db.select({ id: editionSlot.id }).from(editionSlot).where(eq(editionSlot.editionId, e.id)).all().length,
      latestProofVersion: latest?.version ?? null,
      latestProofAt: latest ? latest.createdAt.toISOString() : null,
      latestProofPages: latest?.pages ?? null,
      latestProofStatus: latest?.status ?? null,
      latestPreflightOk: pf ? pf.ok : null,
      latestWarnings: pf ? pf.warnings.length : null,
      returnNotes: e.returnNotes,
      hasPressFile: e.pressVersion !== null,
    });
  }
  return out;
}

/** Where puzzles are printed (EditionUsage in ../puzzles/ports.ts): every slot holding one of them, oldest edition first. */
export const editionUsage: EditionUsage = {
  usesOf(db, puzzleIds) {
    if (puzzleIds.length === 0) return [];
    return db
      .select({ puzzleId: editionSlot.puzzleId, editionId: edition.id, number: edition.number, editionDate: edition.editionDate, state: edition.state, publicationTitle: publication.title })
      .from(editionSlot)
      .innerJoin(edition, eq(edition.id, editionSlot.editionId))
      .innerJoin(publication, eq(publication.id, edition.publicationId))
      .where(inArray(editionSlot.puzzleId, puzzleIds))
      .orderBy(asc(edition.editionDate), asc(edition.number))
      .all();
  },
};

// ---- writing --------------------------------------------------------------------------

function numberTaken(db: DbOrTx, publicationId: string, number: number, exceptId?: string): boolean {
  const row = db
    .select({ id: edition.id })
    .from(edition)
    .where(and(eq(edition.publicationId, publicationId), eq(edition.number, number)))
    .get();
  return row !== undefined && row.id !== exceptId;
}

export function createEdition(deps: Pick<EditionsDeps, 'db' | 'clock' | 'puzzles'>, who: SessionUser, input: EditionCreate): Edition {
  const row = deps.db.transaction((tx) => {
    getPublicationRow(tx, input.publicationId);
    if (numberTaken(tx, input.publicationId, input.number)) {
      throw new Conflict(`This publication already has an edition No. ${input.number}.`, [{ path: 'body.number', message: 'is taken' }]);
    }
    const now = deps.clock.now();
    return tx
      .insert(edition)
      .values({
        id: randomUUID(),
        publicationId: input.publicationId,
        number: input.number,
        editionDate: input.date,
        state: initialEditionState,
        introductionJson: JSON.stringify(input.introduction ?? emptyRichText()),
        createdBy: who.id,
        createdAt: now,
        updatedAt: now,
      })
      .returning()
      .get();
  });
  return toEdition(deps, row);
}

export function updateEdition(deps: Pick<EditionsDeps, 'db' | 'clock' | 'puzzles'>, id: string, patch: EditionPatch): Edition {
  const source = deps.puzzles;
  const row = deps.db.transaction((tx) => {
    const r = getEditionRow(tx, id);
    requireEditable(r);
    if (patch.number !== undefined && numberTaken(tx, r.publicationId, patch.number, id)) {
      throw new Conflict(`This publication already has an edition No. ${patch.number}.`, [{ path: 'body.number', message: 'is taken' }]);
    }
    if (patch.slots) {
      const slots = slotRowsFor(source, tx, id, patch.slots);
      if (!slots.ok) throw new Unprocessable(`${slots.missing.length} slot(s) name a puzzle that does not exist.`, slots.missing);
      tx.delete(editionSlot).where(eq(editionSlot.editionId, id)).run();
      if (slots.rows.length > 0) tx.insert(editionSlot).values(slots.rows).run();
    }
    const updated = tx
      .update(edition)
      .set({
        ...(patch.number !== undefined ? { number: patch.number } : {}),
        ...(patch.date !== undefined ? { editionDate: patch.date } : {}),
        ...(patch.introduction !== undefined ? { introductionJson: JSON.stringify(patch.introduction) } : {}),
        updatedAt: deps.clock.now(),
      })
      .where(eq(edition.id, id))
      .returning()
      .get();
    if (!updated) throw new NotFound(`No edition ${id}.`);
    return updated;
  });
  return toEdition(deps, row);
}

