import { z } from 'zod';
import {
  editionChecksSchema,
  editionCreateSchema,
  editionIdParamsSchema,
  editionListQuerySchema,
  editionListSchema,
  editionPatchSchema,
  editionSchema,
  printerEditionSchema,
  proofParamsSchema,
  publishCheckSchema,
  publishSchema,
  returnProofSchema,
  sendProofSchema,
} from '../../../shared/contracts/editions';
import { route, type ApiRouter } from '../../platform/http/route';
import { renderOnWorker } from '../print/index';
import type { EditionsDeps } from './ports';
import { runEditionChecks } from './edition-checks';
import { loadEditionDocument } from './edition-document';
import { createEdition, getEditionFor, getEditionRow, listEditions, updateEdition } from './editions';
import { registerLayoutPackageRoutes } from './layout-package-routes';
import { renderOptionsFor } from './press-spec';
import { approveProof, publishCheck, publishEdition, readPressFile, readProofFile, returnProof, sendToProof } from './proofs';

function sendPdf(res: import('express').Response, file: { pdf: Buffer; sha256: string; name: string }, disposition: 'inline' | 'attachment') {
  res.status(200).type('application/pdf');
  res.setHeader('Content-Disposition', `${disposition}; filename="${file.name}"`);
  res.setHeader('ETag', `"${file.sha256}"`);
  res.setHeader('X-Content-SHA256', file.sha256);
  res.setHeader('Cache-Control', 'private, no-store');
  res.send(file.pdf);
}

export function registerEditionRoutes(router: ApiRouter, deps: EditionsDeps) {
  const tags = ['editions'];
  const download = z.object({ download: z.enum(['1', '0']).optional() });

  route(
    router,
    { method: 'GET', path: '/api/editions', summary: 'Editions (filter by month, publication, state); printers see only editions sent to proof', tags, query: editionListQuerySchema, response: editionListSchema },
    ({ user, query }) => ({ items: listEditions(deps, user, query) }),
  );

  route(
    router,
    { method: 'POST', path: '/api/editions', summary: 'Create a draft edition', tags, body: editionCreateSchema, response: editionSchema, status: 201 },
    ({ user, body }) => createEdition(deps, user, body),
  );

  route(
    router,
    { method: 'GET', path: '/api/editions/:id', summary: 'One edition (printers: files and history only)', tags, params: editionIdParamsSchema, response: z.union([editionSchema, printerEditionSchema]) },
    ({ user, params }) => getEditionFor(deps, user, params.id),
  );

  route(
    router,
    { method: 'PATCH', path: '/api/editions/:id', summary: 'Change a draft: number, date, introduction, slots (the list replaces the old one)', tags, params: editionIdParamsSchema, body: editionPatchSchema, response: editionSchema },
    ({ params, body }) => updateEdition(deps, params.id, body),
  );

  route(
    router,
    { method: 'GET', path: '/api/editions/:id/checks', summary: 'The checks before proof, with the preflight of a preview', tags, params: editionIdParamsSchema, response: editionChecksSchema },
    ({ params }) => runEditionChecks(deps, params.id),
  );

  route(
    router,
    { method: 'GET', path: '/api/editions/:id/preview.pdf', summary: 'A preview of the edition as it stands (stamped PROOF, not stored)', tags, params: editionIdParamsSchema, produces: 'application/pdf' },
    async ({ params, res }) => {
      getEditionRow(deps.db, params.id);
      const doc = loadEditionDocument(deps, params.id).doc;
      const r = await renderOnWorker(deps.jobs, doc, renderOptionsFor(deps.db, doc, { stamp: 'PROOF' }));
      res.status(200).type('application/pdf').setHeader('Cache-Control', 'no-store');
      res.send(r.pdf);
    },
  );

  route(
    router,
    {
      method: 'POST',
      path: '/api/editions/:id/proofs',
      summary: 'Send to proof: render version n from the saved state (updatedAt as seen), check it, store it hashed, mail the printers; preflight floor errors need override.reason',
      tags,
      params: editionIdParamsSchema,
      body: sendProofSchema,
      response: editionSchema,
      status: 201,
    },
    ({ user, params, body }) => sendToProof(deps, user, params.id, body),
  );

  route(
    router,
    { method: 'GET', path: '/api/editions/:id/proofs/:version.pdf', summary: 'A stored proof file', tags, params: proofParamsSchema, query: download, produces: 'application/pdf' },
    ({ user, params, query, res }) => sendPdf(res, readProofFile(deps, user, params.id, params.version), query.download === '1' ? 'attachment' : 'inline'),
  );

  route(
    router,
    { method: 'POST', path: '/api/editions/:id/proofs/:version/approve', summary: 'Approve the pending proof (printer); its press file is made and stored', tags, params: proofParamsSchema, response: printerEditionSchema },
    async ({ user, params }) => {
      await approveProof(deps, user, params.id, params.version);
      return getEditionFor(deps, user, params.id);
    },
  );

  route(
    router,
    { method: 'POST', path: '/api/editions/:id/proofs/:version/return', summary: 'Return the pending proof with notes (printer); the edition goes back to draft', tags, params: proofParamsSchema, body: returnProofSchema, response: printerEditionSchema },
    ({ user, params, body }) => {
      returnProof(deps, user, params.id, params.version, body.notes);
      return getEditionFor(deps, user, params.id);
    },
  );

  route(
    router,
    { method: 'GET', path: '/api/editions/:id/press.pdf', summary: 'The press file of an approved edition', tags, params: editionIdParamsSchema, query: download, produces: 'application/pdf' },
    ({ user, params, query, res }) => sendPdf(res, readPressFile(deps, user, params.id), query.download === '1' ? 'attachment' : 'inline'),
  );

  route(
    router,
    {
      method: 'POST',
      path: '/api/editions/:id/publish',
      summary: 'Mark an approved edition published; fees per printed puzzle go into the ledger. Refused (409) before its date or ahead of an earlier unpublished edition unless an admin gives override.reason',
      tags,
      params: editionIdParamsSchema,
      body: publishSchema,
      response: editionSchema,
    },
    ({ user, params, body }) => publishEdition(deps, user, params.id, body),
  );

  route(
    router,
    { method: 'GET', path: '/api/editions/:id/publish-check', summary: 'What publishing would do now: the fees it makes payable, and what refuses it (before the date, an earlier edition unpublished)', tags, params: editionIdParamsSchema, response: publishCheckSchema },
    ({ params }) => publishCheck(deps, params.id),
  );

  registerLayoutPackageRoutes(router, deps);
}
