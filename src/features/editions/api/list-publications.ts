import { queryOptions, useQuery } from '@tanstack/react-query';
import { publicationListSchema } from '../../../../shared/contracts/publications';
import { apiRequest } from '../../../lib/api-client';
import { editionKeys } from './list-editions';

/** GET /api/publications, for choosing an edition's publication. */
export async function listPublications(signal?: AbortSignal) {
  return (await apiRequest('/api/publications', { schema: publicationListSchema, signal })).items;
}

export const editionPublicationsQueryOptions = () =>
  queryOptions({ queryKey: [...editionKeys.all, 'publications'] as const, queryFn: ({ signal }) => listPublications(signal), staleTime: 60_000 });

export function useEditionPublications() {
  return useQuery(editionPublicationsQueryOptions());
}
