import { eq } from 'drizzle-orm';
import type { SessionUser } from '../../../shared/contracts/auth';
import type { GradeAdjustInput, GradeAdjustment } from '../../../shared/contracts/reader';
import { user as userTable } from '../../platform/auth/schema';
import { Conflict, NotFound } from '../../platform/http/errors';
import type { ReaderDeps } from './ports';
import { readerGrade } from './schema';
import { isPublishedPuzzle } from './stats';

// The grade readers see: the engine's, until an editor adjusts it after publication with a
// note (shown beside the grade on the public page). The engine's grade itself never changes.

export function gradeAdjustment(deps: Pick<ReaderDeps, 'db' | 'puzzles'>, puzzleId: number): GradeAdjustment {
  const p = deps.puzzles.getPuzzleForPrint(deps.db, String(puzzleId));
  if (!p) throw new NotFound(`No puzzle ${puzzleId}.`);
  const row = deps.db
    .select({ grade: readerGrade.grade, note: readerGrade.note, at: readerGrade.adjustedAt, by: userTable.name })
    .from(readerGrade)
    .leftJoin(userTable, eq(userTable.id, readerGrade.adjustedBy))
    .where(eq(readerGrade.puzzleId, puzzleId))
    .get();
  return {
    puzzleId,
    engineGrade: p.grade,
    shownGrade: row?.grade ?? p.grade,
    note: row?.note ?? null,
    adjustedAt: row ? row.at.toISOString() : null,
    adjustedByName: row?.by ?? null,
  };
}

export function adjustGrade(deps: Pick<ReaderDeps, 'db' | 'puzzles' | 'clock'>, who: SessionUser, puzzleId: number, input: GradeAdjustInput): GradeAdjustment {
  deps.db.transaction((tx) => {
    if (!deps.puzzles.getPuzzleForPrint(tx, String(puzzleId))) throw new NotFound(`No puzzle ${puzzleId}.`);
    if (!isPublishedPuzzle(tx, puzzleId)) throw new Conflict(`Puzzle ${puzzleId} is in no published edition: its grade is the engine's until it is published.`);
    const values = { grade: input.grade, note: input.note, adjustedBy: who.id, adjustedAt: deps.clock.now() };
    tx.insert(readerGrade).values({ puzzleId, ...values }).onConflictDoUpdate({ target: readerGrade.puzzleId, set: values }).run();
  });
  return gradeAdjustment(deps, puzzleId);
}
