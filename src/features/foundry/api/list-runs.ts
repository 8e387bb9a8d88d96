import { queryOptions, useQuery } from '@tanstack/react-query';
import { runListSchema, type Run } from '../../../../shared/contracts/foundry';
import { apiRequest } from '../../../lib/api-client';

/** GET /api/foundry/runs (editor): runs, newest first, with progress. */
export async function listRuns(signal?: AbortSignal): Promise<Run[]> {
  const body = await apiRequest('/api/foundry/runs', { schema: runListSchema, signal });
  return body.items;
}

/** Keys: ['foundry'] (all), ['foundry', 'runs'], ['foundry', 'results', id, page]. */
export const foundryKeys = { all: ['foundry'] as const };

export function isActive(run: Run): boolean {
  return run.state === 'queued' || run.state === 'running';
}

export const runsQueryOptions = () =>
  queryOptions({
    queryKey: [...foundryKeys.all, 'runs'] as const,
    queryFn: ({ signal }) => listRuns(signal),
    // poll while something is queued or running
    refetchInterval: (q) => (q.state.data?.some(isActive) ? 1000 : false),
  });

export function useRuns() {
  return useQuery(runsQueryOptions());
}
