import { queryOptions, useQuery } from '@tanstack/react-query';
import { editionSchema } from '../../../../shared/contracts/editions';
import { apiRequest } from '../../../lib/api-client';
import { editionKeys } from './list-editions';

/** GET /api/editions/:id (editor): slots, introduction, proofs and press file. */
export function getEdition(id: string, signal?: AbortSignal) {
  return apiRequest(`/api/editions/${encodeURIComponent(id)}`, { schema: editionSchema, signal });
}

export const editionQueryOptions = (id: string) => queryOptions({ queryKey: editionKeys.detail(id), queryFn: ({ signal }) => getEdition(id, signal) });

export function useEdition(id: string) {
  return useQuery(editionQueryOptions(id));
}
