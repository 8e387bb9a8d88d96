import { queryOptions, useQuery } from '@tanstack/react-query';
import { runListSchema, type Run } from '../../../../shared/contracts/foundry';
import { apiRequest } from '../../../lib/api-client';

/** GET /api/foundry/runs (editor): runs, newest first, with progress. */
export async function listRuns(signal?: AbortSignal): Promise<Run[]> {
  const body = await apiRequest('/api/foundry/runs', { schema: runListSchema, signal });
  return body.items;
}

/** Keys: ['foundry'] (all), ['foundry', 'runs'], ['foundry', 'run', id], ['foundry', 'results', id, page]. */
export const foundryKeys = {
  all: ['foundry'] as const,
  runs: () => [...foundryKeys.all, 'runs'] as const,
  run: (id: string) => [...foundryKeys.all, 'run', id] as const,
  results: (id: string, page: number) => [...foundryKeys.all, 'results', id, page] as const,
};

export function isActive(run: Run): boolean {
  return run.state === 'queued' || run.state === 'running';
}

export const runsQueryOptions = () =>
  queryOptions({
    queryKey: foundryKeys.runs(),
    queryFn: ({ signal }) => listRuns(signal),
    // poll while something is queued or running
    refetchInterval: (q) => (q.state.data?.some(isActive) ? 1000 : false),
  });

export function useRuns() {
  return useQuery(runsQueryOptions());
}
