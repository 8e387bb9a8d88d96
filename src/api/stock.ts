import { queryOptions, useQuery } from '@tanstack/react-query';
import { stockDetailSchema, type StockDetail } from '../../shared/contracts/stock';
import { apiRequest, type QueryValue } from '../lib/api-client';

// A stock tiling is read by the stock feature and by the puzzles feature (the tiling a new
// puzzle is made from); accepting a submission (review feature) invalidates the stock.

/** Keys: ['stock'] (all), ['stock', 'list', search], ['stock', 'summary'], ['stock', 'detail', id]. */
export const stockKeys = {
  all: ['stock'] as const,
  lists: () => [...stockKeys.all, 'list'] as const,
  list: (search: Record<string, QueryValue>) => [...stockKeys.lists(), search] as const,
  summary: () => [...stockKeys.all, 'summary'] as const,
  detail: (id: number) => [...stockKeys.all, 'detail', id] as const,
};

/** GET /api/stock/:id (editor): drawing and Smith diagram data, codes, class, provenance, history. */
export function getStock(id: number, signal?: AbortSignal): Promise<StockDetail> {
  return apiRequest(`/api/stock/${id}`, { schema: stockDetailSchema, signal });
}

export const stockDetailQueryOptions = (id: number) => queryOptions({ queryKey: stockKeys.detail(id), queryFn: ({ signal }) => getStock(id, signal) });

/** One stock tiling; idle while `id` is null. */
export function useStockDetail(id: number | null) {
  return useQuery({ ...stockDetailQueryOptions(id ?? 0), enabled: id !== null });
}
