import { queryOptions, useQuery } from '@tanstack/react-query';
import { publicConfigResponseSchema, type PublicConfig } from '../../../../shared/contracts/auth';
import { apiRequest } from '../../../lib/api-client';

/** GET /api/public/config: whether this is a demo database, and its demo sign-ins. */
export function getPublicConfig(signal?: AbortSignal): Promise<PublicConfig> {
  return apiRequest('/api/public/config', { schema: publicConfigResponseSchema, signal });
}

/** Key: ['public-config']. */
export const publicConfigKeys = { all: ['public-config'] as const };

export const publicConfigQueryOptions = () =>
  queryOptions({
    queryKey: publicConfigKeys.all,
    queryFn: ({ signal }) => getPublicConfig(signal),
    staleTime: Infinity,
  });

export function usePublicConfig() {
  return useQuery(publicConfigQueryOptions());
}
