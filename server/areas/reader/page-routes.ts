import compression from 'compression';
import type { Request, Response } from 'express';
import { existsSync, readFileSync } from 'node:fs';
import { fromRoot } from '../../platform/app-root';
import { z } from 'zod';
import { publicEditionParamsSchema, publicPuzzleParamsSchema, readerSlugSchema } from '../../../shared/contracts/reader';
import { NotFound } from '../../platform/http/errors';
import type { ApiRouter } from '../../platform/http/route';
import { readerAssets } from './page-assets';
import { editionPage, indexPage, notFoundPage, publicationPage, puzzlePage, solutionPage, type PageMode } from './pages';
import type { ReaderDeps } from './ports';
import { findPublicEdition, findPublicPuzzle, publicEditionList, publicEditionView, publicPuzzleView } from './public-view';
import { publicEditionsOf } from './published';
import { publicationsForReader } from './settings';

// The readers' HTML pages (not API routes: no session is read, nothing is written):
//   /read                                   every publication with a public edition
//   /read/<slug>                            a publication's public editions
//   /read/<slug>/<number>                   an edition: introduction, puzzles, instructions
//   /read/<slug>/<number>/<position>        a puzzle to play
//   /read/<slug>/<number>/<position>/solution   its solution, once the solutions are public
//   /embed/<slug>/<number>[/<position>]     the same for an <iframe> on the publisher's site;
//                                           only these may be framed, by the publication's origins
// Every address a reader may not see answers the same 404 page as an address that never existed.

type Handler = (req: Request, mode: PageMode) => { html: string; frameAncestors?: string[] };

export function registerReaderPages(router: ApiRouter, deps: ReaderDeps) {
  const assets = readerAssets(deps.env);
  const read: PageMode = { embed: false, assets };
  const embed: PageMode = { embed: true, assets };

  // pages gzipped: most of a reader's first bytes on a slow link
  router.express.use(['/read', '/embed'], compression());

  // the publisher's height helper (public/embed/frame.js, copied into the built client): loaded
  // by other sites' pages, so it may be read cross-origin (the rest of the app is same-origin only)
  router.express.get('/embed/frame.js', (_req, res) => {
    const file = [fromRoot('dist', 'client', 'embed', 'frame.js'), fromRoot('public', 'embed', 'frame.js')].find((f) => existsSync(f));
    if (!file) {
      res.status(404).type('text/plain').send('Not found');
      return;
    }
    res.setHeader('Cross-Origin-Resource-Policy', 'cross-origin');
    res.setHeader('Cache-Control', 'public, max-age=3600');
    res.type('text/javascript').send(readFileSync(file, 'utf8'));
  });

  const page = (path: string, mode: PageMode, handler: Handler) => {
    router.express.get(path, (req: Request, res: Response, next) => {
      try {
        const out = handler(req, mode);
        if (mode.embed) res.locals.frameAncestors = out.frameAncestors ?? [];
        // no-cache: revalidated each time (ETag), so a release, a solution or an embed origin shows at once
        res.status(200).type('html').setHeader('Cache-Control', 'no-cache').send(out.html);
      } catch (err) {
        if (err instanceof NotFound || err instanceof z.ZodError) {
          if (mode.embed) res.locals.frameAncestors = [];
          res.status(404).type('html').setHeader('Cache-Control', 'no-store').send(notFoundPage(mode));
          return;
        }
        next(err);
      }
    });
  };

  const edition = (req: Request) => {
    const p = publicEditionParamsSchema.parse(req.params);
    return findPublicEdition(deps, p.slug, p.number);
  };
  const puzzle = (req: Request) => {
    const p = publicPuzzleParamsSchema.parse(req.params);
    return findPublicPuzzle(deps, p.slug, p.number, p.position);
  };

  page('/read', read, (_req, mode) => {
    const now = deps.clock.now();
    return { html: indexPage(mode, publicationsForReader(deps.db).filter((p) => publicEditionsOf(deps.db, p, now).length > 0)) };
  });
  page('/read/:slug', read, (req, mode) => ({ html: publicationPage(mode, publicEditionList(deps, readerSlugSchema.parse(req.params.slug))) }));
  for (const [prefix, mode] of [['/read', read], ['/embed', embed]] as const) {
    page(`${prefix}/:slug/:number`, mode, (req, m) => {
      const ctx = edition(req);
      return { html: editionPage(m, publicEditionView(deps, ctx)), frameAncestors: ctx.pub.embedOrigins };
    });
    page(`${prefix}/:slug/:number/:position`, mode, (req, m) => {
      const ctx = puzzle(req);
      const api = `/api/reader/public/${ctx.pub.slug}/${ctx.edition.number}/${ctx.slot.position}`;
      return { html: puzzlePage(m, publicPuzzleView(deps, ctx), api), frameAncestors: ctx.pub.embedOrigins };
    });
  }
  page('/read/:slug/:number/:position/solution', read, (req, mode) => {
    const ctx = puzzle(req);
    if (!ctx.edition.release.solutionsPublic) throw new NotFound();
    const s = ctx.slot.puzzle.solution;
    return { html: solutionPage(mode, publicPuzzleView(deps, ctx), { tiling: s.tiling, steps: s.steps ?? [] }) };
  });
}
