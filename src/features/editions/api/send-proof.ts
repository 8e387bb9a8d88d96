import { useMutation, useQueryClient } from '@tanstack/react-query';
import { editionSchema } from '../../../../shared/contracts/editions';
import { invalidateEditionQueries } from '../../../api/editions';
import { apiRequest } from '../../../lib/api-client';

/** POST /api/editions/:id/proofs (editor): render and store the next proof, mail the printers. */
export function sendProof(id: string) {
  return apiRequest(`/api/editions/${encodeURIComponent(id)}/proofs`, { method: 'POST', schema: editionSchema });
}

export function useSendProof(id: string) {
  const qc = useQueryClient();
  return useMutation({ mutationFn: () => sendProof(id), onSettled: () => invalidateEditionQueries(qc) });
}
