import type { Request, Response } from 'express';
import { z } from 'zod';
import { idParamSchema, okSchema } from '../../../shared/contracts/common';
import {
  apiKeyListResponseSchema,
  apiKeySchema,
  createApiKeyBodySchema,
  createApiKeyResponseSchema,
  feedEditionSchema,
  feedPageSchema,
  feedQuerySchema,
  webhookDeliveryDetailSchema,
  webhookDeliveryPageSchema,
  webhookDeliveryQuerySchema,
  webhookDeliverySchema,
  webhookEndpointBodySchema,
  webhookEndpointCreatedSchema,
  webhookEndpointListResponseSchema,
  webhookEndpointPatchSchema,
  webhookEndpointSchema,
  webhookReceiptListResponseSchema,
} from '../../../shared/contracts/integrations';
import { NotFound } from '../../platform/http/errors';
import { route, type ApiRouter } from '../../platform/http/route';
import { createApiKey, listApiKeys, revokeApiKey } from './api-keys';
import { etagOf, feedEdition, feedPage, notModified } from './feed';
import type { IntegrationsDeps } from './ports';
import { listReceipts, localReceiverPath, receiveLocally } from './receiver';
import { createEndpoint, deleteEndpoint, getDelivery, listDeliveries, listEndpoints, resendDelivery, rotateSecret, updateEndpoint } from './webhooks';

const exampleKey = {
  id: 'k8Qm2vX0',
  name: 'stock export script',
  start: 'sqw_Abc1',
  scopes: ['stock:read'],
  owner: { id: 'u1', name: 'Edith Editor', email: 'editor@demo.squarewright.test' },
  createdAt: '2026-12-04T09:00:00.000Z',
  expiresAt: '2027-03-04T09:00:00.000Z',
  lastUsedAt: null,
  ratePerMinute: 600,
  status: 'active',
} as const;

const exampleEndpoint = {
  id: '6f1c2a4e-0d7b-4c39-9a51-2f7d3c1b8e90',
  url: 'https://desk.example.org/hooks/squarewright',
  description: 'web team: rebuild the puzzle pages',
  events: ['edition.published'],
  active: true,
  createdAt: '2026-12-04T09:00:00.000Z',
  pending: 0,
  failed: 0,
} as const;

// API keys (admins: every key; editors: their own), webhook endpoints and deliveries (admins),
// and the local receiver (development, demo and tests).
export function registerIntegrationRoutes(router: ApiRouter, deps: IntegrationsDeps) {
  route(router, { method: 'GET', path: '/api/api-keys', summary: 'API keys (admins see every key, editors their own)', tags: ['integrations'], response: apiKeyListResponseSchema, examples: { response: { items: [exampleKey] } } }, ({ user }) => ({
    items: listApiKeys(deps, user),
  }));

  route(
    router,
    {
      method: 'POST',
      path: '/api/api-keys',
      summary: 'Make an API key for yourself: name, scopes, days until it expires. The secret is in this answer only.',
      tags: ['integrations'],
      body: createApiKeyBodySchema,
      response: createApiKeyResponseSchema,
      status: 201,
      examples: { request: { name: 'stock export script', scopes: ['stock:read'], expiresInDays: 90 }, response: { apiKey: exampleKey, secret: 'sqw_Abc1xxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxx' } },
    },
    ({ user, body }) => createApiKey(deps, user, body),
  );

  route(
    router,
    { method: 'POST', path: '/api/api-keys/:id/revoke', summary: 'Revoke a key at once (the next request with it answers 401)', tags: ['integrations'], params: idParamSchema, response: apiKeySchema, examples: { response: { ...exampleKey, status: 'revoked' } } },
    ({ user, params }) => revokeApiKey(deps, user, params.id),
  );

  route(router, { method: 'GET', path: '/api/webhooks/endpoints', summary: 'Registered webhook endpoints', tags: ['integrations'], response: webhookEndpointListResponseSchema, examples: { response: { items: [exampleEndpoint] } } }, () => ({
    items: listEndpoints(deps.db),
  }));

  route(
    router,
    {
      method: 'POST',
      path: '/api/webhooks/endpoints',
      summary: 'Register an endpoint: URL and events; the answer carries its signing secret (this once)',
      tags: ['integrations'],
      body: webhookEndpointBodySchema,
      response: webhookEndpointCreatedSchema,
      status: 201,
      examples: { request: { url: exampleEndpoint.url, description: exampleEndpoint.description, events: ['edition.published'] }, response: { endpoint: exampleEndpoint, secret: 'whsq_3m0xxxxxxxxxxxxxxxxxxxxxxxxxxxxx' } },
    },
    ({ user, body }) => createEndpoint(deps, user.id, body),
  );

  route(
    router,
    { method: 'PATCH', path: '/api/webhooks/endpoints/:id', summary: 'Change an endpoint: events, description, active', tags: ['integrations'], params: idParamSchema, body: webhookEndpointPatchSchema, response: webhookEndpointSchema, examples: { request: { active: false }, response: { ...exampleEndpoint, active: false } } },
    ({ params, body }) => updateEndpoint(deps, params.id, body),
  );

  route(router, { method: 'DELETE', path: '/api/webhooks/endpoints/:id', summary: 'Remove an endpoint and its deliveries', tags: ['integrations'], params: idParamSchema, response: okSchema }, ({ params }) => {
    deleteEndpoint(deps, params.id);
    return { ok: true as const };
  });

  route(
    router,
    { method: 'POST', path: '/api/webhooks/endpoints/:id/secret', summary: 'A new signing secret for an endpoint (the old one stops at once)', tags: ['integrations'], params: idParamSchema, response: webhookEndpointCreatedSchema },
    ({ params }) => rotateSecret(deps, params.id),
  );

  route(
    router,
    { method: 'GET', path: '/api/webhooks/deliveries', summary: 'Deliveries, newest first, with their attempts and last answer', tags: ['integrations'], query: webhookDeliveryQuerySchema, response: webhookDeliveryPageSchema },
    ({ query }) => listDeliveries(deps.db, query),
  );

  route(
    router,
    { method: 'GET', path: '/api/webhooks/deliveries/:id', summary: 'One delivery: the exact body sent and every attempt', tags: ['integrations'], params: idParamSchema, response: webhookDeliveryDetailSchema },
    ({ params }) => getDelivery(deps.db, params.id),
  );

  route(
    router,
    { method: 'POST', path: '/api/webhooks/deliveries/:id/resend', summary: 'Send a delivery again now (same event id and body)', tags: ['integrations'], params: idParamSchema, response: webhookDeliverySchema },
    ({ params }) => resendDelivery(deps, params.id),
  );

  route(
    router,
    { method: 'GET', path: '/api/webhooks/local-receiver', summary: 'The local receiver: what it caught (development, demo and tests)', tags: ['integrations'], response: webhookReceiptListResponseSchema },
    () => {
      if (!deps.localReceiver) throw new NotFound('The local receiver is off on this server.');
      return { items: listReceipts(deps.db) };
    },
  );

  route(
    router,
    {
      method: 'POST',
      path: localReceiverPath,
      summary: 'The local receiver: keeps a delivery and checks its signature (development, demo and tests; 404 elsewhere)',
      tags: ['integrations'],
      response: z.object({ ok: z.literal(true), signatureValid: z.boolean() }),
    },
    ({ req }) => {
      if (!deps.localReceiver) throw new NotFound('The local receiver is off on this server.');
      return receiveLocally(deps.db, req, Math.floor(deps.clock.now().getTime() / 1000));
    },
  );
}

/** The published-content feed (editions:read keys, editors): JSON, paged, with an ETag (304 when unchanged). */
export function registerFeedRoutes(router: ApiRouter, deps: IntegrationsDeps) {
  const answer = <T>(req: Request, res: Response, body: T): T | undefined => {
    const etag = etagOf(body);
    res.setHeader('ETag', etag);
    // cacheable by the caller, checked again each time (the answer changes at release times)
    res.setHeader('Cache-Control', 'private, no-cache');
    res.setHeader('Vary', 'Authorization, Cookie');
    if (notModified(req.headers['if-none-match'], etag)) {
      res.status(304).end();
      return undefined;
    }
    return body;
  };

  route(
    router,
    {
      method: 'GET',
      path: '/api/feed/editions',
      summary: 'Published editions readers may see now, newest first, with their puzzles (solutions once the publication\u2019s rule allows)',
      tags: ['feed'],
      query: feedQuerySchema,
      response: feedPageSchema,
      etag: true,
    },
    ({ req, res, query }) => answer(req, res, feedPage(deps, query)),
  );

  route(
    router,
    { method: 'GET', path: '/api/feed/editions/:id', summary: 'One published edition with its puzzles (404 until it is public)', tags: ['feed'], params: idParamSchema, response: feedEditionSchema, etag: true },
    ({ req, res, params }) => answer(req, res, feedEdition(deps, params.id)),
  );
}
