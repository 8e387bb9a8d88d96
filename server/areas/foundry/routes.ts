import { runIdParamsSchema, runListSchema, runRequestSchema, runResultsQuerySchema, runResultsSchema, runRetrySchema, runSchema } from '../../../shared/contracts/foundry';
import { route, type ApiRouter } from '../../platform/http/route';
import type { FoundryDeps } from './ports';
import { cancelRun, getRun, listRuns, retryRun, runResults, startRun } from './runs';

export function registerFoundryRoutes(router: ApiRouter, deps: FoundryDeps) {
  const tags = ['foundry'];

  route(
    router,
    { method: 'POST', path: '/api/foundry/runs', summary: 'Start a foundry run (exhaustive by order, random with filters, or joining) on the job workers; answers at once', tags, body: runRequestSchema, response: runSchema, status: 201 },
    ({ body, user }) => startRun(deps, body, user.id),
  );
  route(
    router,
    { method: 'GET', path: '/api/foundry/runs', summary: 'Foundry runs, newest first, with progress, rate and time left', tags, response: runListSchema },
    () => listRuns(deps),
  );
  route(
    router,
    { method: 'GET', path: '/api/foundry/runs/:id', summary: 'One foundry run with its progress', tags, params: runIdParamsSchema, response: runSchema },
    ({ params }) => getRun(deps, params.id),
  );
  route(
    router,
    { method: 'POST', path: '/api/foundry/runs/:id/cancel', summary: 'Cancel a queued or running foundry run: it stops within 2 s, nothing more is stored, what it stored stays in the stock', tags, params: runIdParamsSchema, response: runSchema },
    ({ params }) => cancelRun(deps, params.id),
  );
  route(
    router,
    { method: 'POST', path: '/api/foundry/runs/:id/retry', summary: 'Run an interrupted, failed or cancelled foundry run again: resume (finished shards kept) or restart', tags, params: runIdParamsSchema, body: runRetrySchema, response: runSchema },
    ({ params, body }) => retryRun(deps, params.id, body.how),
  );
  route(
    router,
    { method: 'GET', path: '/api/foundry/runs/:id/results', summary: 'The tilings a foundry run found', tags, params: runIdParamsSchema, query: runResultsQuerySchema, response: runResultsSchema },
    ({ params, query }) => runResults(deps, params.id, query.page, query.pageSize),
  );
}
