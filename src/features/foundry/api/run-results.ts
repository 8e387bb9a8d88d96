import { queryOptions, useQuery } from '@tanstack/react-query';
import { runResultsSchema, runSchema } from '../../../../shared/contracts/foundry';
import { apiRequest } from '../../../lib/api-client';
import { foundryKeys, isActive } from './list-runs';

/** GET /api/foundry/runs/:id (editor). */
export async function getRun(id: string, signal?: AbortSignal) {
  return apiRequest(`/api/foundry/runs/${encodeURIComponent(id)}`, { schema: runSchema, signal });
}

/** GET /api/foundry/runs/:id/results (editor): the tilings a run found. */
export async function getRunResults(id: string, page: number, signal?: AbortSignal) {
  return apiRequest(`/api/foundry/runs/${encodeURIComponent(id)}/results`, { schema: runResultsSchema, query: { page, pageSize: 100 }, signal });
}

export const runQueryOptions = (id: string) =>
  queryOptions({
    queryKey: foundryKeys.run(id),
    queryFn: ({ signal }) => getRun(id, signal),
    refetchInterval: (q) => (q.state.data && isActive(q.state.data) ? 1000 : false),
  });

export const runResultsQueryOptions = (id: string, page: number) =>
  queryOptions({
    queryKey: foundryKeys.results(id, page),
    queryFn: ({ signal }) => getRunResults(id, page, signal),
  });

export function useRun(id: string) {
  return useQuery(runQueryOptions(id));
}

export function useRunResults(id: string, page: number, refetchWhileActive: boolean) {
  return useQuery({ ...runResultsQueryOptions(id, page), refetchInterval: refetchWhileActive ? 2000 : false });
}
