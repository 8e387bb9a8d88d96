import { createPayoutRunResponseSchema, type CreatePayoutRunInput, type CreatePayoutRunResponse } from '../../../../shared/contracts/payouts';
import { apiRequest } from '../../../lib/api-client';
import { useInvalidatingMutation } from '../../../lib/use-invalidating-mutation';
import { payoutsKeys } from './get-payouts';

/** POST /api/payouts/runs (editor). The same requestKey never pays twice. */
export function createPayoutRun(input: CreatePayoutRunInput): Promise<CreatePayoutRunResponse> {
  return apiRequest('/api/payouts/runs', { method: 'POST', body: input, schema: createPayoutRunResponseSchema });
}

export function useCreatePayoutRun() {
  return useInvalidatingMutation(createPayoutRun, [payoutsKeys.all]);
}
