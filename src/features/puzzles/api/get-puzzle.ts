import { queryOptions, useQuery } from '@tanstack/react-query';
import { puzzleDetailSchema, type PuzzleDetail } from '../../../../shared/contracts/puzzles';
import { puzzleKeys } from '../../../api/puzzles';
import { apiRequest } from '../../../lib/api-client';

// The puzzle list (GET /api/puzzles) and the stock tiling a puzzle is made from
// (GET /api/stock/:id) are shared with other features: src/api/puzzles.ts, src/api/stock.ts.

export function isProving(p: Pick<PuzzleDetail, 'status'>): boolean {
  return p.status === 'proving';
}

/** GET /api/puzzles/:id (editor). */
export async function getPuzzle(id: number, signal?: AbortSignal) {
  return apiRequest(`/api/puzzles/${id}`, { schema: puzzleDetailSchema, signal });
}

export const puzzleQueryOptions = (id: number) =>
  queryOptions({
    queryKey: puzzleKeys.detail(id),
    queryFn: ({ signal }) => getPuzzle(id, signal),
    // live verdict: poll while the proof runs
    refetchInterval: (q) => (q.state.data && isProving(q.state.data) ? 500 : false),
  });

export function usePuzzle(id: number) {
  return useQuery(puzzleQueryOptions(id));
}
