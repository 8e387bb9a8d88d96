import { queryOptions, useQuery } from '@tanstack/react-query';
import { dueEditionsSchema } from '../../../../shared/contracts/editions';
import { editionKeys } from '../../../api/editions';
import { apiRequest } from '../../../lib/api-client';

/** GET /api/editions/due (editor): editions due within two weeks or overdue, with what each still needs. */
export function getDueEditions(signal?: AbortSignal) {
  return apiRequest('/api/editions/due', { schema: dueEditionsSchema, signal });
}

export const dueEditionsQueryOptions = () => queryOptions({ queryKey: editionKeys.due(), queryFn: ({ signal }) => getDueEditions(signal) });

export function useDueEditions() {
  return useQuery(dueEditionsQueryOptions());
}
