import { publicationIdParamsSchema, publicationInputSchema, publicationListSchema, publicationPatchSchema, publicationSchema } from '../../../shared/contracts/publications';
import type { PlatformDeps } from '../../platform/deps';
import { route, type ApiRouter } from '../../platform/http/route';
import { createPublication, listPublications, updatePublication } from './publications';

export function registerPublicationRoutes(router: ApiRouter, deps: PlatformDeps) {
  const tags = ['publications'];

  route(
    router,
    { method: 'GET', path: '/api/publications', summary: 'Publications with template, cadence, solution rule, reuse window and fees', tags, response: publicationListSchema },
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
}
