import { numericIdParamSchema, okSchema } from '../../../shared/contracts/common';
import { puzzleCreateSchema, puzzleDetailSchema, puzzleListQuerySchema, puzzleListSchema, puzzlePatchSchema, puzzleStartedSchema } from '../../../shared/contracts/puzzles';
import { route, type ApiRouter } from '../../platform/http/route';
import type { PuzzlesDeps } from './ports';
import { cancelPuzzleJob, createPuzzle, getPuzzle, listPuzzles, patchPuzzle, recheckPuzzle } from './puzzles';

export function registerPuzzleRoutes(router: ApiRouter, deps: PuzzlesDeps) {
  const tags = ['puzzles'];

  route(
    router,
    { method: 'POST', path: '/api/puzzles', summary: 'Make an Assembly or Deduction puzzle from a stock tiling; the proof runs in the worker pool', tags, body: puzzleCreateSchema, response: puzzleStartedSchema, status: 202 },
    ({ body, user }) => createPuzzle(deps, deps.jobs, user, body),
  );
  route(
    router,
    { method: 'GET', path: '/api/puzzles', summary: 'Puzzles with kind, grade, status, tiling and where used (filter, sort, page)', tags, query: puzzleListQuerySchema, response: puzzleListSchema },
    ({ query }) => listPuzzles(deps, deps.jobs, query),
  );
  route(
    router,
    { method: 'GET', path: '/api/puzzles/:id', summary: 'One puzzle with its certificate, verdict, starter pieces or givens, steps, grade and job progress', tags, params: numericIdParamSchema, response: puzzleDetailSchema },
    ({ params }) => getPuzzle(deps, deps.jobs, params.id),
  );
  route(
    router,
    { method: 'PATCH', path: '/api/puzzles/:id', summary: 'Change starter pieces, givens, level or frame; uniqueness is proved again', tags, params: numericIdParamSchema, body: puzzlePatchSchema, response: puzzleStartedSchema, status: 202 },
    ({ params, body, user }) => patchPuzzle(deps, deps.jobs, user, params.id, body),
  );
  route(
    router,
    { method: 'POST', path: '/api/puzzles/:id/recheck', summary: 'Re-check the certificate by recomputation', tags, params: numericIdParamSchema, response: puzzleStartedSchema, status: 202 },
    ({ params, user }) => recheckPuzzle(deps, deps.jobs, user, params.id),
  );
  route(
    router,
    { method: 'POST', path: '/api/puzzles/:id/cancel', summary: 'Cancel the running proof of a puzzle', tags, params: numericIdParamSchema, response: okSchema },
    ({ params }) => { cancelPuzzleJob(deps.db, deps.jobs, params.id); return { ok: true as const }; },
  );
}
