import { and, desc, eq, lt } from 'drizzle-orm';
import type { RichTextDoc } from '../../../shared/contracts/editions';
import type { DbOrTx } from '../../platform/db/client';
import { Unprocessable } from '../../platform/http/errors';
import { getPageTemplate, type EditionDocument, type PuzzlePrint, type SolutionPrint } from '../print/index';
import { getEditionRow, type EditionRow } from './editions';
import { edition } from './schema';
import type { EditionsDeps, PuzzleForPrint } from './ports';
import { pressSettingsFor } from './press-spec';
import { getPublicationRow } from './publications';
import { apiPuzzleId, slotPuzzle, slotsOf } from './slots';
import { instructionsOf, introductionOf } from './stored-json';

// An edition as print reads it: the EditionDocument the renderer lays out (introduction,
// puzzles in slot order, solutions by the publication's rule), loaded from the database
// and the puzzle store, with the slots whose puzzle could not be found.

export function toPuzzlePrint(p: PuzzleForPrint, slot: number, instructions: RichTextDoc): PuzzlePrint {
  if (p.kind === 'assembly') {
    const a = p.assembly ?? { frame: { W: p.solution.tiling.W, H: p.solution.tiling.H }, pieces: p.solution.tiling.squares.map((q) => q.s), starters: [] };
    return { slot, kind: 'assembly', title: p.title, instructions, grade: p.grade, frame: a.frame, pieces: a.pieces, starters: a.starters };
  }
  const d = p.deduction ?? { layout: { W: p.solution.tiling.W, H: p.solution.tiling.H, rects: p.solution.tiling.squares.map((q) => ({ x: q.x, y: q.y, w: q.s, h: q.s })) }, givens: [] };
  return { slot, kind: 'deduction', title: p.title, instructions, grade: p.grade, layout: d.layout, givens: d.givens };
}

export function toSolutionPrint(p: PuzzleForPrint, slot: number, caption?: string): SolutionPrint {
  return { slot, ...(caption === undefined ? {} : { caption }), kind: p.kind, tiling: p.solution.tiling, steps: p.kind === 'deduction' ? p.solution.steps : undefined };
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

export type LoadedEdition = {
  doc: EditionDocument;
  /** slots whose puzzle the store cannot give (API puzzle ids) */
  missing: { slot: number; puzzleId: string }[];
  puzzles: { slot: number; puzzle: PuzzleForPrint }[];
};

/** Loads the print document of an edition from the database and the puzzle store; solutions follow the publication's rule. */
export function loadEditionDocument(deps: Pick<EditionsDeps, 'db' | 'puzzles'>, id: string): LoadedEdition {
  const db = deps.db;
  const r = getEditionRow(db, id);
  const pub = getPublicationRow(db, r.publicationId);
  const template = getPageTemplate(pub.templateId);
  if (!template) throw new Unprocessable(`The publication's page template "${pub.templateId}" is not installed.`);
  const source = deps.puzzles;
  const missing: LoadedEdition['missing'] = [];
  const puzzles: LoadedEdition['puzzles'] = [];
  const prints: PuzzlePrint[] = [];
  for (const s of slotsOf(db, id)) {
    const p = slotPuzzle(source, db, s);
    if (!p) {
      missing.push({ slot: s.position, puzzleId: apiPuzzleId(s.puzzleId) });
      continue;
    }
    puzzles.push({ slot: s.position, puzzle: p });
    prints.push(toPuzzlePrint(p, s.position, instructionsOf(s)));
  }
  let solutions: SolutionPrint[] = [];
  if (pub.solutionRule === 'same_edition') {
    solutions = puzzles.map(({ slot, puzzle }) => toSolutionPrint(puzzle, slot));
  } else {
    const prev = previousEdition(db, r);
    if (prev) {
      for (const s of slotsOf(db, prev.id)) {
        const p = slotPuzzle(source, db, s);
        if (p) solutions.push(toSolutionPrint(p, s.position, `No. ${prev.number}, puzzle ${s.position}`));
      }
    }
  }
  return {
    doc: { publicationTitle: pub.title, editionNumber: r.number, editionDate: r.editionDate, template, press: pressSettingsFor(pub), introduction: introductionOf(r), puzzles: prints, solutions },
    missing,
    puzzles,
  };
}
