import multer from 'multer';
import {
  publicationIdParamsSchema,
  publicationInputSchema,
  publicationListSchema,
  publicationPatchSchema,
  publicationPrinterChoicesSchema,
  publicationPrintersInputSchema,
  publicationPrintersSchema,
  publicationSchema,
} from '../../../shared/contracts/publications';
import { pressSpecInputSchema, pressSpecResponseSchema } from '../../../shared/contracts/press';
import type { PlatformDeps } from '../../platform/deps';
import { Unprocessable } from '../../platform/http/errors';
import { route, type ApiRouter } from '../../platform/http/route';
import { getPressSpec, updatePressSpec, uploadOutputProfile } from './press-spec';
import { activePrinters, printersOf, setPublicationPrinters } from './printers';
import { createPublication, getPublicationRow, listPublications, updatePublication } from './publications';

/** ICC output profiles run from a few kB to a few MB. */
const MAX_PROFILE_BYTES = 8 * 1024 * 1024;

export function registerPublicationRoutes(router: ApiRouter, deps: PlatformDeps) {
  const tags = ['publications'];
  const upload = multer({ storage: multer.memoryStorage(), limits: { fileSize: MAX_PROFILE_BYTES, files: 1, fields: 5 } });

  route(
    router,
    { method: 'GET', path: '/api/publications', summary: 'Publications with template, cadence, solution rule, reuse window, fees and printers', tags, response: publicationListSchema },
    () => ({ items: listPublications(deps.db) }),
  );

  route(
    router,
    { method: 'POST', path: '/api/publications', summary: 'Create a publication (admin)', tags, body: publicationInputSchema, response: publicationSchema, status: 201 },
    ({ body }) => createPublication(deps, body),
  );

  route(
    router,
    { method: 'PATCH', path: '/api/publications/:id', summary: 'Change a publication (admin)', tags, params: publicationIdParamsSchema, body: publicationPatchSchema, response: publicationSchema },
    ({ params, body }) => updatePublication(deps, params.id, body),
  );

  route(
    router,
    { method: 'GET', path: '/api/publications/:id/printers', summary: 'The printers of a publication and every active printer who could be assigned (admin)', tags, params: publicationIdParamsSchema, response: publicationPrinterChoicesSchema },
    ({ params }) => {
      getPublicationRow(deps.db, params.id);
      return { items: printersOf(deps.db, params.id), candidates: activePrinters(deps.db) };
    },
  );

  route(
    router,
    {
      method: 'PUT',
      path: '/api/publications/:id/printers',
      summary: 'Assign the printers of a publication (admin): they alone see, download and decide its proofs and get its proof mail',
      tags,
      params: publicationIdParamsSchema,
      body: publicationPrintersInputSchema,
      response: publicationPrintersSchema,
    },
    ({ params, body }) => ({ items: setPublicationPrinters(deps, params.id, body.userIds) }),
  );

  route(
    router,
    { method: 'GET', path: '/api/publications/:id/press-spec', summary: 'The press spec of a publication: its choices, the template defaults and the settings in force', tags, params: publicationIdParamsSchema, response: pressSpecResponseSchema },
    ({ params }) => getPressSpec(deps.db, params.id),
  );

  route(
    router,
    {
      method: 'PUT',
      path: '/api/publications/:id/press-spec',
      summary: 'Set the press spec (admin): PDF/X standard, output condition, bleed, smallest type, thinnest line (null = the template default)',
      tags,
      params: publicationIdParamsSchema,
      body: pressSpecInputSchema,
      response: pressSpecResponseSchema,
    },
    ({ params, body }) => updatePressSpec(deps, params.id, body),
  );

  route(
    router,
    {
      method: 'PUT',
      path: '/api/publications/:id/output-profile',
      summary: "Upload the plant's ICC output profile (admin; field \"file\", a CMYK output profile, at most 8 MB), needed for PDF/X-4",
      tags,
      params: publicationIdParamsSchema,
      bodyType: 'multipart',
      maxBodyBytes: MAX_PROFILE_BYTES + 64 * 1024,
      middleware: [upload.single('file')],
      response: pressSpecResponseSchema,
    },
    ({ req, params, user }) => {
      const file = req.file;
      if (!file) throw new Unprocessable('no file: send the ICC profile as multipart form data in the field "file"', [{ path: 'file', message: 'is required' }]);
      return uploadOutputProfile(deps, user, params.id, file.buffer);
    },
  );
}
