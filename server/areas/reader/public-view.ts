import { and, asc, eq, inArray } from 'drizzle-orm';
import type { PublicEdition, PublicEditionList, PublicPuzzle, PublicPuzzleSummary, Play } from '../../../shared/contracts/reader';
import { readerPaths } from '../../../shared/contracts/reader';
import { squareLabel } from '../../../shared/puzzle/index';
import type { DbOrTx } from '../../platform/db/client';
import { NotFound } from '../../platform/http/errors';
import { edition, editionSlot, instructionsOf, introductionOf, publication } from '../editions/index';
import type { PuzzleForPrint } from '../editions/ports';
import { puzzle } from '../puzzles/index';
import type { ReaderDeps } from './ports';
import { editionsWithRelease, publicEditionsOf, type EditionWithRelease } from './published';
import { readerGrade } from './schema';
import { publicationBySlug, type PublicationForReader } from './settings';

// What readers see: a publication's public editions, one edition with its puzzles, one
// puzzle to play. Everything here is built from a whitelist of fields: no setter, fee,
// proof, stock id or certificate reaches a public answer. An address that is not public at
// this moment (unknown, unpublished, before its release) is one and the same NotFound.

/** The one answer for every address readers may not see (never says why). */
export const notPublic = () => new NotFound('There is no such page.');

export type PublicEditionContext = {
  pub: PublicationForReader;
  edition: EditionWithRelease;
  publisher: string;
};

export function findPublicEdition(deps: Pick<ReaderDeps, 'db' | 'clock'>, slug: string, number: number): PublicEditionContext {
  const pub = publicationBySlug(deps.db, slug);
  if (!pub) throw notPublic();
  const e = editionsWithRelease(deps.db, pub, deps.clock.now()).find((x) => x.number === number);
  if (!e || !e.release.public) throw notPublic();
  return { pub, edition: e, publisher: pub.publisher };
}

/** The grade readers see for each puzzle, with the editor's note (engine grade when not adjusted). */
export function shownGrades(db: DbOrTx, puzzleIds: number[]): Map<number, { grade: number | null; note: string }> {
  if (puzzleIds.length === 0) return new Map();
  return new Map(db.select({ id: readerGrade.puzzleId, grade: readerGrade.grade, note: readerGrade.note }).from(readerGrade).where(inArray(readerGrade.puzzleId, puzzleIds)).all().map((r) => [r.id, { grade: r.grade, note: r.note }]));
}

type Slot = { position: number; puzzleId: number; instructions: ReturnType<typeof instructionsOf>; puzzle: PuzzleForPrint };

function slotsWithPuzzles(deps: Pick<ReaderDeps, 'db' | 'puzzles'>, editionId: string): Slot[] {
  const rows = deps.db.select().from(editionSlot).where(eq(editionSlot.editionId, editionId)).orderBy(asc(editionSlot.position)).all();
  return rows.flatMap((s) => {
    const p = deps.puzzles.getPuzzleForPrint(deps.db, String(s.puzzleId));
    return p ? [{ position: s.position, puzzleId: s.puzzleId, instructions: instructionsOf(s), puzzle: p }] : [];
  });
}

function sizeText(p: PuzzleForPrint): string {
  if (p.assembly) return `${p.assembly.frame.W} \u00d7 ${p.assembly.frame.H}, ${p.assembly.pieces.length} pieces`;
  return `${p.solution.tiling.squares.length} squares`;
}

function summaryOf(ctx: PublicEditionContext, s: Slot, grades: Map<number, { grade: number | null; note: string }>): PublicPuzzleSummary {
  const g = grades.get(s.puzzleId);
  return {
    position: s.position,
    kind: s.puzzle.kind,
    title: s.puzzle.title,
    grade: g?.grade ?? s.puzzle.grade,
    gradeNote: g && g.grade !== null ? g.note : null,
    sizeText: sizeText(s.puzzle),
    instructions: s.instructions,
    path: readerPaths.puzzle(ctx.pub.slug, ctx.edition.number, s.position),
  };
}

function editionHead(ctx: PublicEditionContext) {
  const r = ctx.edition.release;
  return {
    publication: { slug: ctx.pub.slug, title: ctx.pub.title, publisher: ctx.publisher, timeZone: ctx.pub.timeZone },
    number: ctx.edition.number,
    date: ctx.edition.editionDate,
    solutionsPublic: r.solutionsPublic,
    solutionsFrom: r.solutionsFrom ? r.solutionsFrom.toISOString() : null,
    solutionRule: ctx.pub.solutionRule,
    path: readerPaths.edition(ctx.pub.slug, ctx.edition.number),
  };
}

export function publicEditionView(deps: Pick<ReaderDeps, 'db' | 'puzzles'>, ctx: PublicEditionContext): PublicEdition {
  const row = deps.db.select({ id: edition.id, introductionJson: edition.introductionJson }).from(edition).where(eq(edition.id, ctx.edition.id)).get();
  if (!row) throw notPublic();
  const slots = slotsWithPuzzles(deps, ctx.edition.id);
  const grades = shownGrades(deps.db, slots.map((s) => s.puzzleId));
  return {
    ...editionHead(ctx),
    releasedAt: ctx.edition.release.releasedAt.toISOString(),
    introduction: introductionOf(row),
    puzzles: slots.map((s) => summaryOf(ctx, s, grades)),
  };
}

export function publicEditionList(deps: Pick<ReaderDeps, 'db' | 'clock' | 'puzzles'>, slug: string): PublicEditionList {
  const pub = publicationBySlug(deps.db, slug);
  if (!pub) throw notPublic();
  const editions = publicEditionsOf(deps.db, pub, deps.clock.now());
  const publisher = deps.db.select({ publisher: publication.publisher }).from(publication).where(eq(publication.id, pub.id)).get()?.publisher ?? pub.publisher;
  return {
    publication: { slug: pub.slug, title: pub.title, publisher, timeZone: pub.timeZone },
    editions: editions.map((e) => ({
      number: e.number,
      date: e.editionDate,
      path: readerPaths.edition(pub.slug, e.number),
      puzzles: deps.db.select({ id: editionSlot.id }).from(editionSlot).where(eq(editionSlot.editionId, e.id)).all().length,
    })),
  };
}

/** The play data of a puzzle: what the printed page shows, never its solution. */
export function playOf(p: PuzzleForPrint, showFrame: boolean): Play {
  if (p.assembly) {
    const pieces = p.assembly.pieces;
    const used = new Set<number>();
    const starters = p.assembly.starters.flatMap((st) => {
      const piece = pieces.findIndex((s, i) => s === st.size && !used.has(i));
      if (piece < 0) return [];
      used.add(piece);
      return [{ piece, x: st.x, y: st.y }];
    });
    return { kind: 'assembly', frame: { W: p.assembly.frame.W, H: p.assembly.frame.H }, pieces, starters };
  }
  if (!p.deduction) throw new Error(`puzzle ${p.id} has neither an Assembly nor a Deduction view`);
  const layout = p.deduction.layout;
  return {
    kind: 'deduction',
    drawing: { W: layout.W, H: layout.H, rects: layout.rects.map((r) => ({ x: r.x, y: r.y, w: r.w, h: r.h })) },
    labels: layout.rects.map((_, i) => squareLabel(i)),
    givens: p.deduction.givens.map((g) => ({ square: g.rect, size: g.size })),
    frame: showFrame ? { W: p.solution.tiling.W, H: p.solution.tiling.H } : null,
  };
}

export type PublicPuzzleContext = PublicEditionContext & { slot: Slot; slots: Slot[] };

export function findPublicPuzzle(deps: Pick<ReaderDeps, 'db' | 'clock' | 'puzzles'>, slug: string, number: number, position: number): PublicPuzzleContext {
  const ctx = findPublicEdition(deps, slug, number);
  const slots = slotsWithPuzzles(deps, ctx.edition.id);
  const slot = slots.find((s) => s.position === position);
  if (!slot) throw notPublic();
  return { ...ctx, slot, slots };
}

export function publicPuzzleView(deps: Pick<ReaderDeps, 'db' | 'puzzles'>, ctx: PublicPuzzleContext): PublicPuzzle {
  const grades = shownGrades(deps.db, [ctx.slot.puzzleId]);
  const showFrame = deps.db.select({ showFrame: puzzle.showFrame }).from(puzzle).where(and(eq(puzzle.id, ctx.slot.puzzleId))).get()?.showFrame ?? false;
  const i = ctx.slots.indexOf(ctx.slot);
  const pathAt = (s: Slot | undefined) => (s ? readerPaths.puzzle(ctx.pub.slug, ctx.edition.number, s.position) : null);
  return {
    ...summaryOf(ctx, ctx.slot, grades),
    edition: editionHead(ctx),
    play: playOf(ctx.slot.puzzle, showFrame),
    previousPath: pathAt(ctx.slots[i - 1]),
    nextPath: pathAt(ctx.slots[i + 1]),
  };
}
