import { queryOptions, useQuery } from '@tanstack/react-query';
import { solveStatsSchema, type SolveStats } from '../../../../shared/contracts/reader';
import { apiRequest } from '../../../lib/api-client';

/** GET /api/reader/stats (editor): readers' starts, finishes, times and reveals per puzzle and per grade. */
export function getSolveStats(signal?: AbortSignal): Promise<SolveStats> {
  return apiRequest('/api/reader/stats', { schema: solveStatsSchema, signal });
}

/** Keys: ['reader'] (all), ['reader', 'stats'], ['reader', 'calibration'], ['reader', 'settings']. */
export const readerKeys = {
  all: ['reader'] as const,
  stats: () => [...readerKeys.all, 'stats'] as const,
  calibration: () => [...readerKeys.all, 'calibration'] as const,
  settings: () => [...readerKeys.all, 'settings'] as const,
};

export const solveStatsQueryOptions = () => queryOptions({ queryKey: readerKeys.stats(), queryFn: ({ signal }) => getSolveStats(signal) });

export function useSolveStats() {
  return useQuery(solveStatsQueryOptions());
}
