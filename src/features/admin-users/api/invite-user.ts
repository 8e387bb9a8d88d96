import { createInvitationResponseSchema, type CreateInvitationBody } from '../../../../shared/contracts/auth';
import { apiRequest } from '../../../lib/api-client';
import { useInvalidatingMutation } from '../../../lib/use-invalidating-mutation';
import { usersKeys } from './list-users';

/** POST /api/invitations (admin): mails a one-time sign-up link for the given role. */
export async function inviteUser(body: CreateInvitationBody) {
  const res = await apiRequest('/api/invitations', { method: 'POST', body, schema: createInvitationResponseSchema });
  return res.invitation;
}

export function useInviteUser() {
  return useInvalidatingMutation(inviteUser, [usersKeys.all], { after: 'success' });
}
