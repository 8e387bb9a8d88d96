import { queryOptions, useQuery } from '@tanstack/react-query';
import { puzzleListSchema } from '../../../../shared/contracts/puzzles';
import { apiRequest } from '../../../lib/api-client';
import { editionKeys } from './list-editions';

/** GET /api/puzzles?printable=true: puzzles with a current certificate, for the slot picker. */
export async function listPrintablePuzzles(signal?: AbortSignal) {
  return (await apiRequest('/api/puzzles', { schema: puzzleListSchema, query: { printable: true, pageSize: 200 }, signal })).items;
}

export const printablePuzzlesQueryOptions = () =>
  queryOptions({ queryKey: [...editionKeys.all, 'printable-puzzles'] as const, queryFn: ({ signal }) => listPrintablePuzzles(signal), staleTime: 30_000 });

export function usePrintablePuzzles() {
  return useQuery(printablePuzzlesQueryOptions());
}
