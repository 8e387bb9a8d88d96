import { processPulse } from '../../platform/request-pulse';
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
} from '../../../shared/contracts/stock';
import { JsonText, route, type ApiRouter } from '../../platform/http/route';
import { PNG_SIZES } from '../../platform/images/tiling-png';
import { tilingPngOnWorker } from './png-job';
import { readStock } from './stock-reader';
import type { StockDeps } from './ports';
import { exportPage, fillStockReducedKeys, getStockDetail, stockListJson, stockCodeFileHead, stockCsvHead, stockSummary, stockTiling, type ExportFormat, type ExportMark } from './stock';

/** Rows per page of an export (a few ms to read and write as text). */
const EXPORT_PAGE_ROWS = 500;
import { countStock } from './stock-filter';

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
    async ({ query }) => new JsonText(await stockListJson(deps, query)),
  );

  route(
    router,
    { method: 'GET', path: '/api/stock/summary', summary: 'Counts of the stock by order (and grade once puzzles exist)', tags, response: stockSummarySchema },
    () => stockSummary(deps.db, deps.stockUsage),
  );

  /**
   * An export route's answer: the whole filtered selection (or the first `limit` rows) as a file,
   * streamed in pages of 500 rows (waiting for the client when it reads slower), so a 100,000-row
   * export does not hold up anyone else. The pages are read and written as text on the stock
   * reader's thread (./stock-reader.ts); without one, here, as background work that takes only
   * its share of the request thread (with storing job results: server/platform/request-pulse.ts).
   */
  const exportAs =
    (fileName: string, type: string, head: (count: number) => string, format: ExportFormat) =>
    async ({ res, query }: { res: Response; query: StockExportQuery }) => {
      const { limit, ...filter } = query;
      const count = await readStock(deps.stockReader, (r) => r.count(filter), () => countStock(deps.db, filter));
      const total = Math.min(count, limit ?? Infinity);
      res.status(200).attachment(fileName).type(type).setHeader('X-Total-Count', String(total));
      let gone = false;
      res.on('close', () => (gone = true));
      const write = async (text: string) => {
        // wait for a slow client; both listeners go once either fires (no pile of 'close' listeners)
        if (!res.write(text)) {
          await new Promise<void>((r) => {
            const done = () => {
              res.off('drain', done).off('close', done);
              r();
            };
            res.once('drain', done).once('close', done);
          });
        }
      };
      await write(head(total));
      let after: ExportMark | null = null;
      for (let left = limit ?? Infinity; left > 0; ) {
        const n = Math.min(EXPORT_PAGE_ROWS, left);
        const page = await readStock(
          deps.stockReader,
          (r) => r.exportPage(filter, after, n, format),
          async () => {
            // on the request thread: background work, within its share
            await processPulse.backgroundTurn();
            const t0 = performance.now();
            const p = exportPage(deps.db.$client, filter, after, n, format);
            processPulse.backgroundDone(performance.now() - t0);
            return p;
          },
        );
        if (gone) return;
        if (page.count > 0) await write(page.text);
        if (page.count < n) break;
        left -= page.count;
        after = page.after;
        await new Promise<void>((r) => setImmediate(r));
      }
      res.end();
    };

  route(
    router,
    { method: 'GET', path: '/api/stock/export.csv', summary: 'The whole filtered selection as CSV, streamed (limit: the first rows only); X-Total-Count says how many rows', tags, query: stockExportQuerySchema, produces: 'text/csv' },
    exportAs('squarewright-stock.csv', 'text/csv; charset=utf-8', stockCsvHead, 'csv'),
  );

  route(
    router,
    { method: 'GET', path: '/api/stock/export.txt', summary: 'The whole filtered selection as a code file (one canonical Bouwkamp code a line), streamed', tags, query: stockExportQuerySchema, produces: 'text/plain' },
    exportAs('squarewright-stock.txt', 'text/plain; charset=utf-8', (n) => stockCodeFileHead(n, deps.clock.now()), 'codes'),
  );

  route(
    router,
    { method: 'GET', path: '/api/stock/:id/image.png', summary: 'The tiling as a PNG with sizes written in the squares (?size=thumb for a thumbnail), cached by canonical key', tags, params: idParamsSchema, query: imageQuerySchema, produces: 'image/png' },
    async ({ res, params, query }) => {
      const { tiling, canonicalKey } = stockTiling(deps.db, params.id);
      const width = query.size === 'thumb' ? PNG_SIZES.thumbnail2x : PNG_SIZES.web;
      const key = `${canonicalKey}@${width}`;
      let png = pngCache.get(key);
      if (!png) {
        // drawn on a job worker: a page of thumbnails never holds up other requests
        png = await tilingPngOnWorker(deps.jobs, tiling, { width, labels: true });
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
