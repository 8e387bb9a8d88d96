import { useMutation, useQueryClient } from '@tanstack/react-query';
import { runSchema } from '../../../../shared/contracts/foundry';
import { apiRequest } from '../../../lib/api-client';
import { foundryKeys } from './list-runs';

/** POST /api/foundry/runs/:id/cancel (editor). */
export async function cancelRun(id: string) {
  return apiRequest(`/api/foundry/runs/${encodeURIComponent(id)}/cancel`, { method: 'POST', schema: runSchema });
}

export function useCancelRun() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: cancelRun,
    onSettled: () => queryClient.invalidateQueries({ queryKey: foundryKeys.all }),
  });
}
