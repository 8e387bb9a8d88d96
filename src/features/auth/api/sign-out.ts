import { useMutation, useQueryClient } from '@tanstack/react-query';
import { authClient, authError } from '../../../lib/auth-client';

/** POST /api/auth/sign-out through better-auth. */
export async function signOut(): Promise<void> {
  const { error } = await authClient.signOut();
  if (error) throw authError(error, 'sign_out_failed', 'Sign-out failed.');
}

/** Signs out and drops every cached query (nothing of the last user stays in memory). */
export function useSignOut() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signOut,
    onSuccess: () => queryClient.clear(),
  });
}
