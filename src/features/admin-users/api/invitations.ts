import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { invitationListResponseSchema, resendInvitationResponseSchema } from '../../../../shared/contracts/users';
import { apiRequest } from '../../../lib/api-client';
import { useInvalidatingMutation } from '../../../lib/use-invalidating-mutation';
import { usersKeys } from './list-users';

/** GET /api/invitations (admin): invitations not yet accepted. */
export async function listInvitations(signal?: AbortSignal) {
  const body = await apiRequest('/api/invitations', { schema: invitationListResponseSchema, signal });
  return body.invitations;
}

export const invitationsQueryOptions = () => queryOptions({ queryKey: usersKeys.invitations(), queryFn: ({ signal }) => listInvitations(signal) });

export function useInvitations() {
  return useQuery(invitationsQueryOptions());
}

/** POST /api/invitations/:id/resend (admin): a new link for another week. */
export async function resendInvitation(id: string) {
  const body = await apiRequest(`/api/invitations/${encodeURIComponent(id)}/resend`, { method: 'POST', schema: resendInvitationResponseSchema });
  return body.invitation;
}

/** POST /api/invitations/:id/revoke (admin): the link stops working. */
export async function revokeInvitation(id: string) {
  await apiRequest(`/api/invitations/${encodeURIComponent(id)}/revoke`, { method: 'POST', schema: z.undefined() });
}

export function useResendInvitation() {
  return useInvalidatingMutation(resendInvitation, [usersKeys.all]);
}

export function useRevokeInvitation() {
  return useInvalidatingMutation(revokeInvitation, [usersKeys.all]);
}
