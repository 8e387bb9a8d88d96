import { queryOptions, useQuery } from '@tanstack/react-query';
import { adminUserListResponseSchema, type AdminUser } from '../../../../shared/contracts/users';
import { apiRequest } from '../../../lib/api-client';

/** GET /api/admin/users (admin): every account. */
export async function listUsers(signal?: AbortSignal): Promise<AdminUser[]> {
  const body = await apiRequest('/api/admin/users', { schema: adminUserListResponseSchema, signal });
  return body.users;
}

/** Keys: ['admin-users'] (all), ['admin-users', 'list'], ['admin-users', 'invitations']. */
export const usersKeys = { all: ['admin-users'] as const, list: () => [...usersKeys.all, 'list'] as const, invitations: () => [...usersKeys.all, 'invitations'] as const };

export const usersQueryOptions = () =>
  queryOptions({
    queryKey: usersKeys.list(),
    queryFn: ({ signal }) => listUsers(signal),
  });

export function useUsers() {
  return useQuery(usersQueryOptions());
}
