import { ledgerCorrectionResponseSchema, type LedgerCorrectionInput, type LedgerEntry } from '../../../../shared/contracts/ledger';
import { apiRequest } from '../../../lib/api-client';
import { useInvalidatingMutation } from '../../../lib/use-invalidating-mutation';
import { payoutsKeys } from './get-payouts';

/** POST /api/ledger/corrections (editor): a new entry with a reason; entries are never edited. */
export async function addCorrection(input: LedgerCorrectionInput): Promise<LedgerEntry> {
  const res = await apiRequest('/api/ledger/corrections', { method: 'POST', body: input, schema: ledgerCorrectionResponseSchema });
  return res.entry;
}

export function useAddCorrection() {
  return useInvalidatingMutation(addCorrection, [payoutsKeys.all]);
}
