import { useQueryClient } from '@tanstack/react-query';
import { useEffect } from 'react';
import { useLocation, useNavigate } from 'react-router-dom';
import { isApiError } from '../lib/api-client';

/**
 * Inside the signed-in app: when any query or mutation is answered 401 (the session
 * expired or was revoked), drop the cache and go to sign-in, coming back here after.
 * Lives in React (not in the fetchers), so fetchers stay pure.
 */
export function useSessionExpiry(): void {
  const queryClient = useQueryClient();
  const navigate = useNavigate();
  const location = useLocation();
  const here = `${location.pathname}${location.search}`;
  useEffect(() => {
    let done = false;
    const expire = (error: unknown) => {
      if (done || !isApiError(error, 401)) return;
      done = true;
      queryClient.clear();
      navigate(`/sign-in?next=${encodeURIComponent(here)}`, { replace: true });
    };
    const unsubQueries = queryClient.getQueryCache().subscribe((event) => {
      if (event.type === 'updated' && event.action.type === 'error') expire(event.action.error);
    });
    const unsubMutations = queryClient.getMutationCache().subscribe((event) => {
      if (event.type === 'updated' && event.action.type === 'error') expire(event.action.error);
    });
    return () => {
      unsubQueries();
      unsubMutations();
    };
  }, [queryClient, navigate, here]);
}
