import type { QueryClient } from '@tanstack/react-query';
import { redirect, type LoaderFunctionArgs } from 'react-router-dom';
import type { SessionUser } from '../../shared/contracts/auth';
import { meQueryOptions } from '../api/session';

/**
 * Loader of the signed-in part of the app: makes sure the session user is loaded and
 * sends anyone without a session to /sign-in?next=<where they were going>.
 */
export function requireSession(queryClient: QueryClient) {
  return async ({ request }: LoaderFunctionArgs): Promise<SessionUser> => {
    const user = await queryClient.ensureQueryData(meQueryOptions());
    if (!user) {
      const url = new URL(request.url);
      const next = `${url.pathname}${url.search}`;
      throw redirect(next === '/' ? '/sign-in' : `/sign-in?next=${encodeURIComponent(next)}`);
    }
    return user;
  };
}
