import type { ApiKeyScope } from '../../../shared/contracts/integrations';

// Which routes an API key may call, by scope. A request with `Authorization: Bearer <key>`
// passes the permission table as the key's owner (permissions.ts) AND needs the route's scope
// here; a route not listed cannot be called with a key (403). Keys are for scripts and other
// systems: reading the stock, submitting and reviewing, reading puzzles and editions, foundry runs.
// Areas: add a line when a route should be open to scripts (`METHOD path` exactly as registered).

export const apiKeyScopeOfRoute: Record<string, ApiKeyScope> = {
  'GET /api/stock': 'stock:read',
  'GET /api/stock/:id': 'stock:read',
  'GET /api/stock/:id/image.png': 'stock:read',
  'GET /api/stock/export.txt': 'stock:read',
  'GET /api/stock/export.csv': 'stock:read',
  'GET /api/stock/summary': 'stock:read',
  'GET /api/submissions': 'submissions:read',
  'GET /api/submissions/:id': 'submissions:read',
  'POST /api/submissions': 'submissions:write',
  'POST /api/submissions/upload': 'submissions:write',
  'GET /api/submissions/uploads/:id': 'submissions:read',
  'POST /api/submissions/uploads/:id/cancel': 'submissions:write',
  'POST /api/submissions/uploads/:id/retry': 'submissions:write',
  'POST /api/submissions/:id/accept': 'submissions:write',
  'POST /api/submissions/:id/reject': 'submissions:write',
  'POST /api/submissions/bulk': 'submissions:write',
  'POST /api/tilings/check': 'submissions:write',
  'GET /api/puzzles': 'puzzles:read',
  'GET /api/puzzles/:id': 'puzzles:read',
  'POST /api/puzzles': 'puzzles:write',
  'PATCH /api/puzzles/:id': 'puzzles:write',
  'POST /api/puzzles/:id/recheck': 'puzzles:write',
  'GET /api/editions': 'editions:read',
  'GET /api/editions/:id': 'editions:read',
  'GET /api/publications': 'editions:read',
  'GET /api/feed/editions': 'editions:read',
  'GET /api/feed/editions/:id': 'editions:read',
  'GET /api/foundry/runs': 'foundry:read',
  'GET /api/foundry/runs/:id': 'foundry:read',
  'GET /api/foundry/runs/:id/results': 'foundry:read',
  'POST /api/foundry/runs': 'foundry:write',
  'POST /api/foundry/runs/:id/cancel': 'foundry:write',
  'POST /api/foundry/runs/:id/retry': 'foundry:write',
};
