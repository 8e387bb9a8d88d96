import { queryOptions, useQuery } from '@tanstack/react-query';
import { invitationLookupResponseSchema, invitationTokenParamSchema, type InvitationLookup } from '../../../../shared/contracts/auth';
import { ApiError, apiRequest } from '../../../lib/api-client';

/**
 * GET /api/invitations/:token (public): who the invitation is for, and whether it can still be used.
 * A link whose token cannot be one of ours (the route's own rule) is not asked about: the answer
 * would be a 400, a failed request in the browser's console, for a link that was cut or mistyped.
 */
export async function getInvitation(token: string, signal?: AbortSignal): Promise<InvitationLookup> {
  if (!invitationTokenParamSchema.safeParse({ token }).success) throw new ApiError(404, 'not_found', 'This invitation link is not known.');
  return apiRequest(`/api/invitations/${encodeURIComponent(token)}`, { schema: invitationLookupResponseSchema, signal });
}

/** Keys: ['invitations'] (all), ['invitations', 'detail', token]. */
export const invitationKeys = { all: ['invitations'] as const, detail: (token: string) => [...invitationKeys.all, 'detail', token] as const };

export const invitationQueryOptions = (token: string) =>
  queryOptions({
    queryKey: invitationKeys.detail(token),
    queryFn: ({ signal }) => getInvitation(token, signal),
  });

export function useInvitation(token: string) {
  return useQuery(invitationQueryOptions(token));
}
