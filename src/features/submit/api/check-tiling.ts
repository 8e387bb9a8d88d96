import { queryOptions, useQuery } from '@tanstack/react-query';
import { verdictSchema, type Verdict } from '../../../../shared/contracts/tilings';
import { apiRequest } from '../../../lib/api-client';

/** POST /api/tilings/check: the verdict for a code (stores nothing). */
export function checkTiling(code: string, signal?: AbortSignal): Promise<Verdict> {
  return apiRequest('/api/tilings/check', { method: 'POST', body: { code }, schema: verdictSchema, signal });
}

/** Keys: ['tilings'], ['tilings', 'check', code]. */
export const tilingKeys = { all: ['tilings'] as const, check: (code: string) => [...tilingKeys.all, 'check', code] as const };

export const checkTilingQueryOptions = (code: string) =>
  queryOptions({
    queryKey: tilingKeys.check(code),
    queryFn: ({ signal }) => checkTiling(code, signal),
    staleTime: 60_000,
  });

/** The verdict for a (debounced) code; idle while the code is empty. */
export function useCheckTiling(code: string) {
  return useQuery({ ...checkTilingQueryOptions(code), enabled: code.trim().length > 0 });
}
