import { useMutation, useQueryClient } from '@tanstack/react-query';
import { editionSchema } from '../../../../shared/contracts/editions';
import { apiRequest } from '../../../lib/api-client';
import { editionKeys } from './list-editions';

/** POST /api/editions/:id/proofs (editor): render and store the next proof, mail the printers. */
export function sendProof(id: string) {
  return apiRequest(`/api/editions/${encodeURIComponent(id)}/proofs`, { method: 'POST', schema: editionSchema });
}

export function useSendProof(id: string) {
  const qc = useQueryClient();
  return useMutation({ mutationFn: () => sendProof(id), onSettled: () => qc.invalidateQueries({ queryKey: editionKeys.all }) });
}
