import { queryOptions, useQuery } from '@tanstack/react-query';
import { templateListResponseSchema } from '../../shared/contracts/templates';
import { apiRequest } from '../lib/api-client';

// Read by the templates feature (admin) and the publications feature (the template choice).

/** Keys: ['templates'] (all), ['templates', 'list']. */
export const templateKeys = { all: ['templates'] as const, list: () => [...templateKeys.all, 'list'] as const };

/** GET /api/templates: every page template with its page size. */
export async function listTemplates(signal?: AbortSignal) {
  return (await apiRequest('/api/templates', { schema: templateListResponseSchema, signal })).templates;
}

export const templateListQueryOptions = () => queryOptions({ queryKey: templateKeys.list(), queryFn: ({ signal }) => listTemplates(signal), staleTime: 300_000 });

export function useTemplates() {
  return useQuery(templateListQueryOptions());
}
