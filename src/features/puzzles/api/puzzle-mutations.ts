import { okSchema } from '../../../../shared/contracts/common';
import { puzzleStartedSchema, type PuzzleCreate, type PuzzlePatch } from '../../../../shared/contracts/puzzles';
import { puzzleKeys } from '../../../api/puzzles';
import { stockKeys } from '../../../api/stock';
import { apiRequest } from '../../../lib/api-client';
import { useInvalidatingMutation } from '../../../lib/use-invalidating-mutation';

/** POST /api/puzzles (editor): make a puzzle; the proof starts in the worker pool (202). */
export async function createPuzzle(body: PuzzleCreate) {
  return apiRequest('/api/puzzles', { method: 'POST', body, schema: puzzleStartedSchema });
}

/** PATCH /api/puzzles/:id (editor): change starters / givens / level; proved again (202). */
export async function updatePuzzle({ id, patch }: { id: number; patch: PuzzlePatch }) {
  return apiRequest(`/api/puzzles/${id}`, { method: 'PATCH', body: patch, schema: puzzleStartedSchema });
}

/** POST /api/puzzles/:id/recheck (editor): recompute the certificate (202). */
export async function recheckPuzzle(id: number) {
  return apiRequest(`/api/puzzles/${id}/recheck`, { method: 'POST', schema: puzzleStartedSchema });
}

/** POST /api/puzzles/:id/cancel (editor). */
export async function cancelPuzzle(id: number) {
  return apiRequest(`/api/puzzles/${id}/cancel`, { method: 'POST', schema: okSchema });
}

/** A puzzle change refreshes the puzzles and the stock (a tiling's use count follows its puzzles). */
const puzzleChangeKeys = [puzzleKeys.all, stockKeys.all];
const useInvalidating = <A, R>(fn: (a: A) => Promise<R>) => useInvalidatingMutation(fn, puzzleChangeKeys);

export const useCreatePuzzle = () => useInvalidating(createPuzzle);
export const useUpdatePuzzle = () => useInvalidating(updatePuzzle);
export const useRecheckPuzzle = () => useInvalidating(recheckPuzzle);
export const useCancelPuzzle = () => useInvalidating(cancelPuzzle);
