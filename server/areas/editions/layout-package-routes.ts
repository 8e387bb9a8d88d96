import { z } from 'zod';
import { editionIdParamsSchema } from '../../../shared/contracts/editions';
import { NotFound, Unprocessable } from '../../platform/http/errors';
import { route, type ApiRouter } from '../../platform/http/route';
import { getPageTemplate, layoutPackageOnWorker, type PackageEntry } from '../print/index';
import { loadEditionDocument, toPuzzlePrint, toSolutionPrint } from './edition-document';
import { getEditionRow } from './editions';
import type { EditionsDeps } from './ports';
import { outputProfileFor, pressSettingsFor } from './press-spec';
import { getPublicationRow } from './publications';
import { instructionsOf } from './stored-json';
import { slotsOf } from './slots';

// The layout package (print/layout-package.ts) for desks that place puzzles in their own page
// layout: one zip per edition ("Package for layout", every slot's puzzle and solution, named
// by edition and slot) and one per puzzle from the puzzle page, at a publication's settings.

const slug = (s: string) =>
  s
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-|-$/g, '');

function sendZip(res: import('express').Response, zip: Buffer, name: string) {
  res.status(200).type('application/zip');
  res.setHeader('Content-Disposition', `attachment; filename="${name}"`);
  res.setHeader('Cache-Control', 'private, no-store');
  res.send(zip);
}

export function registerLayoutPackageRoutes(router: ApiRouter, deps: EditionsDeps) {
  route(
    router,
    {
      method: 'GET',
      path: '/api/editions/:id/layout-package.zip',
      summary: 'Package for layout: per slot the puzzle and its solution as PDF/X and SVG, instructions and solution as text, and manifest.json (one zip)',
      tags: ['editions'],
      params: editionIdParamsSchema,
      produces: 'application/zip',
    },
    async ({ params, res }) => {
      const r = getEditionRow(deps.db, params.id);
      const pub = getPublicationRow(deps.db, r.publicationId);
      const built = loadEditionDocument(deps, params.id);
      if (built.puzzles.length === 0) throw new Unprocessable('The edition has no puzzles to package.', [{ path: 'slots', message: 'add at least one puzzle' }]);
      const base = `${slug(pub.title)}-no${r.number}`;
      const instructions = new Map(slotsOf(deps.db, params.id).map((s) => [s.position, instructionsOf(s)]));
      const entries: PackageEntry[] = built.puzzles.map(({ slot, puzzle }) => ({
        stem: `${base}-slot${slot}`,
        slot,
        puzzleId: puzzle.id,
        puzzle: toPuzzlePrint(puzzle, slot, instructions.get(slot) ?? { type: 'doc', content: [] }),
        solution: toSolutionPrint(puzzle, slot),
      }));
      const press = built.doc.press ?? pressSettingsFor(pub);
      const { zip } = await layoutPackageOnWorker(deps.jobs, {
        title: `${pub.title} No. ${r.number}`,
        template: built.doc.template,
        press,
        outputProfile: outputProfileFor(deps.db, press.profileSha256),
        createdAt: deps.clock.now(),
        entries,
      });
      sendZip(res, zip, `${base}-layout-package.zip`);
    },
  );

  route(
    router,
    {
      method: 'GET',
      path: '/api/puzzles/:id/layout-package.zip',
      summary: "One puzzle for layout at a publication's type and line settings: puzzle and solution as PDF/X and SVG, instructions and solution as text, manifest.json",
      tags: ['editions'],
      params: z.object({ id: z.string().regex(/^\d{1,12}$/, 'a puzzle id is a number') }),
      query: z.object({ publicationId: z.string({ error: 'publicationId is required: the package takes its type and line settings from a publication' }).min(1).max(100) }),
      produces: 'application/zip',
    },
    async ({ params, query, res }) => {
      const puzzle = deps.puzzles.getPuzzleForPrint(deps.db, params.id);
      if (!puzzle) throw new NotFound(`No puzzle ${params.id}.`);
      const pub = getPublicationRow(deps.db, query.publicationId);
      const template = getPageTemplate(pub.templateId);
      if (!template) throw new Unprocessable(`The publication's page template "${pub.templateId}" is not installed.`);
      const press = pressSettingsFor(pub);
      const stem = `${slug(pub.title)}-puzzle${puzzle.id}`;
      const { zip } = await layoutPackageOnWorker(deps.jobs, {
        title: `${pub.title}: ${puzzle.title || `puzzle ${puzzle.id}`}`,
        template,
        press,
        outputProfile: outputProfileFor(deps.db, press.profileSha256),
        createdAt: deps.clock.now(),
        entries: [{ stem, slot: null, puzzleId: puzzle.id, puzzle: toPuzzlePrint(puzzle, 0, { type: 'doc', content: [] }), solution: toSolutionPrint(puzzle, 0, `puzzle ${puzzle.id}`) }],
      });
      sendZip(res, zip, `${stem}-layout-package.zip`);
    },
  );
}
