import { queryOptions, useQuery } from '@tanstack/react-query';
import { stockDetailSchema, type StockDetail } from '../../../../shared/contracts/stock';
import { apiRequest } from '../../../lib/api-client';
import { stockKeys } from './list-stock';

/** GET /api/stock/:id: drawing and Smith diagram data, codes, class, provenance, history. */
export function getStock(id: number, signal?: AbortSignal): Promise<StockDetail> {
  return apiRequest(`/api/stock/${id}`, { schema: stockDetailSchema, signal });
}

export const stockDetailQueryOptions = (id: number) =>
  queryOptions({ queryKey: stockKeys.detail(id), queryFn: ({ signal }) => getStock(id, signal) });

export function useStockDetail(id: number) {
  return useQuery(stockDetailQueryOptions(id));
}
