import { useMutation, useQueryClient } from '@tanstack/react-query';
import { editionSchema } from '../../../../shared/contracts/editions';
import { invalidateEditionQueries } from '../../../api/editions';
import { apiRequest } from '../../../lib/api-client';

/** POST /api/editions/:id/publish (editor): approved -> published; fees go into the ledger. */
export function publishEdition(id: string) {
  return apiRequest(`/api/editions/${encodeURIComponent(id)}/publish`, { method: 'POST', schema: editionSchema });
}

export function usePublishEdition(id: string) {
  const qc = useQueryClient();
  return useMutation({ mutationFn: () => publishEdition(id), onSettled: () => invalidateEditionQueries(qc) });
}
