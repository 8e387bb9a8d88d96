import { useMutation } from '@tanstack/react-query';
import { ApiError } from '../../../lib/api-client';
import { authClient } from '../../../lib/auth-client';

/**
 * POST /api/auth/request-password-reset through better-auth. The mail links back to
 * /reset-password?token=...; the answer is the same whether or not the address exists.
 */
export async function requestPasswordReset(email: string): Promise<void> {
  const { error } = await authClient.requestPasswordReset({ email, redirectTo: '/reset-password' });
  if (error) throw new ApiError(error.status ?? 400, error.code ?? 'reset_failed', error.message ?? 'Could not send the reset mail.');
}

export function useRequestPasswordReset() {
  return useMutation({ mutationFn: requestPasswordReset });
}
