import { randomUUID } from 'node:crypto';
import { and, asc, desc, eq, inArray, like, lt, ne } from 'drizzle-orm';
import type { SessionUser } from '../../../shared/contracts/auth';
import {
  emptyRichText,
  richTextDocSchema,
  type Edition,
  type EditionCheck,
  type EditionChecks,
  type EditionCreate,
  type EditionListQuery,
  type EditionPatch,
  type EditionState,
  type EditionSummary,
  type PreflightReport,
  type PrinterEdition,
  type Proof,
  type RichTextDoc,
} from '../../../shared/contracts/editions';
import type { DbOrTx } from '../../platform/db/client';
import { user as userTable } from '../../platform/auth/schema';
import { edition, editionProof, editionSlot } from './schema';
import { publication } from './publication-schema';
import { Conflict, NotFound, Unprocessable } from '../../platform/http/errors';
import { getPageTemplate, renderEditionPdf, type EditionDocument, type PuzzlePrint, type SolutionPrint } from '../print/index';
import type { EditionUsage } from '../puzzles/ports';
import type { EditionsDeps, PuzzleForPrint } from './ports';
import { getPublicationRow } from './publications';

// Editions: dated issues of a publication with slots for puzzles, an introduction, and
// the state machine draft -> in_proof -> approved -> published (a returned proof goes back
// to draft). The proof round itself lives in services/proofs.ts.

// ---- reading ------------------------------------------------------------------------------

type EditionRow = typeof edition.$inferSelect;

function parseRich(json: string): RichTextDoc {
  try {
    const r = richTextDocSchema.safeParse(JSON.parse(json));
    return r.success ? r.data : emptyRichText();
  } catch {
    return emptyRichText();
  }
}

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
    preflight: JSON.parse(r.preflightJson) as PreflightReport,
  }));
}

function pressFileOf(r: EditionRow) {
  if (r.pressVersion === null || r.pressSha256 === null || r.pressBytes === null || r.pressPages === null || r.pressCreatedAt === null) return null;
  return { version: r.pressVersion, sha256: r.pressSha256, bytes: r.pressBytes, pages: r.pressPages, createdAt: r.pressCreatedAt.toISOString() };
}

function slotsOf(db: DbOrTx, editionId: string) {
  return db.select().from(editionSlot).where(eq(editionSlot.editionId, editionId)).orderBy(asc(editionSlot.position)).all();
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
    introduction: parseRich(r.introductionJson),
    slots: slotsOf(db, r.id).map((s) => {
      const p = source.getPuzzleForPrint(db, s.puzzleId);
      return {
        position: s.position,
        puzzleId: s.puzzleId,
        instructions: parseRich(s.instructionsJson),
        puzzle: p ? { kind: p.kind, title: p.title, grade: p.grade, size: sizeText(p), certificateCurrent: p.certificate?.current ?? false } : null,
      };
    }),
    returnNotes: r.returnNotes,
    proofs: proofsOf(db, r.id),
    pressFile: pressFileOf(r),
    publishedAt: r.publishedAt ? r.publishedAt.toISOString() : null,
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

/** A printer sees an edition only once it has been sent to proof. */
export function visibleToPrinter(db: DbOrTx, editionId: string): boolean {
  return db.select({ id: editionProof.id }).from(editionProof).where(eq(editionProof.editionId, editionId)).limit(1).get() !== undefined;
}

export function getEditionFor(deps: Pick<EditionsDeps, 'db' | 'puzzles'>, who: SessionUser, id: string): Edition | PrinterEdition {
  const row = getEditionRow(deps.db, id);
  if (who.role === 'printer') {
    if (!visibleToPrinter(deps.db, id)) throw new NotFound(`No edition ${id}.`);
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
  for (const { e, title } of rows) {
    const latest = db.select().from(editionProof).where(eq(editionProof.editionId, e.id)).orderBy(desc(editionProof.version)).limit(1).get();
    if (who.role === 'printer' && !latest) continue;
    const pf = latest ? (JSON.parse(latest.preflightJson) as PreflightReport) : null;
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
      .where(inArray(editionSlot.puzzleId, puzzleIds.map(String)))
      .orderBy(asc(edition.editionDate), asc(edition.number))
      .all()
      .map((r) => ({ ...r, puzzleId: Number(r.puzzleId) }));
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
        state: 'draft',
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

export function requireState(r: EditionRow, allowed: EditionState, doing: string): void {
  if (r.state !== allowed) {
    throw new Conflict(`Cannot ${doing}: edition No. ${r.number} is ${r.state.replace('_', ' ')}, and this needs it to be ${allowed.replace('_', ' ')}.`, { state: r.state, needed: allowed });
  }
}

export function updateEdition(deps: Pick<EditionsDeps, 'db' | 'clock' | 'puzzles'>, id: string, patch: EditionPatch): Edition {
  const source = deps.puzzles;
  const row = deps.db.transaction((tx) => {
    const r = getEditionRow(tx, id);
    requireState(r, 'draft', 'change the edition');
    if (patch.number !== undefined && numberTaken(tx, r.publicationId, patch.number, id)) {
      throw new Conflict(`This publication already has an edition No. ${patch.number}.`, [{ path: 'body.number', message: 'is taken' }]);
    }
    if (patch.slots) {
      const missing = patch.slots
        .map((s, i) => ({ i, id: s.puzzleId, found: source.getPuzzleForPrint(tx, s.puzzleId) !== null }))
        .filter((x) => !x.found)
        .map((x) => ({ path: `body.slots.${x.i}.puzzleId`, message: `no puzzle ${x.id}` }));
      if (missing.length > 0) throw new Unprocessable(`${missing.length} slot(s) name a puzzle that does not exist.`, missing);
      tx.delete(editionSlot).where(eq(editionSlot.editionId, id)).run();
      patch.slots.forEach((s, i) => {
        tx.insert(editionSlot).values({ editionId: id, position: i + 1, puzzleId: s.puzzleId, instructionsJson: JSON.stringify(s.instructions) }).run();
      });
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

// ---- the print document and the checks before proof -----------------------------------

function toPuzzlePrint(p: PuzzleForPrint, slot: number, instructions: RichTextDoc): PuzzlePrint {
  if (p.kind === 'assembly') {
    const a = p.assembly ?? { frame: { W: p.solution.tiling.W, H: p.solution.tiling.H }, pieces: p.solution.tiling.squares.map((q) => q.s), starters: [] };
    return { slot, kind: 'assembly', title: p.title, instructions, grade: p.grade, frame: a.frame, pieces: a.pieces, starters: a.starters };
  }
  const d = p.deduction ?? { layout: { W: p.solution.tiling.W, H: p.solution.tiling.H, rects: p.solution.tiling.squares.map((q) => ({ x: q.x, y: q.y, w: q.s, h: q.s })) }, givens: [] };
  return { slot, kind: 'deduction', title: p.title, instructions, grade: p.grade, layout: d.layout, givens: d.givens };
}

/** The edition just before this one in its publication (by number), if any. */
function previousEdition(db: DbOrTx, r: EditionRow): EditionRow | undefined {
  return db
    .select()
    .from(edition)
    .where(and(eq(edition.publicationId, r.publicationId), lt(edition.number, r.number)))
    .orderBy(desc(edition.number))
    .limit(1)
    .get();
}

export type BuiltDocument = { doc: EditionDocument; missing: { slot: number; puzzleId: string }[]; puzzles: { slot: number; puzzle: PuzzleForPrint }[] };

/** Builds the print document of an edition; solutions follow the publication's rule. */
export function buildEditionDocument(deps: Pick<EditionsDeps, 'db' | 'puzzles'>, id: string): BuiltDocument {
  const db = deps.db;
  const r = getEditionRow(db, id);
  const pub = getPublicationRow(db, r.publicationId);
  const template = getPageTemplate(pub.templateId);
  if (!template) throw new Unprocessable(`The publication's page template "${pub.templateId}" is not installed.`);
  const source = deps.puzzles;
  const missing: BuiltDocument['missing'] = [];
  const puzzles: BuiltDocument['puzzles'] = [];
  const prints: PuzzlePrint[] = [];
  for (const s of slotsOf(db, id)) {
    const p = source.getPuzzleForPrint(db, s.puzzleId);
    if (!p) {
      missing.push({ slot: s.position, puzzleId: s.puzzleId });
      continue;
    }
    puzzles.push({ slot: s.position, puzzle: p });
    prints.push(toPuzzlePrint(p, s.position, parseRich(s.instructionsJson)));
  }
  let solutions: SolutionPrint[] = [];
  if (pub.solutionRule === 'same_edition') {
    solutions = puzzles.map(({ slot, puzzle }) => ({ slot, kind: puzzle.kind, tiling: puzzle.solution.tiling, steps: puzzle.kind === 'deduction' ? puzzle.solution.steps : undefined }));
  } else {
    const prev = previousEdition(db, r);
    if (prev) {
      for (const s of slotsOf(db, prev.id)) {
        const p = source.getPuzzleForPrint(db, s.puzzleId);
        if (!p) continue;
        solutions.push({ slot: s.position, caption: `No. ${prev.number}, puzzle ${s.position}`, kind: p.kind, tiling: p.solution.tiling, steps: p.kind === 'deduction' ? p.solution.steps : undefined });
      }
    }
  }
  return {
    doc: { publicationTitle: pub.title, editionNumber: r.number, editionDate: r.editionDate, template, introduction: parseRich(r.introductionJson), puzzles: prints, solutions },
    missing,
    puzzles,
  };
}

const DAY_MS = 86_400_000;
const dayNumber = (iso: string) => Math.round(Date.parse(`${iso}T00:00:00Z`) / DAY_MS);

/**
 * The checks before proof: puzzles found, every puzzle with a current certificate, the
 * reuse guard (no tiling twice in the publication within its window), each solution
 * printed once (a puzzle in one edition of the publication only), fits the template
 * (slot count), legibility (the preflight of a rendered preview).
 */
export async function runEditionChecks(deps: Pick<EditionsDeps, 'db' | 'puzzles'>, id: string): Promise<EditionChecks> {
  const db = deps.db;
  const r = getEditionRow(db, id);
  const pub = getPublicationRow(db, r.publicationId);
  const built = buildEditionDocument(deps, id);
  const source = deps.puzzles;
  const checks: EditionCheck[] = [];
  const slotCount = built.puzzles.length + built.missing.length;

  // An edition without puzzles may still go out (an introduction, or the previous
  // edition's solutions); the check says so rather than blocking.
  checks.push({ code: 'has-slots', ok: true, message: slotCount > 0 ? `${slotCount} slot(s) filled.` : 'No puzzles yet: the proof will carry only the introduction and any solutions.' });
  for (const m of built.missing) checks.push({ code: 'puzzle-found', ok: false, slot: m.slot, message: `Slot ${m.slot}: puzzle ${m.puzzleId} cannot be found.` });

  for (const { slot, puzzle } of built.puzzles) {
    if (!puzzle.certificate) checks.push({ code: 'certificate', ok: false, slot, message: `Slot ${slot}: "${puzzle.title}" has no certificate of a unique solution.` });
    else if (!puzzle.certificate.current) checks.push({ code: 'certificate', ok: false, slot, message: `Slot ${slot}: the certificate of "${puzzle.title}" is out of date; prove it again.` });
  }
  if (built.puzzles.length > 0 && !checks.some((c) => c.code === 'certificate')) checks.push({ code: 'certificate', ok: true, message: 'Every puzzle has a current certificate.' });

  // Reuse guard, inside this edition and against the publication's other editions.
  const here = new Map<string, number>();
  let reuseOk = true;
  for (const { slot, puzzle } of built.puzzles) {
    const first = here.get(puzzle.tilingKey);
    if (first !== undefined) {
      reuseOk = false;
      checks.push({ code: 'reuse', ok: false, slot, message: `Slot ${slot} uses the same tiling as slot ${first}.` });
    } else here.set(puzzle.tilingKey, slot);
  }
  const others = db
    .select({ id: edition.id, number: edition.number, date: edition.editionDate })
    .from(edition)
    .where(and(eq(edition.publicationId, r.publicationId), ne(edition.id, id)))
    .all();
  const ownPuzzleIds = new Set(built.puzzles.map((p) => p.puzzle.id));
  let onceOk = true;
  for (const o of others) {
    const gap = Math.abs(dayNumber(o.date) - dayNumber(r.editionDate));
    for (const s of slotsOf(db, o.id)) {
      if (ownPuzzleIds.has(s.puzzleId)) {
        onceOk = false;
        checks.push({ code: 'solution-once', ok: false, message: `Puzzle ${s.puzzleId} is already in No. ${o.number}; its solution would be printed twice.` });
        continue;
      }
      if (gap >= pub.reuseWindowDays) continue;
      const p = source.getPuzzleForPrint(db, s.puzzleId);
      const slot = p ? here.get(p.tilingKey) : undefined;
      if (p && slot !== undefined) {
        reuseOk = false;
        checks.push({ code: 'reuse', ok: false, slot, message: `Slot ${slot}: its tiling was used in No. ${o.number} (${o.date}), ${gap} day(s) apart; the reuse window is ${pub.reuseWindowDays} days.` });
      }
    }
  }
  if (reuseOk) checks.push({ code: 'reuse', ok: true, message: `No tiling repeats within ${pub.reuseWindowDays} days in ${pub.title}.` });
  if (onceOk) checks.push({ code: 'solution-once', ok: true, message: pub.solutionRule === 'same_edition' ? 'Solutions print in this edition, once each.' : 'Solutions print in the next edition, once each.' });

  const max = built.doc.template.maxSlots;
  checks.push(
    slotCount <= max
      ? { code: 'fits-template', ok: true, message: `${slotCount} of at most ${max} puzzles for the ${built.doc.template.name} template.` }
      : { code: 'fits-template', ok: false, message: `${slotCount} puzzles, but the ${built.doc.template.name} template holds at most ${max}.` },
  );

  let preflight: PreflightReport | null = null;
  if (built.puzzles.length > 0 || built.doc.solutions.length > 0) {
    const rendered = await renderEditionPdf(built.doc, { stamp: null });
    preflight = rendered.preflight;
    const errors = preflight.warnings.filter((w) => w.code.startsWith('error:'));
    checks.push(
      errors.length === 0
        ? { code: 'legibility', ok: true, message: `Preflight passed (${preflight.pages} page(s), ${preflight.warnings.length} warning(s)).` }
        : { code: 'legibility', ok: false, message: `Preflight: ${errors.map((e) => e.message).join('; ')}` },
    );
  }
  return { ok: checks.every((c) => c.ok), checks, preflight };
}
