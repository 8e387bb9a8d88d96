import { checkRequestSchema, verdictSchema, type Verdict } from '../../../shared/contracts/tilings';
import type { IntakeDeps } from './ports';
import { route, type ApiRouter } from '../../platform/http/route';
import { duplicateOf } from './submissions';
import { analyseCode, smithDrawingOf } from '../stock/index';

export function registerTilingRoutes(router: ApiRouter, deps: IntakeDeps) {
  route(
    router,
    {
      method: 'POST',
      path: '/api/tilings/check',
      summary: 'Verdict for a Bouwkamp or table code (valid, order, size, class, canonical code, drawing, duplicate?) or the precise error; stores nothing',
      tags: ['intake'],
      body: checkRequestSchema,
      response: verdictSchema,
    },
    ({ body }): Verdict => {
      const r = analyseCode(body.code);
      if (!r.ok) return { valid: false, error: r.error };
      const a = r.analysis;
      const c = a.classification;
      const dup = duplicateOf(deps.stock, deps.db, a);
      return {
        valid: true,
        order: c.order,
        width: a.tiling.W,
        height: a.tiling.H,
        square: c.square,
        perfect: c.perfect,
        simple: c.simple,
        bouwkamp: a.bouwkamp,
        canonicalCode: a.canonicalCode,
        canonicalKey: a.canonicalKey,
        classification: c,
        tiling: a.tiling,
        smith: smithDrawingOf(a.tiling),
        duplicate: dup !== null,
        duplicateOf: dup,
      };
    },
  );
}
