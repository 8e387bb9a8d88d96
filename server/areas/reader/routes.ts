import { rateLimit, type Options } from 'express-rate-limit';
import type { RequestHandler } from 'express';
import { z } from 'zod';
import { idParamSchema, numericIdParamSchema } from '../../../shared/contracts/common';
import {
  calibrationSchema,
  checkInputSchema,
  checkResultSchema,
  gradeAdjustInputSchema,
  gradeAdjustmentSchema,
  publicEditionListSchema,
  publicEditionParamsSchema,
  publicEditionSchema,
  publicPuzzleParamsSchema,
  publicPuzzleSchema,
  readerSettingsInputSchema,
  readerSettingsListSchema,
  readerSettingsSchema,
  readerSlugSchema,
  revealInputSchema,
  revealResultSchema,
  solveEventInputSchema,
  solveStatsSchema,
} from '../../../shared/contracts/reader';
import { HttpError } from '../../platform/http/errors';
import { route, type ApiRouter } from '../../platform/http/route';
import { recordSolveEvent } from './events';
import { adjustGrade, gradeAdjustment } from './grades';
import { checkEntries, revealEntries } from './play';
import type { ReaderDeps } from './ports';
import { findPublicEdition, findPublicPuzzle, publicEditionList, publicEditionView, publicPuzzleView } from './public-view';
import { publicationsForReader, toReaderSettings, updateReaderSettings } from './settings';
import { calibration, solveStats } from './stats';

// The reader edition's API. Under /api/reader/public: what the public pages read and send,
// without a session ('public' in the permission table); checks and reveals are rate-limited
// per address (READER_CHECKS_PER_MINUTE), solve events too (a fixed 120 a minute). The
// limiter keeps an address in memory for one window and nowhere else. The rest is the
// editor's: solve statistics, the calibration, the grade shown to readers; the admin's:
// the publications' reader settings.

const tags = ['reader'];
/** Solve events per minute from one address (our choice: a reader sends a handful per puzzle). */
const EVENTS_PER_MINUTE = 120;

function limiter(limit: number, what: string): RequestHandler {
  const options: Partial<Options> = {
    windowMs: 60_000,
    limit,
    standardHeaders: 'draft-7',
    legacyHeaders: false,
    handler: (_req, res, next, o) => {
      const seconds = Math.max(1, Math.ceil(Number(res.getHeader('Retry-After') ?? o.windowMs / 1000)));
      next(new HttpError(429, 'rate_limited', `Too many ${what} from your address; try again in ${seconds} s.`));
    },
  };
  return rateLimit(options);
}

export function registerReaderRoutes(router: ApiRouter, deps: ReaderDeps) {
  const checks = limiter(deps.env.READER_CHECKS_PER_MINUTE, 'checks');
  const events = limiter(EVENTS_PER_MINUTE, 'solve events');

  // ---- public ------------------------------------------------------------------------------
  route(
    router,
    { method: 'GET', path: '/api/reader/public/:slug', summary: "A publication's public editions (readers; no session)", tags, params: z.object({ slug: readerSlugSchema }), response: publicEditionListSchema },
    ({ params }) => publicEditionList(deps, params.slug),
  );
  route(
    router,
    { method: 'GET', path: '/api/reader/public/:slug/:number', summary: 'A public edition: introduction and puzzles with instructions (404 before its release)', tags, params: publicEditionParamsSchema, response: publicEditionSchema },
    ({ params }) => publicEditionView(deps, findPublicEdition(deps, params.slug, params.number)),
  );
  route(
    router,
    { method: 'GET', path: '/api/reader/public/:slug/:number/:position', summary: 'A public puzzle to play: the frame and pieces, or the drawing and givens; never its solution', tags, params: publicPuzzleParamsSchema, response: publicPuzzleSchema },
    ({ params }) => publicPuzzleView(deps, findPublicPuzzle(deps, params.slug, params.number, params.position)),
  );
  route(
    router,
    { method: 'POST', path: '/api/reader/public/:slug/:number/:position/check', summary: "Check a reader's entries: which are wrong, and whether the puzzle is solved (rate-limited)", tags, params: publicPuzzleParamsSchema, body: checkInputSchema, response: checkResultSchema, middleware: [checks] },
    ({ params, body }) => checkEntries(findPublicPuzzle(deps, params.slug, params.number, params.position).slot.puzzle, body),
  );
  route(
    router,
    { method: 'POST', path: '/api/reader/public/:slug/:number/:position/reveal', summary: 'Reveal one piece or square, or all, once the edition\u2019s solutions are public (409 before; rate-limited)', tags, params: publicPuzzleParamsSchema, body: revealInputSchema, response: revealResultSchema, middleware: [checks] },
    ({ params, body }) => {
      const ctx = findPublicPuzzle(deps, params.slug, params.number, params.position);
      return revealEntries(ctx.slot.puzzle, body, ctx.edition.release.solutionsPublic, ctx.edition.release.solutionsFrom);
    },
  );
  route(
    router,
    { method: 'POST', path: '/api/reader/public/:slug/:number/:position/events', summary: 'An anonymous solve event: started, checked, revealed or finished, with the time played (no personal data)', tags, params: publicPuzzleParamsSchema, body: solveEventInputSchema, middleware: [events] },
    ({ params, body }) => {
      const ctx = findPublicPuzzle(deps, params.slug, params.number, params.position);
      recordSolveEvent(deps.db, { puzzleId: ctx.slot.puzzleId, editionId: ctx.edition.id, now: deps.clock.now() }, body);
    },
  );

  // ---- editors ---------------------------------------------------------------------------
  route(
    router,
    { method: 'GET', path: '/api/reader/stats', summary: 'Solve statistics of every published puzzle and per grade', tags, response: solveStatsSchema },
    () => solveStats(deps),
  );
  route(
    router,
    { method: 'GET', path: '/api/reader/calibration', summary: "The engine's grade against readers' solve times: suggested boundaries and formula changes", tags, response: calibrationSchema },
    () => calibration(deps),
  );
  route(
    router,
    { method: 'GET', path: '/api/reader/puzzles/:id/grade', summary: 'The grade readers see for a puzzle, and the note of its adjustment', tags, params: numericIdParamSchema, response: gradeAdjustmentSchema },
    ({ params }) => gradeAdjustment(deps, params.id),
  );
  route(
    router,
    { method: 'PUT', path: '/api/reader/puzzles/:id/grade', summary: 'Adjust the grade readers see after publication, with a note (null grade: back to the engine\u2019s)', tags, params: numericIdParamSchema, body: gradeAdjustInputSchema, response: gradeAdjustmentSchema },
    ({ params, body, user }) => adjustGrade(deps, user, params.id, body),
  );
  route(
    router,
    { method: 'GET', path: '/api/reader/settings', summary: "Every publication's reader settings: address, time zone, release time, embed origins", tags, response: readerSettingsListSchema },
    () => ({ items: publicationsForReader(deps.db).map(toReaderSettings) }),
  );
  route(
    router,
    { method: 'PUT', path: '/api/reader/settings/:id', summary: "Change a publication's reader settings", tags, params: idParamSchema, body: readerSettingsInputSchema, response: readerSettingsSchema },
    ({ params, body }) => updateReaderSettings(deps, params.id, body),
  );
}
