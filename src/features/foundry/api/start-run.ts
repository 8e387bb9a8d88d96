import { runSchema, type RunRequest } from '../../../../shared/contracts/foundry';
import { apiRequest } from '../../../lib/api-client';
import { useInvalidatingMutation } from '../../../lib/use-invalidating-mutation';
import { foundryKeys } from './list-runs';

/** POST /api/foundry/runs (editor): start a run in the worker pool. */
export async function startRun(body: RunRequest) {
  return apiRequest('/api/foundry/runs', { method: 'POST', body, schema: runSchema });
}

export function useStartRun() {
  return useInvalidatingMutation(startRun, [foundryKeys.all], { after: 'success' });
}
