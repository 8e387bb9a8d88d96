import { editionSchema, type EditionCreate } from '../../../../shared/contracts/editions';
import { editionChangeKeys } from '../../../api/editions';
import { apiRequest } from '../../../lib/api-client';
import { useInvalidatingMutation } from '../../../lib/use-invalidating-mutation';

/** POST /api/editions (editor): a new draft. */
export function createEdition(input: EditionCreate) {
  return apiRequest('/api/editions', { method: 'POST', body: input, schema: editionSchema });
}

export function useCreateEdition() {
  return useInvalidatingMutation(createEdition, editionChangeKeys());
}
