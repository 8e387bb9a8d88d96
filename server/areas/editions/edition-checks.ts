import { and, eq, ne } from 'drizzle-orm';
import type { EditionCheck, EditionChecks, PreflightReport } from '../../../shared/contracts/editions';
import { renderOnWorker } from '../print/index';
import { loadEditionDocument, type LoadedEdition } from './edition-document';
import { getEditionRow, type EditionRow } from './editions';
import type { EditionsDeps } from './ports';
import { renderOptionsFor } from './press-spec';
import { getPublicationRow } from './publications';
import { edition } from './schema';
import { apiPuzzleId, slotPuzzle, slotsOf } from './slots';

// The checks before proof. They read the edition's loaded print document and the preflight
// of its rendered PDF; the caller renders (sending a proof checks the very proof it stores,
// so an edition is rendered once per send).

const DAY_MS = 86_400_000;
const dayNumber = (iso: string) => Math.round(Date.parse(`${iso}T00:00:00Z`) / DAY_MS);

/** Whether the edition prints more than its introduction (only then is its preflight a check). */
export function printsPuzzlesOrSolutions(built: LoadedEdition): boolean {
  return built.puzzles.length > 0 || built.doc.solutions.length > 0;
}

/**
 * The checks before proof: puzzles found, every puzzle with a current certificate, the
 * reuse guard (no tiling twice in the publication within its window), each solution
 * printed once (a puzzle in one edition of the publication only), fits the template
 * (slot count), legibility (the preflight of the edition's rendered document, given by the
 * caller, who rendered it: null when nothing was rendered).
 */
export function checkEdition(deps: Pick<EditionsDeps, 'db' | 'puzzles'>, r: EditionRow, built: LoadedEdition, preflight: PreflightReport | null): EditionChecks {
  const db = deps.db;
  const id = r.id;
  const pub = getPublicationRow(db, r.publicationId);
  const source = deps.puzzles;
  const checks: EditionCheck[] = [];
  const slotCount = built.puzzles.length + built.missing.length;

  // A proof carries at least one puzzle (issue 16: an empty proof once went to the printer).
  checks.push(
    slotCount > 0
      ? { code: 'has-slots', ok: true, message: `${slotCount} slot(s) filled.` }
      : { code: 'has-slots', ok: false, message: 'No puzzles yet: add at least one puzzle (and save) before sending to proof.' },
  );
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
      const puzzleId = apiPuzzleId(s.puzzleId);
      if (ownPuzzleIds.has(puzzleId)) {
        onceOk = false;
        checks.push({ code: 'solution-once', ok: false, message: `Puzzle ${puzzleId} is already in No. ${o.number}; its solution would be printed twice.` });
        continue;
      }
      if (gap >= pub.reuseWindowDays) continue;
      const p = slotPuzzle(source, db, s);
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

  if (preflight !== null) checks.push(...preflightChecks(preflight));
  return { ok: checks.every((c) => c.ok), checks, preflight };
}

/** The preflight errors the editor may send past with a reason: the template's floors (smallest square, smallest digit). */
export const OVERRIDABLE_PREFLIGHT_ERRORS: ReadonlySet<string> = new Set(['error:square-small', 'error:digit-small']);
/** A floor reported as a plain warning (a preflight from before floors were errors) still breaks the floor. */
const FLOOR_WARNINGS: ReadonlySet<string> = new Set(['square-small', 'digit-small']);

/**
 * The preflight as checks: "passed" only when the report has no error at all; the
 * template's floors (overridable with a reason) and the other errors (fonts, page size, a
 * given that cannot be printed: never overridable) each make a failed check.
 */
export function preflightChecks(preflight: PreflightReport): EditionCheck[] {
  const errors = preflight.warnings
    .filter((w) => w.code.startsWith('error:') || FLOOR_WARNINGS.has(w.code))
    .map((w) => (w.code.startsWith('error:') ? w : { ...w, code: `error:${w.code}` }));
  const warnings = preflight.warnings.length - errors.length;
  if (errors.length === 0 && preflight.ok) {
    return [{ code: 'legibility', ok: true, message: `Preflight passed (${preflight.pages} page(s), ${warnings} warning(s)).` }];
  }
  const floors = errors.filter((e) => OVERRIDABLE_PREFLIGHT_ERRORS.has(e.code));
  const hard = errors.filter((e) => !OVERRIDABLE_PREFLIGHT_ERRORS.has(e.code));
  const out: EditionCheck[] = [];
  if (hard.length > 0 || (!preflight.ok && errors.length === 0)) {
    out.push({ code: 'legibility', ok: false, message: `Preflight failed: ${hard.length > 0 ? hard.map((e) => e.message).join('; ') : 'the report is not ok'}.` });
  }
  if (floors.length > 0) {
    out.push({ code: 'legibility', ok: false, overridable: true, message: `Preflight failed the template's minimums: ${floors.map((e) => e.message).join('; ')}.` });
  }
  return out;
}

/** The checks as the editor asks for them (GET /api/editions/:id/checks): renders an unstamped preview for the preflight when there is something to print. */
export async function runEditionChecks(deps: Pick<EditionsDeps, 'db' | 'puzzles' | 'jobs'>, id: string): Promise<EditionChecks> {
  const r = getEditionRow(deps.db, id);
  const built = loadEditionDocument(deps, id);
  const preflight = printsPuzzlesOrSolutions(built) ? (await renderOnWorker(deps.jobs, built.doc, renderOptionsFor(deps.db, built.doc, { stamp: null }))).preflight : null;
  return checkEdition(deps, r, built, preflight);
}
