import { queryOptions, useQuery } from '@tanstack/react-query';
import { payoutsOverviewSchema, type PayoutsOverview } from '../../../../shared/contracts/payouts';
import { apiRequest } from '../../../lib/api-client';

/** GET /api/payouts (editor): owed per setter, runs and their payouts. */
export function getPayouts(signal?: AbortSignal): Promise<PayoutsOverview> {
  return apiRequest('/api/payouts', { schema: payoutsOverviewSchema, signal });
}

/** Keys: ['payouts'] (all), ['payouts', 'overview']. */
export const payoutsKeys = { all: ['payouts'] as const, overview: () => [...payoutsKeys.all, 'overview'] as const };

export const payoutsQueryOptions = () =>
  queryOptions({
    queryKey: payoutsKeys.overview(),
    queryFn: ({ signal }) => getPayouts(signal),
    // While a payout waits for the provider's confirmation, look again every 2 s.
    refetchInterval: (query) => (query.state.data?.runs.some((r) => r.payouts.some((p) => p.state === 'pending')) ? 2_000 : false),
  });

export function usePayouts() {
  return useQuery(payoutsQueryOptions());
}
