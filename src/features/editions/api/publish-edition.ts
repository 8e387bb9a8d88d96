import { editionSchema } from '../../../../shared/contracts/editions';
import { editionChangeKeys } from '../../../api/editions';
import { apiRequest } from '../../../lib/api-client';
import { useInvalidatingMutation } from '../../../lib/use-invalidating-mutation';

/** POST /api/editions/:id/publish (editor): approved -> published; fees go into the ledger. */
export function publishEdition(id: string) {
  return apiRequest(`/api/editions/${encodeURIComponent(id)}/publish`, { method: 'POST', schema: editionSchema });
}

export function usePublishEdition(id: string) {
  return useInvalidatingMutation(() => publishEdition(id), editionChangeKeys());
}
