import { queryOptions, useQuery } from '@tanstack/react-query';
import { invitationLookupResponseSchema, type InvitationLookup } from '../../../../shared/contracts/auth';
import { apiRequest } from '../../../lib/api-client';

/** GET /api/invitations/:token (public): who the invitation is for, and whether it can still be used. */
export function getInvitation(token: string, signal?: AbortSignal): Promise<InvitationLookup> {
  return apiRequest(`/api/invitations/${encodeURIComponent(token)}`, { schema: invitationLookupResponseSchema, signal });
}

export const invitationQueryOptions = (token: string) =>
  queryOptions({
    queryKey: ['invitations', 'detail', token] as const,
    queryFn: ({ signal }) => getInvitation(token, signal),
  });

export function useInvitation(token: string) {
  return useQuery(invitationQueryOptions(token));
}
