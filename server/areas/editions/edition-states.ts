import { and, eq } from 'drizzle-orm';
import { canMove, type EditionState } from '../../../shared/contracts/editions';
import type { DbOrTx } from '../../platform/db/client';
import { Conflict } from '../../platform/http/errors';
import { edition } from './schema';

// The edition's state machine, in one place: draft -> in_proof -> approved -> published,
// and in_proof -> draft when the printer returns a proof. Every change of an edition's
// state goes through moveEdition; every action that needs a state checks it here, so an
// illegal move is a 409 with one wording wherever it is tried. The legal moves are the
// API's own table (editionTransitions in shared/contracts/editions.ts, which the client
// uses to offer only possible actions); the moves below must agree with it (checked at
// load and by tests/server/editions/edition-states.test.ts).

type EditionRow = typeof edition.$inferSelect;

/** The state of a new edition. */
export const initialEditionState: EditionState = 'draft';

/** The moves, with the state each needs and what the refusal says it was trying to do. */
export const editionMoves = {
  sendToProof: { from: 'draft', to: 'in_proof', doing: 'send to proof' },
  approveProof: { from: 'in_proof', to: 'approved', doing: 'decide on a proof' },
  returnProof: { from: 'in_proof', to: 'draft', doing: 'decide on a proof' },
  publish: { from: 'approved', to: 'published', doing: 'publish' },
} as const satisfies Record<string, { from: EditionState; to: EditionState; doing: string }>;
export type EditionMove = keyof typeof editionMoves;

for (const [name, m] of Object.entries(editionMoves)) {
  if (!canMove(m.from, m.to)) throw new Error(`edition move ${name} (${m.from} -> ${m.to}) is not in editionTransitions`);
}

const words = (s: EditionState) => s.replace('_', ' ');

function requireState(r: Pick<EditionRow, 'number' | 'state'>, needed: EditionState, doing: string): void {
  if (r.state !== needed) {
    throw new Conflict(`Cannot ${doing}: edition No. ${r.number} is ${words(r.state)}, and this needs it to be ${words(needed)}.`, { state: r.state, needed });
  }
}

/** Only a draft may be changed (number, date, introduction, slots). */
export function requireEditable(r: Pick<EditionRow, 'number' | 'state'>): void {
  requireState(r, 'draft', 'change the edition');
}

/** Refuses (409) unless the edition is in the state the move starts from. */
export function requireMove(r: Pick<EditionRow, 'number' | 'state'>, move: EditionMove): void {
  const m = editionMoves[move];
  requireState(r, m.from, m.doing);
}

/** What a move may write besides the state (press file, publication, notes). */
export type EditionMoveChanges = Partial<Omit<typeof edition.$inferInsert, 'id' | 'publicationId' | 'state' | 'createdAt' | 'createdBy'>>;

/**
 * Moves the edition (inside the caller's transaction): checks the move against the row as
 * it is now, then writes the new state with `changes`, only where the state is still the
 * one the move starts from.
 */
export function moveEdition(tx: DbOrTx, r: Pick<EditionRow, 'id' | 'number' | 'state'>, move: EditionMove, changes: EditionMoveChanges): void {
  requireMove(r, move);
  const m = editionMoves[move];
  const moved = tx
    .update(edition)
    .set({ ...changes, state: m.to })
    .where(and(eq(edition.id, r.id), eq(edition.state, m.from)))
    .returning({ id: edition.id })
    .all();
  if (moved.length !== 1) throw new Conflict(`Cannot ${m.doing}: edition No. ${r.number} changed meanwhile.`, { needed: m.from });
}
