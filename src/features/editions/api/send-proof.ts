import { editionSchema, type SendProof } from '../../../../shared/contracts/editions';
import { editionChangeKeys } from '../../../api/editions';
import { apiRequest } from '../../../lib/api-client';
import { useInvalidatingMutation } from '../../../lib/use-invalidating-mutation';

/**
 * POST /api/editions/:id/proofs (editor): render and store the next proof from the saved
 * state the editor saw (`updatedAt`), mail the printers; `override.reason` sends past the
 * preflight's floor errors.
 */
export function sendProof(id: string, body: SendProof) {
  return apiRequest(`/api/editions/${encodeURIComponent(id)}/proofs`, { method: 'POST', body, schema: editionSchema });
}

export function useSendProof(id: string) {
  return useInvalidatingMutation((body: SendProof) => sendProof(id, body), editionChangeKeys());
}
