import { updateUserResponseSchema, type AdminUser, type UpdateUserBody } from '../../../../shared/contracts/users';
import { apiRequest } from '../../../lib/api-client';
import { useInvalidatingMutation } from '../../../lib/use-invalidating-mutation';
import { usersKeys } from './list-users';

/** PATCH /api/admin/users/:id (admin): change role and/or deactivate or reactivate. */
export async function updateUser(id: string, body: UpdateUserBody): Promise<AdminUser> {
  const res = await apiRequest(`/api/admin/users/${encodeURIComponent(id)}`, { method: 'PATCH', body, schema: updateUserResponseSchema });
  return res.user;
}

export function useUpdateUser() {
  return useInvalidatingMutation(({ id, ...body }: UpdateUserBody & { id: string }) => updateUser(id, body), [usersKeys.all]);
}
