import { and, eq, lt, ne, or } from 'drizzle-orm';
import type { SessionUser } from '../../../shared/contracts/auth';
import { canMove, type EditionChecks, type EditionState, type Override, type OverrideKind, type PublishBlocker } from '../../../shared/contracts/editions';
import type { DbOrTx } from '../../platform/db/client';
import { Conflict, Forbidden, Unprocessable } from '../../platform/http/errors';
import { edition, editionOverride } from './schema';

// The edition's state machine, in one place: draft -> in_proof -> approved -> published,
// and in_proof -> draft when the printer returns a proof. Every change of an edition's
// state goes through moveEdition; every action that needs a state checks it here, so an
// illegal move is a 409 with one wording wherever it is tried. The legal moves are the
// API's own table (editionTransitions in shared/contracts/editions.ts, which the client
// uses to offer only possible actions); the moves below must agree with it (checked at
// load and by tests/server/editions/edition-states.test.ts).
//
// Guards on top of the moves (the client explains them, the server enforces them):
// - send to proof only from the saved state the editor saw (updatedAt), with at least one
//   puzzle and every check passed; preflight errors may be overridden by the editor with a
//   reason (recorded);
// - publish only on or after the edition's date and after every earlier edition of the
//   publication; an admin may override either with a reason (recorded).

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

// ---- guards --------------------------------------------------------------------------------

/** Refuses (409) when the edition was saved since the caller loaded it: a proof is made only from the state the editor saw. */
export function requireSavedState(r: Pick<EditionRow, 'number' | 'updatedAt'>, seenUpdatedAt: string | undefined): void {
  if (seenUpdatedAt === undefined) return;
  if (r.updatedAt.toISOString() !== seenUpdatedAt) {
    throw new Conflict(`Edition No. ${r.number} was changed since you loaded it (saved ${r.updatedAt.toISOString()}); reload it and check it again before sending.`, { updatedAt: r.updatedAt.toISOString() });
  }
}

/**
 * The send guard: every check must pass. Failed checks the editor may override (the
 * preflight's errors) go through with a reason; anything else is refused (422), each
 * failed check a detail. Returns what was overridden (null when nothing was).
 */
export function sendGuard(checks: EditionChecks, override: Override | undefined): { refused: string } | null {
  const failed = checks.checks.filter((c) => !c.ok);
  if (failed.length === 0) return null;
  const hard = failed.filter((c) => !c.overridable);
  const details = failed.map((c) => ({ path: c.slot ? `slots.${c.slot}` : c.code, message: c.message, overridable: c.overridable === true }));
  if (hard.length > 0) throw new Unprocessable('The edition does not pass its checks before proof.', details);
  if (!override) {
    throw new Unprocessable('The preflight found errors. Fix them, or send anyway with a reason (it is recorded with the proof).', details);
  }
  return { refused: failed.map((c) => c.message).join('; ') };
}

type PublishRow = Pick<EditionRow, 'id' | 'publicationId' | 'number' | 'editionDate'>;

/** Why the edition may not be published today: before its date, or ahead of an earlier unpublished edition of its publication. */
export function publishBlockers(db: DbOrTx, r: PublishRow, today: string): PublishBlocker[] {
  const out: PublishBlocker[] = [];
  if (today < r.editionDate) out.push({ code: 'early', message: `No. ${r.number} is dated ${r.editionDate}; today is ${today}. Publishing now makes its fees payable before the edition is out.` });
  const earlier = db
    .select({ number: edition.number, date: edition.editionDate, state: edition.state })
    .from(edition)
    .where(and(eq(edition.publicationId, r.publicationId), ne(edition.id, r.id), ne(edition.state, 'published'), or(lt(edition.number, r.number), lt(edition.editionDate, r.editionDate))))
    .orderBy(edition.number)
    .all();
  if (earlier.length > 0) {
    const list = earlier.map((e) => `No. ${e.number} (${e.date}, ${words(e.state)})`).join(', ');
    out.push({ code: 'out-of-order', message: `${earlier.length === 1 ? 'An earlier edition is' : 'Earlier editions are'} not published yet: ${list}.` });
  }
  return out;
}

/**
 * The publish guard: refuses (409) while blockers stand, unless an admin gives a reason;
 * an editor's override is refused (403). Returns the blockers that were overridden.
 */
export function publishGuard(blockers: PublishBlocker[], who: Pick<SessionUser, 'role'>, override: Override | undefined): PublishBlocker[] {
  if (blockers.length === 0) return [];
  if (!override) throw new Conflict(`Cannot publish yet: ${blockers.map((b) => b.message).join(' ')} An admin may publish anyway with a reason.`, { blockers });
  if (who.role !== 'admin') throw new Forbidden('Only an admin may publish past these guards.', { blockers });
  return blockers;
}

const overrideKindOf: Record<PublishBlocker['code'], OverrideKind> = { early: 'publish-early', 'out-of-order': 'publish-out-of-order' };

/** Records a guard gone past (inside the caller's transaction). */
export function recordOverride(
  tx: DbOrTx,
  editionId: string,
  o: { kind: OverrideKind | PublishBlocker['code']; reason: string; refused: string; proofVersion?: number | null; by: string; at: Date },
): void {
  const kind = o.kind === 'early' || o.kind === 'out-of-order' ? overrideKindOf[o.kind] : o.kind;
  tx.insert(editionOverride).values({ editionId, kind, reason: o.reason, refused: o.refused, proofVersion: o.proofVersion ?? null, createdBy: o.by, createdAt: o.at }).run();
}
