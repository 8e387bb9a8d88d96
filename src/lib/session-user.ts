import { queryOptions, useQuery } from '@tanstack/react-query';
import { meResponseSchema, type SessionUser } from '../../shared/contracts/auth';
import { apiRequest, isApiError } from './api-client';

// The session user is app-wide (the router's loader, the layout, and any feature that
// needs to know who is signed in), so its one endpoint file lives in lib/, not in a feature.

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

/** Key ['session', 'me']; invalidate it (or clear the client) on sign-in and sign-out. */
export const meQueryOptions = () =>
  queryOptions({
    queryKey: ['session', 'me'] as const,
    queryFn: ({ signal }) => getMe(signal),
    staleTime: 60_000,
  });

export function useMe() {
  return useQuery(meQueryOptions());
}
