import { useMutation } from '@tanstack/react-query';
import { authClient, authError } from '../../../lib/auth-client';

/** POST /api/auth/reset-password through better-auth: a new password for the token from the mail. */
export async function resetPassword(input: { token: string; newPassword: string }): Promise<void> {
  const { error } = await authClient.resetPassword({ token: input.token, newPassword: input.newPassword });
  if (error) throw authError(error, 'reset_failed', 'Could not set the new password.');
}

export function useResetPassword() {
  return useMutation({ mutationFn: resetPassword });
}
