import { editionSchema } from '../../../../shared/contracts/editions';
import { editionChangeKeys } from '../../../api/editions';
import { apiRequest } from '../../../lib/api-client';
import { useInvalidatingMutation } from '../../../lib/use-invalidating-mutation';

/** POST /api/editions/:id/proofs (editor): render and store the next proof, mail the printers. */
export function sendProof(id: string) {
  return apiRequest(`/api/editions/${encodeURIComponent(id)}/proofs`, { method: 'POST', schema: editionSchema });
}

export function useSendProof(id: string) {
  return useInvalidatingMutation(() => sendProof(id), editionChangeKeys());
}
