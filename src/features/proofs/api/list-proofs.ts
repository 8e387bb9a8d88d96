import { useQuery } from '@tanstack/react-query';
import { editionListQueryOptions } from '../../../api/editions';

/**
 * GET /api/editions as a printer sees it (only editions sent to proof), through the shared
 * edition list factory; always refetched on mount, as a proof may have arrived meanwhile.
 */
export function useSentEditions() {
  return useQuery({ ...editionListQueryOptions({}), staleTime: 0 });
}
