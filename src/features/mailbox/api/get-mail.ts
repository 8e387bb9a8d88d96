import { queryOptions, useQuery } from '@tanstack/react-query';
import { mailboxMessageResponseSchema } from '../../../../shared/contracts/users';
import { apiRequest } from '../../../lib/api-client';
import { mailboxKeys } from './list-mail';

/** GET /api/mailbox/:id (admin): one caught mail with its text and HTML. */
export async function getMail(id: string, signal?: AbortSignal) {
  const body = await apiRequest(`/api/mailbox/${encodeURIComponent(id)}`, { schema: mailboxMessageResponseSchema, signal });
  return body.message;
}

export const mailQueryOptions = (id: string) =>
  queryOptions({
    queryKey: mailboxKeys.detail(id),
    queryFn: ({ signal }) => getMail(id, signal),
  });

export function useMail(id: string) {
  return useQuery(mailQueryOptions(id));
}
