import { useMutation, useQueryClient } from '@tanstack/react-query';
import { editionSchema, type EditionCreate } from '../../../../shared/contracts/editions';
import { invalidateEditionQueries } from '../../../api/editions';
import { apiRequest } from '../../../lib/api-client';

/** POST /api/editions (editor): a new draft. */
export function createEdition(input: EditionCreate) {
  return apiRequest('/api/editions', { method: 'POST', body: input, schema: editionSchema });
}

export function useCreateEdition() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: createEdition, onSettled: () => invalidateEditionQueries(qc) });
}
