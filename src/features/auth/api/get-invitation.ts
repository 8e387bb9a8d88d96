import { queryOptions, useQuery } from '@tanstack/react-query';
import { invitationLookupResponseSchema, type InvitationLookup } from '../../../../shared/contracts/auth';
import { apiRequest } from '../../../lib/api-client';

/** GET /api/invitations/:token (public): who the invitation is for, and whether it can still be used. */
export function getInvitation(token: string, signal?: AbortSignal): Promise<InvitationLookup> {
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
