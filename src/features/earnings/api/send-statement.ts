import { useMutation } from '@tanstack/react-query';
import { z } from 'zod';
import { statementSendResponseSchema } from '../../../../shared/contracts/ledger';
import { apiRequest } from '../../../lib/api-client';

export type StatementSent = z.infer<typeof statementSendResponseSchema>;

/** POST /api/earnings/statements/:month/send (setter): mail me my statement. */
export function sendStatement(month: string): Promise<StatementSent> {
  return apiRequest(`/api/earnings/statements/${encodeURIComponent(month)}/send`, { method: 'POST', schema: statementSendResponseSchema });
}

export function useSendStatement() {
  return useMutation({ mutationFn: sendStatement });
}
