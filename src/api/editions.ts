import { queryOptions, useQuery } from '@tanstack/react-query';
import { editionListSchema, editionSchema, printerEditionSchema, type EditionListQuery } from '../../shared/contracts/editions';
import { apiRequest } from '../lib/api-client';
import { puzzleKeys } from './puzzles';

// Editions are read by the editions feature (editors) and the proofs feature (printers), so
// their keys and their shared endpoints live here; both features invalidate through editionKeys.

/**
 * Keys: ['editions'] (all), ['editions', 'list', filters], ['editions', 'detail', id],
 * ['editions', 'detail', id, 'printer'], ['editions', 'checks', id], ['editions', 'publish-check', id],
 * ['editions', 'due'].
 */
export const editionKeys = {
  all: ['editions'] as const,
  lists: () => [...editionKeys.all, 'list'] as const,
  list: (filters: EditionListQuery) => [...editionKeys.lists(), filters] as const,
  detail: (id: string) => [...editionKeys.all, 'detail', id] as const,
  printerDetail: (id: string) => [...editionKeys.detail(id), 'printer'] as const,
  checks: (id: string) => [...editionKeys.all, 'checks', id] as const,
  publishCheck: (id: string) => [...editionKeys.all, 'publish-check', id] as const,
  due: () => [...editionKeys.all, 'due'] as const,
};

/**
 * What an editor's change to an edition makes stale: every edition query, and the puzzle
 * lists, whose "used in" (shown by the slot picker) follows the slots.
 */
export const editionChangeKeys = () => [editionKeys.all, puzzleKeys.lists()];

/** GET /api/editions: editions with their state and latest proof (a printer sees only those sent to proof). */
export async function listEditions(filters: EditionListQuery, signal?: AbortSignal) {
  const body = await apiRequest('/api/editions', { schema: editionListSchema, query: filters, signal });
  return body.items;
}

export const editionListQueryOptions = (filters: EditionListQuery) =>
  queryOptions({ queryKey: editionKeys.list(filters), queryFn: ({ signal }) => listEditions(filters, signal) });

export function useEditions(filters: EditionListQuery) {
  return useQuery(editionListQueryOptions(filters));
}

/** GET /api/editions/:id as an editor reads it: slots, introduction, proofs and press file. */
export function getEdition(id: string, signal?: AbortSignal) {
  return apiRequest(`/api/editions/${encodeURIComponent(id)}`, { schema: editionSchema, signal });
}

/** GET /api/editions/:id as a printer reads it: the files and their history. */
export function getPrinterEdition(id: string, signal?: AbortSignal) {
  return apiRequest(`/api/editions/${encodeURIComponent(id)}`, { schema: printerEditionSchema, signal });
}

export const editionQueryOptions = (id: string) => queryOptions({ queryKey: editionKeys.detail(id), queryFn: ({ signal }) => getEdition(id, signal) });

export const printerEditionQueryOptions = (id: string) =>
  queryOptions({ queryKey: editionKeys.printerDetail(id), queryFn: ({ signal }) => getPrinterEdition(id, signal) });

export function useEdition(id: string) {
  return useQuery(editionQueryOptions(id));
}

export function usePrinterEdition(id: string) {
  return useQuery(printerEditionQueryOptions(id));
}
