import { queryOptions, useQuery } from '@tanstack/react-query';
import { publicationListSchema } from '../../shared/contracts/publications';
import { apiRequest } from '../lib/api-client';

// Read by the publications feature (admin) and the editions feature (choosing an edition's
// publication): one key, so saving a publication refreshes both.

/** Keys: ['publications'] (all), ['publications', 'list']. */
export const publicationKeys = { all: ['publications'] as const, list: () => [...publicationKeys.all, 'list'] as const };

/** GET /api/publications. */
export async function listPublications(signal?: AbortSignal) {
  return (await apiRequest('/api/publications', { schema: publicationListSchema, signal })).items;
}

export const publicationListQueryOptions = () => queryOptions({ queryKey: publicationKeys.list(), queryFn: ({ signal }) => listPublications(signal) });

export function usePublications() {
  return useQuery(publicationListQueryOptions());
}
