import { queryOptions, useQuery } from '@tanstack/react-query';
import { editionChecksSchema } from '../../../../shared/contracts/editions';
import { editionKeys } from '../../../api/editions';
import { apiRequest } from '../../../lib/api-client';

/** GET /api/editions/:id/checks (editor): the checks before proof, with a preflight. */
export function getChecks(id: string, signal?: AbortSignal) {
  return apiRequest(`/api/editions/${encodeURIComponent(id)}/checks`, { schema: editionChecksSchema, signal });
}

export const checksQueryOptions = (id: string) => queryOptions({ queryKey: editionKeys.checks(id), queryFn: ({ signal }) => getChecks(id, signal), staleTime: 0 });

export function useChecks(id: string) {
  return useQuery(checksQueryOptions(id));
}
