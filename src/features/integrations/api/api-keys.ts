import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiKeyListResponseSchema, apiKeySchema, createApiKeyResponseSchema, type CreateApiKeyBody } from '../../../../shared/contracts/integrations';
import { apiRequest } from '../../../lib/api-client';
import { useInvalidatingMutation } from '../../../lib/use-invalidating-mutation';

/** Keys: ['api-keys'] (all), ['api-keys', 'list']. */
export const apiKeysKeys = {
  all: ['api-keys'] as const,
  list: () => [...apiKeysKeys.all, 'list'] as const,
};

/** GET /api/api-keys (editors: their own; admins: every key). */
export async function listApiKeys(signal?: AbortSignal) {
  return (await apiRequest('/api/api-keys', { schema: apiKeyListResponseSchema, signal })).items;
}

export const apiKeysQueryOptions = () => queryOptions({ queryKey: apiKeysKeys.list(), queryFn: ({ signal }) => listApiKeys(signal) });

export function useApiKeys() {
  return useQuery(apiKeysQueryOptions());
}

/** POST /api/api-keys: the new key with its secret (shown this once). */
export async function createApiKey(body: CreateApiKeyBody) {
  return apiRequest('/api/api-keys', { method: 'POST', body, schema: createApiKeyResponseSchema });
}

export function useCreateApiKey() {
  return useInvalidatingMutation(createApiKey, [apiKeysKeys.all], { after: 'success' });
}

/** POST /api/api-keys/:id/revoke: the key stops working at once. */
export async function revokeApiKey(id: string) {
  return apiRequest(`/api/api-keys/${encodeURIComponent(id)}/revoke`, { method: 'POST', schema: apiKeySchema });
}

export function useRevokeApiKey() {
  return useInvalidatingMutation(revokeApiKey, [apiKeysKeys.all]);
}
