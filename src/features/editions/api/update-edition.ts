import { useQueryClient } from '@tanstack/react-query';
import { editionSchema, type EditionPatch } from '../../../../shared/contracts/editions';
import { editionChangeKeys, editionKeys } from '../../../api/editions';
import { apiRequest } from '../../../lib/api-client';
import { useInvalidatingMutation } from '../../../lib/use-invalidating-mutation';

/** PATCH /api/editions/:id (editor): number, date, introduction, slots of a draft. */
export function updateEdition(id: string, patch: EditionPatch) {
  return apiRequest(`/api/editions/${encodeURIComponent(id)}`, { method: 'PATCH', body: patch, schema: editionSchema });
}

export function useUpdateEdition(id: string) {
  const qc = useQueryClient();
  return useInvalidatingMutation((patch: EditionPatch) => updateEdition(id, patch), editionChangeKeys(), {
    onSuccess: (ed) => qc.setQueryData(editionKeys.detail(id), ed),
  });
}
