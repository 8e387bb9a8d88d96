import { queryOptions, useQuery } from '@tanstack/react-query';
import { pressSpecResponseSchema, type PressSpecInput } from '../../../../shared/contracts/press';
import { publicationPrinterChoicesSchema, publicationPrintersSchema } from '../../../../shared/contracts/publications';
import { publicationKeys } from '../../../api/publications';
import { apiRequest } from '../../../lib/api-client';
import { useInvalidatingMutation } from '../../../lib/use-invalidating-mutation';

// A publication's press spec (standard, output condition, bleed, smallest type, thinnest
// line, the plant's ICC profile) and its printers, edited by admins on the publications page.
// Saving refreshes these and the publications list (which shows the printers).

/** Keys: ['press'] (all), ['press', 'spec', id], ['press', 'printers', id]. */
export const pressKeys = {
  all: ['press'] as const,
  spec: (id: string) => [...pressKeys.all, 'spec', id] as const,
  printers: (id: string) => [...pressKeys.all, 'printers', id] as const,
};

/** GET /api/publications/:id/press-spec. */
export function getPressSpec(id: string, signal?: AbortSignal) {
  return apiRequest(`/api/publications/${encodeURIComponent(id)}/press-spec`, { schema: pressSpecResponseSchema, signal });
}
export const pressSpecQueryOptions = (id: string) => queryOptions({ queryKey: pressKeys.spec(id), queryFn: ({ signal }) => getPressSpec(id, signal) });
export function usePressSpec(id: string) {
  return useQuery(pressSpecQueryOptions(id));
}

/** GET /api/publications/:id/printers (admin). */
export function getPrinterChoices(id: string, signal?: AbortSignal) {
  return apiRequest(`/api/publications/${encodeURIComponent(id)}/printers`, { schema: publicationPrinterChoicesSchema, signal });
}
export const printerChoicesQueryOptions = (id: string) => queryOptions({ queryKey: pressKeys.printers(id), queryFn: ({ signal }) => getPrinterChoices(id, signal) });
export function usePrinterChoices(id: string) {
  return useQuery(printerChoicesQueryOptions(id));
}

/** PUT /api/publications/:id/press-spec (admin). */
export function useSavePressSpec(id: string) {
  return useInvalidatingMutation((spec: PressSpecInput) => apiRequest(`/api/publications/${encodeURIComponent(id)}/press-spec`, { method: 'PUT', body: spec, schema: pressSpecResponseSchema }), [pressKeys.all, publicationKeys.all]);
}

/** PUT /api/publications/:id/output-profile (admin, multipart field "file"). */
export function useUploadOutputProfile(id: string) {
  return useInvalidatingMutation((file: File) => {
    const form = new FormData();
    form.append('file', file);
    return apiRequest(`/api/publications/${encodeURIComponent(id)}/output-profile`, { method: 'PUT', body: form, schema: pressSpecResponseSchema });
  }, [pressKeys.all, publicationKeys.all]);
}

/** PUT /api/publications/:id/printers (admin). */
export function useSavePrinters(id: string) {
  return useInvalidatingMutation((userIds: string[]) => apiRequest(`/api/publications/${encodeURIComponent(id)}/printers`, { method: 'PUT', body: { userIds }, schema: publicationPrintersSchema }), [pressKeys.all, publicationKeys.all]);
}
