import { useMutation } from '@tanstack/react-query';
import { authClient, authError } from '../../../lib/auth-client';

/**
 * POST /api/auth/request-password-reset through better-auth. The mail links back to
 * /reset-password?token=...; the answer is the same whether or not the address exists.
 */
export async function requestPasswordReset(email: string): Promise<void> {
  const { error } = await authClient.requestPasswordReset({ email, redirectTo: '/reset-password' });
  if (error) throw authError(error, 'reset_failed', 'Could not send the reset mail.');
}

export function useRequestPasswordReset() {
  return useMutation({ mutationFn: requestPasswordReset });
}
