import { z } from 'zod';
import { payoutDetailsResponseSchema, type PayoutDetailsInput } from '../../../../shared/contracts/payouts';
import { apiRequest } from '../../../lib/api-client';
import { useInvalidatingMutation } from '../../../lib/use-invalidating-mutation';
import { earningsKeys } from './get-earnings';

export type PayoutDetailsStarted = z.infer<typeof payoutDetailsResponseSchema>;

/** POST /api/earnings/payout-details (setter): get a link to the provider's page for bank details. */
export function startPayoutDetails(input: PayoutDetailsInput): Promise<PayoutDetailsStarted> {
  return apiRequest('/api/earnings/payout-details', { method: 'POST', body: input, schema: payoutDetailsResponseSchema });
}

export function useStartPayoutDetails() {
  return useInvalidatingMutation(startPayoutDetails, [earningsKeys.all]);
}
