import { idParamsSchema } from '../../shared/contracts/submissions';
import { stockDetailSchema, stockExportQuerySchema, stockListQuerySchema, stockListSchema, stockSummarySchema } from '../../shared/contracts/stock';
import type { AppDeps } from '../deps';
import { route, type ApiRouter } from '../http/route';
import { exportStock, getStockDetail, listStock, stockCodeFile, stockCsv, stockSummary } from '../services/stock';

export function registerStockRoutes(router: ApiRouter, deps: AppDeps) {
  const tags = ['stock'];

  route(
    router,
    { method: 'GET', path: '/api/stock', summary: 'Stock tilings filtered by order, size, class, provenance, use and setter; sorted and paged', tags, query: stockListQuerySchema, response: stockListSchema },
    ({ query }) => listStock(deps.db, query),
  );

  route(
    router,
    { method: 'GET', path: '/api/stock/summary', summary: 'Counts of the stock by order (and grade once puzzles exist)', tags, response: stockSummarySchema },
    () => stockSummary(deps.db),
  );

  route(
    router,
    { method: 'GET', path: '/api/stock/export.csv', summary: 'The filtered selection as CSV', tags, query: stockExportQuerySchema, produces: 'text/csv' },
    ({ res, query }) => {
      const { limit, ...filter } = query;
      res
        .status(200)
        .attachment('squarewright-stock.csv')
        .type('text/csv; charset=utf-8')
        .send(stockCsv(exportStock(deps.db, filter, limit)));
    },
  );

  route(
    router,
    { method: 'GET', path: '/api/stock/export.bkp', summary: 'The filtered selection as a code file (one canonical Bouwkamp code a line)', tags, query: stockExportQuerySchema, produces: 'text/plain' },
    ({ res, query }) => {
      const { limit, ...filter } = query;
      res
        .status(200)
        .attachment('squarewright-stock.bkp')
        .type('text/plain; charset=utf-8')
        .send(stockCodeFile(exportStock(deps.db, filter, limit), deps.clock.now()));
    },
  );

  route(
    router,
    { method: 'GET', path: '/api/stock/:id', summary: 'One stock tiling: drawing and Smith diagram data, codes, class, provenance, history', tags, params: idParamsSchema, response: stockDetailSchema },
    ({ params }) => getStockDetail(deps.db, params.id),
  );
}
