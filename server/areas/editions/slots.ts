import { asc, eq } from 'drizzle-orm';
import type { SlotInput } from '../../../shared/contracts/editions';
import type { DbOrTx } from '../../platform/db/client';
import type { PuzzleForPrint, PuzzleSource } from './ports';
import { editionSlot } from './schema';

// An edition's slots and the puzzle each names. In the database a slot's puzzle is an
// integer foreign key to puzzle(id); in the API (and in the PuzzleSource port) a puzzle id
// is its decimal digits as a string. The conversion happens here, at that boundary.

export type SlotRow = typeof editionSlot.$inferSelect;

/** A puzzle id as the API spells it. */
export function apiPuzzleId(id: number): string {
  return String(id);
}

/** The puzzle row id an API puzzle id names, or null when it cannot name one (only the spelling apiPuzzleId gives). */
export function puzzleRowId(apiId: string): number | null {
  return /^[1-9]\d{0,14}$/.test(apiId) ? Number(apiId) : null;
}

export function slotsOf(db: DbOrTx, editionId: string): SlotRow[] {
  return db.select().from(editionSlot).where(eq(editionSlot.editionId, editionId)).orderBy(asc(editionSlot.position)).all();
}

/** The puzzle a slot holds, as print reads it (null when the puzzle store cannot give it). */
export function slotPuzzle(source: PuzzleSource, db: DbOrTx, s: Pick<SlotRow, 'puzzleId'>): PuzzleForPrint | null {
  return source.getPuzzleForPrint(db, apiPuzzleId(s.puzzleId));
}

/** The slots of a patch as rows to store, or the API paths of the puzzles that do not exist. */
export function slotRowsFor(
  source: PuzzleSource,
  db: DbOrTx,
  editionId: string,
  slots: SlotInput[],
): { ok: true; rows: Omit<SlotRow, 'id'>[] } | { ok: false; missing: { path: string; message: string }[] } {
  const rows: Omit<SlotRow, 'id'>[] = [];
  const missing: { path: string; message: string }[] = [];
  slots.forEach((s, i) => {
    const rowId = puzzleRowId(s.puzzleId);
    if (rowId === null || source.getPuzzleForPrint(db, s.puzzleId) === null) missing.push({ path: `body.slots.${i}.puzzleId`, message: `no puzzle ${s.puzzleId}` });
    else rows.push({ editionId, position: i + 1, puzzleId: rowId, instructionsJson: JSON.stringify(s.instructions) });
  });
  return missing.length > 0 ? { ok: false, missing } : { ok: true, rows };
}
