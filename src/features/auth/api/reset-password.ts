import { useMutation } from '@tanstack/react-query';
import { ApiError } from '../../../lib/api-client';
import { authClient } from '../../../lib/auth-client';

/** POST /api/auth/reset-password through better-auth: a new password for the token from the mail. */
export async function resetPassword(input: { token: string; newPassword: string }): Promise<void> {
  const { error } = await authClient.resetPassword({ token: input.token, newPassword: input.newPassword });
  if (error) throw new ApiError(error.status ?? 400, error.code ?? 'reset_failed', error.message ?? 'Could not set the new password.');
}

export function useResetPassword() {
  return useMutation({ mutationFn: resetPassword });
}
