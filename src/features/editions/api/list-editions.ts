import { queryOptions, useQuery } from '@tanstack/react-query';
import { editionListSchema, type EditionListQuery } from '../../../../shared/contracts/editions';
import { apiRequest } from '../../../lib/api-client';

/** Keys: ['editions'], ['editions', 'list', filters], ['editions', 'detail', id], ['editions', 'checks', id]. */
export const editionKeys = {
  all: ['editions'] as const,
  lists: () => [...editionKeys.all, 'list'] as const,
  detail: (id: string) => [...editionKeys.all, 'detail', id] as const,
  checks: (id: string) => [...editionKeys.all, 'checks', id] as const,
};

/** GET /api/editions (editor): editions of a month, with their state and latest proof. */
export async function listEditions(filters: EditionListQuery, signal?: AbortSignal) {
  const body = await apiRequest('/api/editions', { schema: editionListSchema, query: filters, signal });
  return body.items;
}

export const editionListQueryOptions = (filters: EditionListQuery) =>
  queryOptions({ queryKey: [...editionKeys.lists(), filters] as const, queryFn: ({ signal }) => listEditions(filters, signal) });

export function useEditions(filters: EditionListQuery) {
  return useQuery(editionListQueryOptions(filters));
}
