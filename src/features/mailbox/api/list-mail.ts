import { queryOptions, useQuery } from '@tanstack/react-query';
import { mailboxListResponseSchema } from '../../../../shared/contracts/users';
import { apiRequest } from '../../../lib/api-client';

/** GET /api/mailbox (admin): what the local fake mail server caught, newest first. */
export async function listMail(signal?: AbortSignal) {
  const body = await apiRequest('/api/mailbox', { schema: mailboxListResponseSchema, signal });
  return body.messages;
}

/** Keys: ['mailbox'] (all), ['mailbox', 'list'], ['mailbox', 'detail', id]. */
export const mailboxKeys = {
  all: ['mailbox'] as const,
  list: () => [...mailboxKeys.all, 'list'] as const,
  detail: (id: string) => [...mailboxKeys.all, 'detail', id] as const,
};

export const mailListQueryOptions = () =>
  queryOptions({
    queryKey: mailboxKeys.list(),
    queryFn: ({ signal }) => listMail(signal),
    staleTime: 0,
  });

export function useMailList() {
  return useQuery({ ...mailListQueryOptions(), refetchInterval: 5_000 });
}
