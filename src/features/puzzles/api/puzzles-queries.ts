import { queryOptions, useQuery } from '@tanstack/react-query';
import { puzzleDetailSchema, puzzleListSchema, type PuzzleDetail } from '../../../../shared/contracts/puzzles';
import { stockDetailSchema } from '../../../../shared/contracts/stock';
import { apiRequest, type QueryValue } from '../../../lib/api-client';

/** Keys: ['puzzles'] (all), ['puzzles', 'list', search], ['puzzles', 'detail', id], ['puzzles', 'stock', id]. */
export const puzzleKeys = { all: ['puzzles'] as const };

export function isProving(p: Pick<PuzzleDetail, 'status'>): boolean {
  return p.status === 'proving';
}

/** GET /api/puzzles (editor): one page with filters and sort. */
export async function listPuzzles(search: Record<string, QueryValue>, signal?: AbortSignal) {
  return apiRequest('/api/puzzles', { schema: puzzleListSchema, query: search, signal });
}

/** GET /api/puzzles/:id (editor). */
export async function getPuzzle(id: number, signal?: AbortSignal) {
  return apiRequest(`/api/puzzles/${id}`, { schema: puzzleDetailSchema, signal });
}

/** GET /api/stock/:id (editor): the tiling a new puzzle is made from. */
export async function getStockTiling(id: number, signal?: AbortSignal) {
  return apiRequest(`/api/stock/${id}`, { schema: stockDetailSchema, signal });
}

export const puzzleListQueryOptions = (search: Record<string, QueryValue>) =>
  queryOptions({
    queryKey: [...puzzleKeys.all, 'list', search] as const,
    queryFn: ({ signal }) => listPuzzles(search, signal),
    refetchInterval: (q) => (q.state.data?.items.some((p) => p.status === 'proving') ? 1000 : false),
  });

export const puzzleQueryOptions = (id: number) =>
  queryOptions({
    queryKey: [...puzzleKeys.all, 'detail', id] as const,
    queryFn: ({ signal }) => getPuzzle(id, signal),
    // live verdict: poll while the proof runs
    refetchInterval: (q) => (q.state.data && isProving(q.state.data) ? 500 : false),
  });

export const stockTilingQueryOptions = (id: number) =>
  queryOptions({
    queryKey: [...puzzleKeys.all, 'stock', id] as const,
    queryFn: ({ signal }) => getStockTiling(id, signal),
  });

export function usePuzzleList(search: Record<string, QueryValue>) {
  return useQuery(puzzleListQueryOptions(search));
}

export function usePuzzle(id: number) {
  return useQuery(puzzleQueryOptions(id));
}

export function useStockTiling(id: number | null) {
  return useQuery({ ...stockTilingQueryOptions(id ?? 0), enabled: id !== null });
}
