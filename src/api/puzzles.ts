import { queryOptions, useQuery } from '@tanstack/react-query';
import { puzzleListSchema } from '../../shared/contracts/puzzles';
import { apiRequest, type QueryValue } from '../lib/api-client';

// The puzzle list is read by the puzzles feature and by the editions feature (the printable
// puzzles a slot can take), so making or changing a puzzle refreshes both.

/** Keys: ['puzzles'] (all), ['puzzles', 'list', search], ['puzzles', 'detail', id]. */
export const puzzleKeys = {
  all: ['puzzles'] as const,
  lists: () => [...puzzleKeys.all, 'list'] as const,
  list: (search: Record<string, QueryValue>) => [...puzzleKeys.lists(), search] as const,
  detail: (id: number) => [...puzzleKeys.all, 'detail', id] as const,
};

/** GET /api/puzzles (editor): one page with filters and sort (`printable=true`: a current certificate). */
export async function listPuzzles(search: Record<string, QueryValue>, signal?: AbortSignal) {
  return apiRequest('/api/puzzles', { schema: puzzleListSchema, query: search, signal });
}

export const puzzleListQueryOptions = (search: Record<string, QueryValue>) =>
  queryOptions({
    queryKey: puzzleKeys.list(search),
    queryFn: ({ signal }) => listPuzzles(search, signal),
    // poll while a puzzle on the page is being proved
    refetchInterval: (q) => (q.state.data?.items.some((p) => p.status === 'proving') ? 1000 : false),
  });

export function usePuzzleList(search: Record<string, QueryValue>) {
  return useQuery(puzzleListQueryOptions(search));
}
