import { runIdParamsSchema, runListSchema, runRequestSchema, runResultsQuerySchema, runResultsSchema, runSchema } from '../../../shared/contracts/foundry';
import { route, type ApiRouter } from '../../platform/http/route';
import { jobRunnerFor } from '../../platform/jobs/runtime';
import type { FoundryDeps } from './ports';
import { cancelRun, getRun, listRuns, runResults, startRun } from './runs';

export function registerFoundryRoutes(router: ApiRouter, deps: FoundryDeps) {
  const tags = ['foundry'];
  // Created at start-up: jobs a previous process left running become interrupted now.
  const runner = jobRunnerFor(deps.db);

  route(
    router,
    { method: 'POST', path: '/api/foundry/runs', summary: 'Start a foundry run (exhaustive by order, random with filters, or joining) in the worker pool', tags, body: runRequestSchema, response: runSchema, status: 201 },
    ({ body, user }) => startRun(deps, runner, body, user.id),
  );
  route(
    router,
    { method: 'GET', path: '/api/foundry/runs', summary: 'Foundry runs, newest first, with progress, rate and time left', tags, response: runListSchema },
    () => listRuns(deps.db, runner),
  );
  route(
    router,
    { method: 'GET', path: '/api/foundry/runs/:id', summary: 'One foundry run with its progress', tags, params: runIdParamsSchema, response: runSchema },
    ({ params }) => getRun(deps.db, runner, params.id),
  );
  route(
    router,
    { method: 'POST', path: '/api/foundry/runs/:id/cancel', summary: 'Cancel a queued or running foundry run (what it found so far stays in the stock)', tags, params: runIdParamsSchema, response: runSchema },
    ({ params }) => cancelRun(deps.db, runner, params.id),
  );
  route(
    router,
    { method: 'GET', path: '/api/foundry/runs/:id/results', summary: 'The tilings a foundry run found', tags, params: runIdParamsSchema, query: runResultsQuerySchema, response: runResultsSchema },
    ({ params, query }) => runResults(deps.db, runner, params.id, query.page, query.pageSize),
  );
}
