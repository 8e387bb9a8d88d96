import { QueryClient } from '@tanstack/react-query';
import { ApiError } from './api-client';

/**
 * The app's QueryClient. Client errors (4xx: bad input, not signed in, wrong role,
 * not found) are final, so they are not retried; network trouble and 5xx are retried
 * twice. Tests build their own client with `retry: false`.
 */
export function createQueryClient(): QueryClient {
  return new QueryClient({
    defaultOptions: {
      queries: {
        staleTime: 30_000,
        refetchOnWindowFocus: false,
        retry: (failureCount, error) => {
          if (error instanceof ApiError && error.status >= 400 && error.status < 500) return false;
          return failureCount < 2;
        },
      },
      mutations: { retry: false },
    },
  });
}
