import { queryOptions, useQuery } from '@tanstack/react-query';
import { editionSchema, publishCheckSchema, type PublishRequest } from '../../../../shared/contracts/editions';
import { editionChangeKeys, editionKeys } from '../../../api/editions';
import { apiRequest } from '../../../lib/api-client';
import { useInvalidatingMutation } from '../../../lib/use-invalidating-mutation';

/** POST /api/editions/:id/publish (editor): approved -> published; fees go into the ledger. `override.reason`: admins past the date and order guards. */
export function publishEdition(id: string, body: PublishRequest) {
  return apiRequest(`/api/editions/${encodeURIComponent(id)}/publish`, { method: 'POST', body, schema: editionSchema });
}

export function usePublishEdition(id: string) {
  return useInvalidatingMutation((body: PublishRequest) => publishEdition(id, body), editionChangeKeys());
}

/** GET /api/editions/:id/publish-check (editor): the fees publishing makes payable, and what refuses it now. */
export function getPublishCheck(id: string, signal?: AbortSignal) {
  return apiRequest(`/api/editions/${encodeURIComponent(id)}/publish-check`, { schema: publishCheckSchema, signal });
}

export const publishCheckQueryOptions = (id: string) => queryOptions({ queryKey: editionKeys.publishCheck(id), queryFn: ({ signal }) => getPublishCheck(id, signal), staleTime: 0 });

export function usePublishCheck(id: string, enabled: boolean) {
  return useQuery({ ...publishCheckQueryOptions(id), enabled });
}
