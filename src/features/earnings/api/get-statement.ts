import { queryOptions, useQuery } from '@tanstack/react-query';
import { statementSchema, type Statement } from '../../../../shared/contracts/ledger';
import { apiRequest } from '../../../lib/api-client';
import { earningsKeys } from './get-earnings';

/** GET /api/earnings/statements/:month (setter). */
export function getStatement(month: string, signal?: AbortSignal): Promise<Statement> {
  return apiRequest(`/api/earnings/statements/${encodeURIComponent(month)}`, { schema: statementSchema, signal });
}

/** Where the CSV of a month is downloaded from (a plain link; the browser saves it). */
export function statementCsvUrl(month: string): string {
  return `/api/earnings/statements/${encodeURIComponent(month)}.csv`;
}

export const statementQueryOptions = (month: string) =>
  queryOptions({
    queryKey: earningsKeys.statement(month),
    queryFn: ({ signal }) => getStatement(month, signal),
  });

export function useStatement(month: string | null) {
  return useQuery({ ...statementQueryOptions(month ?? ''), enabled: month !== null });
}
