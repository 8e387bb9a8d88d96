import { queryOptions, useQuery } from '@tanstack/react-query';
import { printerEditionSchema } from '../../../../shared/contracts/editions';
import { apiRequest } from '../../../lib/api-client';
import { proofKeys } from './list-proofs';

/** GET /api/editions/:id (printer view: the files and their history). */
export function getProofEdition(id: string, signal?: AbortSignal) {
  return apiRequest(`/api/editions/${encodeURIComponent(id)}`, { schema: printerEditionSchema, signal });
}

export const proofEditionQueryOptions = (id: string) => queryOptions({ queryKey: proofKeys.detail(id), queryFn: ({ signal }) => getProofEdition(id, signal) });

export function useProofEdition(id: string) {
  return useQuery(proofEditionQueryOptions(id));
}
