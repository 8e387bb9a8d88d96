import type { SolveEventInput } from '../../../shared/contracts/reader';
import type { DbOrTx } from '../../platform/db/client';
import { solveEvent } from './schema';

// Anonymous solve events (decision 080): what a play of a public puzzle did, and when in its
// own clock. A row holds the puzzle, the edition, a random play id made by the reader's
// browser, the kind, the time played and a count; no address, agent, account or cookie.
// A play starts and finishes once: a repeated start or finish is dropped (the unique index).

export function recordSolveEvent(db: DbOrTx, at: { puzzleId: number; editionId: string; now: Date }, input: SolveEventInput): void {
  db.insert(solveEvent)
    .values({ puzzleId: at.puzzleId, editionId: at.editionId, playId: input.playId, kind: input.kind, elapsedMs: input.elapsedMs, count: input.count ?? null, demo: false, at: at.now })
    .onConflictDoNothing()
    .run();
}
