import { queryOptions, useQuery } from '@tanstack/react-query';
import { earningsSchema, type Earnings } from '../../../../shared/contracts/payouts';
import { apiRequest } from '../../../lib/api-client';

/** GET /api/earnings (setter): my entries, statements, payouts and payout details. */
export function getEarnings(signal?: AbortSignal): Promise<Earnings> {
  return apiRequest('/api/earnings', { schema: earningsSchema, signal });
}

/** Keys: ['earnings'] (all), ['earnings', 'summary'], ['earnings', 'statement', month]. */
export const earningsKeys = {
  all: ['earnings'] as const,
  summary: () => [...earningsKeys.all, 'summary'] as const,
  statement: (month: string) => [...earningsKeys.all, 'statement', month] as const,
};

export const earningsQueryOptions = () =>
  queryOptions({
    queryKey: earningsKeys.summary(),
    queryFn: ({ signal }) => getEarnings(signal),
    refetchInterval: (query) => (query.state.data?.payouts.some((p) => p.state === 'pending') ? 3_000 : false),
  });

export function useEarnings() {
  return useQuery(earningsQueryOptions());
}
