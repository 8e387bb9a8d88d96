import { runSchema } from '../../../../shared/contracts/foundry';
import { apiRequest } from '../../../lib/api-client';
import { useInvalidatingMutation } from '../../../lib/use-invalidating-mutation';
import { foundryKeys } from './list-runs';

/** POST /api/foundry/runs/:id/cancel (editor). */
export async function cancelRun(id: string) {
  return apiRequest(`/api/foundry/runs/${encodeURIComponent(id)}/cancel`, { method: 'POST', schema: runSchema });
}

export function useCancelRun() {
  return useInvalidatingMutation(cancelRun, [foundryKeys.all]);
}

/** POST /api/foundry/runs/:id/retry (editor): an interrupted, failed or cancelled run again; resume keeps its finished shards. */
export async function retryRun({ id, how }: { id: string; how: 'resume' | 'restart' }) {
  return apiRequest(`/api/foundry/runs/${encodeURIComponent(id)}/retry`, { method: 'POST', body: { how }, schema: runSchema });
}

export function useRetryRun() {
  return useInvalidatingMutation(retryRun, [foundryKeys.all]);
}
