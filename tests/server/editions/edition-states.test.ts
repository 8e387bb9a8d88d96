import { describe, expect, it } from 'vitest';
import { editionStates, editionTransitions } from '../../../shared/contracts/editions';
import { editionMoves, requireEditable, requireMove, type EditionMove } from '../../../server/areas/editions/edition-states';
import { Conflict } from '../../../server/platform/http/errors';

// The edition's state machine: the server's moves are exactly the API's table of legal
// transitions (editionTransitions, which the client reads to offer actions), and every
// other move is refused with a 409 that says what was tried and what it needs.

describe('the edition state machine', () => {
  it('has one move for each legal transition of the API, and no other', () => {
    const moves = Object.values(editionMoves).map((m) => `${m.from} -> ${m.to}`).sort();
    const legal = editionStates.flatMap((from) => editionTransitions[from].map((to) => `${from} -> ${to}`)).sort();
    expect(moves).toEqual(legal);
    expect(legal).toEqual(['approved -> published', 'draft -> in_proof', 'in_proof -> approved', 'in_proof -> draft']);
  });

  it('allows each move from its own state only, with a 409 naming the state and what it needs', () => {
    for (const move of Object.keys(editionMoves) as EditionMove[]) {
      for (const state of editionStates) {
        const attempt = () => requireMove({ number: 41, state }, move);
        if (state === editionMoves[move].from) expect(attempt).not.toThrow();
        else expect(attempt).toThrow(Conflict);
      }
    }
    expect(() => requireMove({ number: 41, state: 'published' }, 'publish')).toThrow('Cannot publish: edition No. 41 is published, and this needs it to be approved.');
    expect(() => requireMove({ number: 41, state: 'approved' }, 'returnProof')).toThrow('Cannot decide on a proof: edition No. 41 is approved, and this needs it to be in proof.');
  });

  it('lets only a draft be changed', () => {
    expect(() => requireEditable({ number: 7, state: 'draft' })).not.toThrow();
    expect(() => requireEditable({ number: 7, state: 'in_proof' })).toThrow('Cannot change the edition: edition No. 7 is in proof, and this needs it to be draft.');
  });
});
