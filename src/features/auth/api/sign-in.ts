import type { SignInBody } from '../../../../shared/contracts/auth';
import { sessionKeys } from '../../../api/session';
import { authClient, authError } from '../../../lib/auth-client';
import { useInvalidatingMutation } from '../../../lib/use-invalidating-mutation';

/** POST /api/auth/sign-in/email through better-auth; throws ApiError with the server's message. */
export async function signIn(body: SignInBody): Promise<void> {
  const { error } = await authClient.signIn.email({ email: body.email, password: body.password });
  if (error) throw authError(error, 'sign_in_failed', 'Sign-in failed.');
}

/** Signs in, then reloads the session user. */
export function useSignIn() {
  return useInvalidatingMutation(signIn, [sessionKeys.me()], { after: 'success' });
}
