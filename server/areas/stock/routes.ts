import type { Response } from 'express';
import { idParamsSchema } from '../../../shared/contracts/submissions';
import {
  imageQuerySchema,
  stockDetailSchema,
  stockExportQuerySchema,
  stockListQuerySchema,
  stockListSchema,
  stockSummarySchema,
  type StockExportQuery,
  type StockItem,
} from '../../../shared/contracts/stock';
import { route, type ApiRouter } from '../../platform/http/route';
import { renderTilingPng, PNG_SIZES } from '../../platform/images/tiling-png';
import type { StockDeps } from './ports';
import { exportStock, fillStockReducedKeys, getStockDetail, listStock, stockCodeFile, stockCsv, stockSummary, stockTiling } from './stock';

/** PNG images by canonical key and size (a tiling's picture never changes); at most this many kept. */
const PNG_CACHE_MAX = 500;

export function registerStockRoutes(router: ApiRouter, deps: StockDeps) {
  // rows stored before migration 0017 get their reduced key once (nothing to do on a new database)
  fillStockReducedKeys(deps.db);
  const tags = ['stock'];
  const pngCache = new Map<string, Buffer>();

  route(
    router,
    { method: 'GET', path: '/api/stock', summary: 'Stock tilings filtered by order, size, class, provenance, use and setter; sorted and paged', tags, query: stockListQuerySchema, response: stockListSchema },
    ({ query }) => listStock(deps.db, query),
  );

  route(
    router,
    { method: 'GET', path: '/api/stock/summary', summary: 'Counts of the stock by order (and grade once puzzles exist)', tags, response: stockSummarySchema },
    () => stockSummary(deps.db, deps.stockUsage),
  );

  /** An export route's answer: the filtered selection (at most `limit`) as a file. */
  const exportAs =
    (fileName: string, type: string, write: (items: StockItem[]) => string) =>
    ({ res, query }: { res: Response; query: StockExportQuery }) => {
      const { limit, ...filter } = query;
      res.status(200).attachment(fileName).type(type).send(write(exportStock(deps.db, filter, limit)));
    };

  route(
    router,
    { method: 'GET', path: '/api/stock/export.csv', summary: 'The filtered selection as CSV', tags, query: stockExportQuerySchema, produces: 'text/csv' },
    exportAs('squarewright-stock.csv', 'text/csv; charset=utf-8', stockCsv),
  );

  route(
    router,
    { method: 'GET', path: '/api/stock/export.bkp', summary: 'The filtered selection as a code file (one canonical Bouwkamp code a line)', tags, query: stockExportQuerySchema, produces: 'text/plain' },
    exportAs('squarewright-stock.bkp', 'text/plain; charset=utf-8', (items) => stockCodeFile(items, deps.clock.now())),
  );

  route(
    router,
    { method: 'GET', path: '/api/stock/:id/image.png', summary: 'The tiling as a PNG with sizes written in the squares (?size=thumb for a thumbnail), cached by canonical key', tags, params: idParamsSchema, query: imageQuerySchema, produces: 'image/png' },
    ({ res, params, query }) => {
      const { tiling, canonicalKey } = stockTiling(deps.db, params.id);
      const width = query.size === 'thumb' ? PNG_SIZES.thumbnail2x : PNG_SIZES.web;
      const key = `${canonicalKey}@${width}`;
      let png = pngCache.get(key);
      if (!png) {
        png = renderTilingPng(tiling, { width, labels: true });
        if (pngCache.size >= PNG_CACHE_MAX) pngCache.delete(pngCache.keys().next().value!);
        pngCache.set(key, png);
      }
      res.status(200).type('image/png').set('cache-control', 'private, max-age=86400').send(png);
    },
  );

  route(
    router,
    { method: 'GET', path: '/api/stock/:id', summary: 'One stock tiling: drawing and Smith diagram data, codes, class, provenance, history', tags, params: idParamsSchema, response: stockDetailSchema },
    ({ params }) => getStockDetail(deps, params.id),
  );
}
