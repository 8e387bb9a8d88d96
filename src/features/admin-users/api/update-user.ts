import { useMutation, useQueryClient } from '@tanstack/react-query';
import { updateUserResponseSchema, type AdminUser, type UpdateUserBody } from '../../../../shared/contracts/users';
import { apiRequest } from '../../../lib/api-client';
import { usersKeys } from './list-users';

/** PATCH /api/admin/users/:id (admin): change role and/or deactivate or reactivate. */
export async function updateUser(id: string, body: UpdateUserBody): Promise<AdminUser> {
  const res = await apiRequest(`/api/admin/users/${encodeURIComponent(id)}`, { method: 'PATCH', body, schema: updateUserResponseSchema });
  return res.user;
}

export function useUpdateUser() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, ...body }: UpdateUserBody & { id: string }) => updateUser(id, body),
    onSettled: () => queryClient.invalidateQueries({ queryKey: usersKeys.all }),
  });
}
