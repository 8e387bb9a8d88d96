import { useMutation, useQueryClient } from '@tanstack/react-query';
import { createInvitationResponseSchema, type CreateInvitationBody } from '../../../../shared/contracts/auth';
import { apiRequest } from '../../../lib/api-client';
import { usersKeys } from './list-users';

/** POST /api/invitations (admin): mails a one-time sign-up link for the given role. */
export async function inviteUser(body: CreateInvitationBody) {
  const res = await apiRequest('/api/invitations', { method: 'POST', body, schema: createInvitationResponseSchema });
  return res.invitation;
}

export function useInviteUser() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: inviteUser,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: usersKeys.all }),
  });
}
