import { payoutResponseSchema, type Payout } from '../../../../shared/contracts/payouts';
import { apiRequest } from '../../../lib/api-client';
import { useInvalidatingMutation } from '../../../lib/use-invalidating-mutation';
import { payoutsKeys } from './get-payouts';

/** POST /api/payouts/:id/retry (editor): a failed payout, as a new attempt. */
export async function retryPayout(id: string): Promise<Payout> {
  const res = await apiRequest(`/api/payouts/${encodeURIComponent(id)}/retry`, { method: 'POST', schema: payoutResponseSchema });
  return res.payout;
}

export function useRetryPayout() {
  return useInvalidatingMutation(retryPayout, [payoutsKeys.all]);
}
