import { queryOptions, useQuery } from '@tanstack/react-query';
import type { SessionUser } from '../../shared/contracts/auth';
import { sessionResponseSchema } from '../../shared/contracts/users';
import { apiRequest } from '../lib/api-client';

// The session user is app-wide (the router's loader, the layout, and any feature that
// needs to know who is signed in), so its one endpoint file lives here, not in a feature.

/** Keys: ['session'] (all), ['session', 'me']. */
export const sessionKeys = { all: ['session'] as const, me: () => [...sessionKeys.all, 'me'] as const };

/**
 * GET /api/session: the signed-in user, or null when there is no session. (Not /api/me:
 * its 401 for a signed-out visitor shows as an error in the browser's console.)
 */
export async function getMe(signal?: AbortSignal): Promise<SessionUser | null> {
  const body = await apiRequest('/api/session', { schema: sessionResponseSchema, signal });
  return body.user;
}

/** Invalidate sessionKeys.me() (or clear the client) on sign-in and sign-out. */
export const meQueryOptions = () =>
  queryOptions({
    queryKey: sessionKeys.me(),
    queryFn: ({ signal }) => getMe(signal),
    staleTime: 60_000,
  });

export function useMe() {
  return useQuery(meQueryOptions());
}
