import { and, asc, desc, eq, inArray, sql } from 'drizzle-orm';
import type { Calibration, CalibrationPoint, FormulaChange, GradeSolveStats, PuzzleSolveStats, SolveStats } from '../../../shared/contracts/reader';
import { readerPaths } from '../../../shared/contracts/reader';
import { evaluateDeduction, gradePoints } from '../../../shared/puzzle/index';
import type { DbOrTx } from '../../platform/db/client';
import { edition, editionSlot, publication } from '../editions/index';
import type { PuzzleForPrint } from '../editions/ports';
import { levelOf, puzzle } from '../puzzles/index';
import type { ReaderDeps } from './ports';
import { editionsWithRelease } from './published';
import { shownGrades } from './public-view';
import { solveEvent } from './schema';
import { publicationsForReader } from './settings';
import { monotoneGradeFit, quartiles, spearman } from './solve-math';

// The editor's view of the readers' solves: per puzzle and per grade, and the calibration of
// the engine's grade against readers' times (decision 081).
//
// A play is one reader's go at one puzzle (one random play id). It started when any event
// arrived; it finished with a `finished` event; it was solved when it finished and revealed
// nothing. Solve times are the finished, unrevealed plays' times played (pauses excluded).

/** A puzzle counts in the calibration once this many readers solved it without a reveal (our choice). */
export const MIN_SOLVED_FOR_CALIBRATION = 5;

/** Lowest score of grades 2, 3, 4 and 5 in the engine's formulas today. */
export const CURRENT_CUTS = {
  // shared/puzzle/deduction-grade.ts: grade = 1 + floor(points), so grade g from g - 1 points
  deduction: [1, 2, 3, 4],
  // server/areas/puzzles/rules.ts assemblyGrade (decision 070): pieces <= 11: 1, <= 14: 2, <= 18: 3, <= 22: 4, else 5
  assembly: [12, 15, 19, 23],
} as const;

type Slot = {
  puzzleId: number;
  editionId: string;
  publicationId: string;
  publicationTitle: string;
  number: number;
  editionDate: string;
  position: number;
};

type PlayRow = { puzzleId: number; editionId: string; finishedMs: number | null; revealed: number; demo: number };

/** Every slot of every published edition, newest edition first. */
function publishedSlots(db: DbOrTx): Slot[] {
  return db
    .select({
      puzzleId: editionSlot.puzzleId,
      editionId: edition.id,
      publicationId: publication.id,
      publicationTitle: publication.title,
      number: edition.number,
      editionDate: edition.editionDate,
      position: editionSlot.position,
    })
    .from(editionSlot)
    .innerJoin(edition, eq(edition.id, editionSlot.editionId))
    .innerJoin(publication, eq(publication.id, edition.publicationId))
    .where(eq(edition.state, 'published'))
    .orderBy(desc(edition.editionDate), asc(publication.title), asc(editionSlot.position))
    .all();
}

/** One row per play: its finish time (null: not finished), whether it revealed anything, whether it is demo data. */
function plays(db: DbOrTx, editionIds: string[]): PlayRow[] {
  if (editionIds.length === 0) return [];
  return db
    .select({
      puzzleId: solveEvent.puzzleId,
      editionId: solveEvent.editionId,
      finishedMs: sql<number | null>`max(case when ${solveEvent.kind} = 'finished' then ${solveEvent.elapsedMs} end)`,
      revealed: sql<number>`max(${solveEvent.kind} = 'revealed')`,
      demo: sql<number>`max(${solveEvent.demo})`,
    })
    .from(solveEvent)
    .where(inArray(solveEvent.editionId, editionIds))
    .groupBy(solveEvent.puzzleId, solveEvent.editionId, solveEvent.playId)
    .all();
}

type Tally = { starts: number; finishes: number; solved: number; revealed: number; times: number[]; demo: number };
const emptyTally = (): Tally => ({ starts: 0, finishes: 0, solved: 0, revealed: 0, times: [], demo: 0 });

function add(t: Tally, p: PlayRow): void {
  t.starts++;
  if (p.finishedMs !== null) t.finishes++;
  if (p.revealed) t.revealed++;
  if (p.finishedMs !== null && !p.revealed) {
    t.solved++;
    t.times.push(p.finishedMs);
  }
  if (p.demo) t.demo++;
}

const rate = (n: number, of: number) => (of === 0 ? null : n / of);

function countRecords(db: DbOrTx): { records: number; demo: number } {
  const r = db.select({ n: sql<number>`count(*)`, demo: sql<number>`coalesce(sum(${solveEvent.demo}), 0)` }).from(solveEvent).get();
  return { records: r?.n ?? 0, demo: r?.demo ?? 0 };
}

type PuzzleLine = PuzzleSolveStats & { tally: Tally; print: PuzzleForPrint };

function puzzleLines(deps: Pick<ReaderDeps, 'db' | 'clock' | 'puzzles'>): PuzzleLine[] {
  const db = deps.db;
  const slots = publishedSlots(db);
  const tallies = new Map<string, Tally>();
  for (const p of plays(db, [...new Set(slots.map((s) => s.editionId))])) {
    const key = `${p.editionId}/${p.puzzleId}`;
    const t = tallies.get(key) ?? emptyTally();
    add(t, p);
    tallies.set(key, t);
  }
  const grades = shownGrades(db, slots.map((s) => s.puzzleId));
  // public addresses: only for editions public now
  const now = deps.clock.now();
  const pubs = new Map(publicationsForReader(db).map((p) => [p.id, p]));
  const publicPath = new Map<string, string>();
  for (const pub of pubs.values()) for (const e of editionsWithRelease(db, pub, now)) if (e.release.public) publicPath.set(e.id, pub.slug);
  return slots.flatMap((s) => {
    const print = deps.puzzles.getPuzzleForPrint(db, String(s.puzzleId));
    if (!print) return [];
    const t = tallies.get(`${s.editionId}/${s.puzzleId}`) ?? emptyTally();
    const g = grades.get(s.puzzleId);
    const slug = publicPath.get(s.editionId);
    return [{
      puzzleId: s.puzzleId,
      title: print.title,
      kind: print.kind,
      publicationTitle: s.publicationTitle,
      editionNumber: s.number,
      editionDate: s.editionDate,
      position: s.position,
      path: slug ? readerPaths.puzzle(slug, s.number, s.position) : null,
      engineGrade: print.grade,
      shownGrade: g?.grade ?? print.grade,
      gradeNote: g?.note ?? null,
      starts: t.starts,
      finishes: t.finishes,
      solved: t.solved,
      timeMs: quartiles(t.times),
      revealRate: rate(t.revealed, t.starts),
      demoRecords: t.demo,
      tally: t,
      print,
    }];
  });
}

export function solveStats(deps: Pick<ReaderDeps, 'db' | 'clock' | 'puzzles'>): SolveStats {
  const lines = puzzleLines(deps);
  const byGrade = new Map<number, { puzzles: number; t: Tally }>();
  for (const l of lines) {
    const g = byGrade.get(l.engineGrade) ?? { puzzles: 0, t: emptyTally() };
    g.puzzles++;
    g.t.starts += l.tally.starts;
    g.t.finishes += l.tally.finishes;
    g.t.solved += l.tally.solved;
    g.t.revealed += l.tally.revealed;
    g.t.times.push(...l.tally.times);
    byGrade.set(l.engineGrade, g);
  }
  const grades: GradeSolveStats[] = [...byGrade.entries()]
    .sort((a, b) => a[0] - b[0])
    .map(([grade, { puzzles, t }]) => ({ grade, puzzles, starts: t.starts, finishes: t.finishes, solved: t.solved, timeMs: quartiles(t.times), revealRate: rate(t.revealed, t.starts) }));
  const counts = countRecords(deps.db);
  return { puzzles: lines.map(({ tally: _t, print: _p, ...rest }) => rest), grades, records: counts.records, demoRecords: counts.demo };
}

/** The engine's score a puzzle's grade is cut from: Deduction points, Assembly pieces; and its starter pieces. */
function scoreOf(db: DbOrTx, line: PuzzleLine): { score: number; starters: number } {
  const p = line.print;
  if (p.assembly) return { score: p.assembly.pieces.length, starters: p.assembly.starters.length };
  const row = db.select({ id: puzzle.id, level: puzzle.level, showFrame: puzzle.showFrame }).from(puzzle).where(eq(puzzle.id, line.puzzleId)).get();
  const level = row ? levelOf(row) : null;
  const tiling = { W: p.solution.tiling.W, H: p.solution.tiling.H, squares: p.solution.tiling.squares.map((q) => ({ x: q.x, y: q.y, s: q.s })) };
  const givens = (p.deduction?.givens ?? []).map((g) => g.rect);
  const ev = evaluateDeduction(tiling, givens, { ...(level !== null ? { level } : {}), showFrame: row?.showFrame ?? false });
  return { score: gradePoints(ev.features), starters: 0 };
}

const gradeAt = (cuts: readonly (number | null)[], score: number) => 1 + cuts.filter((c) => c !== null && score >= c).length;

function formulaChange(kind: 'assembly' | 'deduction', points: CalibrationPoint[]): FormulaChange {
  const mine = points.filter((p) => p.kind === kind);
  const current = [...CURRENT_CUTS[kind]];
  // Assembly's grade is the pieces' grade less one per two starter pieces: fit the pieces' part
  const offset = (p: CalibrationPoint) => (kind === 'assembly' ? Math.floor(p.starters / 2) : 0);
  const fit = monotoneGradeFit(mine.map((p) => ({ key: p.score, target: Math.min(5, p.readersGrade + offset(p)) })));
  const suggested = fit.cuts.map((c) => (c === null ? null : kind === 'assembly' ? c.from : (c.below + c.from) / 2));
  // a grade with no cut in the data keeps today's boundary
  const used = suggested.map((s, i) => s ?? current[i]!);
  const clamp = (g: number) => Math.max(1, Math.min(5, g));
  const changed = mine.filter((p) => clamp(gradeAt(used, p.score) - offset(p)) !== clamp(gradeAt(current, p.score) - offset(p))).length;
  const unit = kind === 'assembly' ? 'pieces' : 'points';
  const parts = used.map((v, i) => (v === current[i] ? null : `grade ${i + 2} from ${v} ${unit} (now ${current[i]})`)).filter((x): x is string => x !== null);
  const what = kind === 'assembly' ? 'Assembly' : 'Deduction';
  const text =
    mine.length === 0
      ? `${what}: no puzzle has enough solves yet.`
      : parts.length === 0
        ? `${what}: readers' times agree with today's boundaries (${mine.length} puzzle${mine.length === 1 ? '' : 's'}).`
        : `${what}: ${parts.join('; ')}. ${changed} of ${mine.length} puzzle${mine.length === 1 ? '' : 's'} would change grade.`;
  return { kind, score: kind === 'assembly' ? 'pieces in the frame (one grade easier per two starter pieces)' : 'the grade points of the Deduction formula (level, rounds, single-step rounds, frame)', current, suggested, puzzles: mine.length, changed, text };
}

export function calibration(deps: Pick<ReaderDeps, 'db' | 'clock' | 'puzzles'>): Calibration {
  const lines = puzzleLines(deps).filter((l) => l.tally.solved >= MIN_SOLVED_FOR_CALIBRATION && l.timeMs !== null);
  // a puzzle printed in two editions counts once, with all its solves
  const byPuzzle = new Map<number, PuzzleLine & { allTimes: number[] }>();
  for (const l of lines) {
    const seen = byPuzzle.get(l.puzzleId);
    if (seen) seen.allTimes.push(...l.tally.times);
    else byPuzzle.set(l.puzzleId, { ...l, allTimes: [...l.tally.times] });
  }
  const base = [...byPuzzle.values()].map((l) => ({ l, medianMs: quartiles(l.allTimes)!.median, ...scoreOf(deps.db, l) }));
  // the time boundaries that fit the engine's grades best (in log time: times spread by factors)
  const timeFit = monotoneGradeFit(base.map((b) => ({ key: Math.log(b.medianMs), target: b.l.engineGrade })));
  const points: CalibrationPoint[] = base.map((b, i) => ({
    puzzleId: b.l.puzzleId,
    title: b.l.title,
    kind: b.l.kind,
    engineGrade: b.l.engineGrade,
    shownGrade: b.l.shownGrade,
    medianMs: b.medianMs,
    solved: b.l.allTimes.length,
    readersGrade: timeFit.grades[i]!,
    score: b.score,
    starters: b.starters,
  }));
  const byGrade = [1, 2, 3, 4, 5].map((grade) => {
    const here = points.filter((p) => p.engineGrade === grade).map((p) => p.medianMs);
    return { grade, puzzles: here.length, medianMs: quartiles(here)?.median ?? null };
  });
  const counts = countRecords(deps.db);
  return {
    minSolved: MIN_SOLVED_FOR_CALIBRATION,
    points: points.sort((a, b) => a.medianMs - b.medianMs),
    boundariesMs: timeFit.cuts.map((c) => (c === null ? null : Math.round(Math.sqrt(Math.exp(c.below) * Math.exp(c.from))))),
    byGrade,
    spearman: spearman(points.map((p) => p.engineGrade), points.map((p) => p.medianMs)),
    disagreements: points.filter((p) => p.readersGrade !== p.engineGrade).length,
    formula: [formulaChange('deduction', points), formulaChange('assembly', points)],
    demoRecords: counts.demo,
  };
}

/** Does a published edition hold this puzzle? (grades are adjusted after publication only) */
export function isPublishedPuzzle(db: DbOrTx, puzzleId: number): boolean {
  return db.select({ id: editionSlot.id }).from(editionSlot).innerJoin(edition, eq(edition.id, editionSlot.editionId)).where(and(eq(editionSlot.puzzleId, puzzleId), eq(edition.state, 'published'))).limit(1).get() !== undefined;
}
