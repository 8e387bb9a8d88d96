import { publicationSchema, type PublicationInput } from '../../../../shared/contracts/publications';
import { publicationKeys } from '../../../api/publications';
import { apiRequest } from '../../../lib/api-client';
import { useInvalidatingMutation } from '../../../lib/use-invalidating-mutation';

/** POST /api/publications (admin) or PATCH /api/publications/:id (admin). */
export function savePublication(input: PublicationInput, id?: string) {
  return id
    ? apiRequest(`/api/publications/${encodeURIComponent(id)}`, { method: 'PATCH', body: input, schema: publicationSchema })
    : apiRequest('/api/publications', { method: 'POST', body: input, schema: publicationSchema });
}

export function useSavePublication() {
  return useInvalidatingMutation((v: { input: PublicationInput; id?: string }) => savePublication(v.input, v.id), [publicationKeys.all]);
}
