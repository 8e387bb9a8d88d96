import type { Role } from '../../../shared/contracts/common';

// THE table of which role may call what. Every route registered through
// server/platform/http/route.ts must have an entry here (`METHOD /path` exactly as registered),
// or the app refuses to start. 'public' = no session needed; 'signed-in' = any role.
// An admin may do everything an editor may (see `isAllowed`).
// Areas: add your lines in your own block, keep them sorted by path.

export type Access = 'public' | 'signed-in' | readonly Role[];

export const permissions: Record<string, Access> = {
  // foundation
  'GET /api/health': 'public',
  'GET /api/public/config': 'public',
  'GET /api/openapi.json': 'public',
  'GET /api/me': 'signed-in',
  'GET /api/session': 'public',
  'POST /api/invitations': ['admin'],
  'GET /api/invitations': ['admin'],
  'POST /api/invitations/:id/resend': ['admin'],
  'POST /api/invitations/:id/revoke': ['admin'],
  'GET /api/invitations/:token': 'public',
  'POST /api/invitations/:token/accept': 'public',
  'GET /api/admin/users': ['admin'],
  'PATCH /api/admin/users/:id': ['admin'],
  'GET /api/mailbox': ['admin'],
  'GET /api/mailbox/:id': ['admin'],
  // payouts and earnings (setters' fees)
  'GET /api/earnings': ['setter'],
  'POST /api/earnings/payout-details': ['setter'],
  'GET /api/earnings/statements/:month': ['setter'],
  'GET /api/earnings/statements/:month.csv': ['setter'],
  'POST /api/earnings/statements/:month/send': ['setter'],
  'POST /api/ledger/corrections': ['editor'],
  'POST /api/payments/webhook': 'public',
  'GET /api/payouts': ['editor'],
  'POST /api/payouts/:id/retry': ['editor'],
  'POST /api/payouts/runs': ['editor'],
  // intake and stock (setters submit, editors review; printers see none of it)
  'GET /api/stock': ['editor'],
  'GET /api/stock/:id': ['editor'],
  'GET /api/stock/:id/image.png': ['editor'],
  'GET /api/stock/export.txt': ['editor'],
  'GET /api/stock/export.csv': ['editor'],
  'GET /api/stock/summary': ['editor'],
  // puzzles (editors make and prove them; printers and setters see none of it)
  'POST /api/puzzles': ['editor'],
  'GET /api/puzzles': ['editor'],
  'GET /api/puzzles/:id': ['editor'],
  'PATCH /api/puzzles/:id': ['editor'],
  'POST /api/puzzles/:id/recheck': ['editor'],
  'POST /api/puzzles/:id/cancel': ['editor'],
  'GET /api/submissions': ['setter', 'editor'],
  'POST /api/submissions': ['setter'],
  'GET /api/submissions/:id': ['setter', 'editor'],
  'POST /api/submissions/:id/accept': ['editor'],
  'POST /api/submissions/:id/reject': ['editor'],
  'POST /api/submissions/bulk': ['editor'],
  'POST /api/submissions/upload': ['setter'],
  'GET /api/submissions/uploads/:id': ['setter'],
  'POST /api/submissions/uploads/:id/cancel': ['setter'],
  'POST /api/submissions/uploads/:id/retry': ['setter'],
  'POST /api/tilings/check': ['setter', 'editor'],
  // foundry (editors and admins only)
  'GET /api/foundry/runs': ['editor'],
  'POST /api/foundry/runs': ['editor'],
  'GET /api/foundry/runs/:id': ['editor'],
  'POST /api/foundry/runs/:id/cancel': ['editor'],
  'POST /api/foundry/runs/:id/retry': ['editor'],
  'GET /api/foundry/runs/:id/results': ['editor'],
  // print: publications, page templates, editions and the proof round
  'GET /api/editions': ['editor', 'printer'],
  'POST /api/editions': ['editor'],
  'GET /api/editions/:id': ['editor', 'printer'],
  'PATCH /api/editions/:id': ['editor'],
  'GET /api/editions/:id/checks': ['editor'],
  'GET /api/editions/:id/press.pdf': ['editor', 'printer'],
  'GET /api/editions/:id/preview.pdf': ['editor'],
  'POST /api/editions/:id/proofs': ['editor'],
  'GET /api/editions/:id/proofs/:version.pdf': ['editor', 'printer'],
  'POST /api/editions/:id/proofs/:version/approve': ['printer'],
  'POST /api/editions/:id/proofs/:version/return': ['printer'],
  'POST /api/editions/:id/publish': ['editor'],
  'GET /api/editions/:id/publish-check': ['editor'],
  'GET /api/editions/due': ['editor'],
  'GET /api/publications': ['editor'],
  'POST /api/publications': ['admin'],
  'PATCH /api/publications/:id': ['admin'],
  'PUT /api/publications/:id/output-profile': ['admin'],
  'GET /api/publications/:id/press-spec': ['editor'],
  'PUT /api/publications/:id/press-spec': ['admin'],
  'GET /api/publications/:id/printers': ['admin'],
  'PUT /api/publications/:id/printers': ['admin'],
  'GET /api/editions/:id/layout-package.zip': ['editor'],
  'GET /api/puzzles/:id/layout-package.zip': ['editor'],
  'GET /api/templates': ['editor'],
  'GET /api/templates/:id/sample.pdf': ['editor'],
  // reader edition: public pages' data, checks and anonymous solve events (no session); the
  // editor's solve statistics, calibration and shown grades; the admin's reader settings
  'GET /api/reader/public/:slug': 'public',
  'GET /api/reader/public/:slug/:number': 'public',
  'GET /api/reader/public/:slug/:number/:position': 'public',
  'POST /api/reader/public/:slug/:number/:position/check': 'public',
  'POST /api/reader/public/:slug/:number/:position/events': 'public',
  'POST /api/reader/public/:slug/:number/:position/reveal': 'public',
  'GET /api/reader/calibration': ['editor'],
  'GET /api/reader/puzzles/:id/grade': ['editor'],
  'PUT /api/reader/puzzles/:id/grade': ['editor'],
  'GET /api/reader/settings': ['editor'],
  'PUT /api/reader/settings/:id': ['admin'],
  'GET /api/reader/stats': ['editor'],
  // integrations: API keys (editors their own, admins all), webhooks (admins), the feed
  'GET /api/api-keys': ['editor'],
  'POST /api/api-keys': ['editor'],
  'POST /api/api-keys/:id/revoke': ['editor'],
  'GET /api/feed/editions': ['editor'],
  'GET /api/feed/editions/:id': ['editor'],
  'GET /api/webhooks/deliveries': ['admin'],
  'GET /api/webhooks/deliveries/:id': ['admin'],
  'POST /api/webhooks/deliveries/:id/resend': ['admin'],
  'GET /api/webhooks/endpoints': ['admin'],
  'POST /api/webhooks/endpoints': ['admin'],
  'PATCH /api/webhooks/endpoints/:id': ['admin'],
  'DELETE /api/webhooks/endpoints/:id': ['admin'],
  'POST /api/webhooks/endpoints/:id/secret': ['admin'],
  'GET /api/webhooks/local-receiver': ['admin'],
  'POST /api/webhooks/local-receiver': 'public',
};

export function isAllowed(access: Access, role: Role | null): boolean {
  if (access === 'public') return true;
  if (role === null) return false;
  if (access === 'signed-in') return true;
  if (access.includes(role)) return true;
  return role === 'admin' && access.includes('editor');
}
