import { queryOptions, useQuery } from '@tanstack/react-query';
import { meResponseSchema, type SessionUser } from '../../shared/contracts/auth';
import { apiRequest, isApiError } from '../lib/api-client';

// The session user is app-wide (the router's loader, the layout, and any feature that
// needs to know who is signed in), so its one endpoint file lives here, not in a feature.

/** Keys: ['session'] (all), ['session', 'me']. */
export const sessionKeys = { all: ['session'] as const, me: () => [...sessionKeys.all, 'me'] as const };

/** GET /api/me: the signed-in user, or null when there is no session (401). */
export async function getMe(signal?: AbortSignal): Promise<SessionUser | null> {
  try {
    const body = await apiRequest('/api/me', { schema: meResponseSchema, signal });
    return body.user;
  } catch (error) {
    if (isApiError(error, 401)) return null;
    throw error;
  }
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
