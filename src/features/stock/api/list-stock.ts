import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { stockListSchema, stockSummarySchema, type StockList, type StockSummary } from '../../../../shared/contracts/stock';
import { stockKeys } from '../../../api/stock';
import { apiRequest, buildUrl, type QueryValue } from '../../../lib/api-client';

/** GET /api/stock (editor): filters, sort and page as query parameters. */
export function listStock(search: Record<string, QueryValue>, signal?: AbortSignal): Promise<StockList> {
  return apiRequest('/api/stock', { query: search, schema: stockListSchema, signal });
}

/** GET /api/stock/summary: counts by order (and grade). */
export function getStockSummary(signal?: AbortSignal): Promise<StockSummary> {
  return apiRequest('/api/stock/summary', { schema: stockSummarySchema, signal });
}

export const stockListQueryOptions = (search: Record<string, QueryValue>) =>
  queryOptions({ queryKey: stockKeys.list(search), queryFn: ({ signal }) => listStock(search, signal), placeholderData: keepPreviousData });

export const stockSummaryQueryOptions = () => queryOptions({ queryKey: stockKeys.summary(), queryFn: ({ signal }) => getStockSummary(signal) });

export function useStockList(search: Record<string, QueryValue>) {
  return useQuery(stockListQueryOptions(search));
}

export function useStockSummary() {
  return useQuery(stockSummaryQueryOptions());
}

/** Link to an export of the filtered selection (the browser downloads it with the session cookie). */
export function stockExportUrl(kind: 'csv' | 'txt', filters: Record<string, QueryValue>): string {
  return buildUrl(`/api/stock/export.${kind}`, filters);
}
