import { queryOptions, useQuery } from '@tanstack/react-query';
import { templateListResponseSchema } from '../../../../shared/contracts/templates';
import { apiRequest } from '../../../lib/api-client';
import { publicationKeys } from './list-publications';

/** GET /api/templates, for the template choice. */
export async function listTemplateChoices(signal?: AbortSignal) {
  return (await apiRequest('/api/templates', { schema: templateListResponseSchema, signal })).templates;
}

export const templateChoicesQueryOptions = () => queryOptions({ queryKey: [...publicationKeys.all, 'templates'] as const, queryFn: ({ signal }) => listTemplateChoices(signal), staleTime: 300_000 });

export function useTemplateChoices() {
  return useQuery(templateChoicesQueryOptions());
}
