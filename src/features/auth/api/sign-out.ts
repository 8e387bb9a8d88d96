import { useMutation, useQueryClient } from '@tanstack/react-query';
import { ApiError } from '../../../lib/api-client';
import { authClient } from '../../../lib/auth-client';

/** POST /api/auth/sign-out through better-auth. */
export async function signOut(): Promise<void> {
  const { error } = await authClient.signOut();
  if (error) throw new ApiError(error.status ?? 500, error.code ?? 'sign_out_failed', error.message ?? 'Sign-out failed.');
}

/** Signs out and drops every cached query (nothing of the last user stays in memory). */
export function useSignOut() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signOut,
    onSuccess: () => queryClient.clear(),
  });
}
