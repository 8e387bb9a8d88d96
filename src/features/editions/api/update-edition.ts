import { useMutation, useQueryClient } from '@tanstack/react-query';
import { editionSchema, type EditionPatch } from '../../../../shared/contracts/editions';
import { editionKeys, invalidateEditionQueries } from '../../../api/editions';
import { apiRequest } from '../../../lib/api-client';

/** PATCH /api/editions/:id (editor): number, date, introduction, slots of a draft. */
export function updateEdition(id: string, patch: EditionPatch) {
  return apiRequest(`/api/editions/${encodeURIComponent(id)}`, { method: 'PATCH', body: patch, schema: editionSchema });
}

export function useUpdateEdition(id: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (patch: EditionPatch) => updateEdition(id, patch),
    onSuccess: (ed) => qc.setQueryData(editionKeys.detail(id), ed),
    onSettled: () => invalidateEditionQueries(qc),
  });
}
