import { useMutation, useQueryClient } from '@tanstack/react-query';
import {
  acceptInvitationResponseSchema,
  type AcceptInvitationBody,
  type SessionUser,
} from '../../../../shared/contracts/auth';
import { meQueryOptions } from '../../../api/session';
import { apiRequest } from '../../../lib/api-client';

/** POST /api/invitations/:token/accept: sets name and password, and signs the new user in. */
export async function acceptInvitation(token: string, body: AcceptInvitationBody): Promise<SessionUser> {
  const res = await apiRequest(`/api/invitations/${encodeURIComponent(token)}/accept`, {
    method: 'POST',
    body,
    schema: acceptInvitationResponseSchema,
  });
  return res.user;
}

export function useAcceptInvitation(token: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: AcceptInvitationBody) => acceptInvitation(token, body),
    onSuccess: (user) => queryClient.setQueryData(meQueryOptions().queryKey, user),
  });
}
