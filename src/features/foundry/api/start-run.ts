import { useMutation, useQueryClient } from '@tanstack/react-query';
import { runSchema, type RunRequest } from '../../../../shared/contracts/foundry';
import { apiRequest } from '../../../lib/api-client';
import { foundryKeys } from './list-runs';

/** POST /api/foundry/runs (editor): start a run in the worker pool. */
export async function startRun(body: RunRequest) {
  return apiRequest('/api/foundry/runs', { method: 'POST', body, schema: runSchema });
}

export function useStartRun() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: startRun,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: foundryKeys.all }),
  });
}
