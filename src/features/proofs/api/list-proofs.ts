import { queryOptions, useQuery } from '@tanstack/react-query';
import { editionListSchema, type EditionState } from '../../../../shared/contracts/editions';
import { apiRequest } from '../../../lib/api-client';

/** Keys: ['proofs'], ['proofs', 'list', state], ['proofs', 'detail', id]. */
export const proofKeys = {
  all: ['proofs'] as const,
  list: (state: EditionState | 'all') => [...proofKeys.all, 'list', state] as const,
  detail: (id: string) => [...proofKeys.all, 'detail', id] as const,
};

/** GET /api/editions as a printer sees it: only editions sent to proof. */
export async function listSentEditions(state: EditionState | undefined, signal?: AbortSignal) {
  return (await apiRequest('/api/editions', { schema: editionListSchema, query: { state }, signal })).items;
}

export const sentEditionsQueryOptions = (state?: EditionState) =>
  queryOptions({ queryKey: proofKeys.list(state ?? 'all'), queryFn: ({ signal }) => listSentEditions(state, signal), staleTime: 0 });

export function useSentEditions(state?: EditionState) {
  return useQuery(sentEditionsQueryOptions(state));
}
