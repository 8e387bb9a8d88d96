import type { PlatformDeps } from '../../platform/deps';
import { createEndpoint } from './webhooks';
import { localReceiverPath } from './receiver';

// Demo: an endpoint at this server's own local receiver, for every event, registered before
// the other seeders run, so the demo's reviews, proof round and publishing show up as signed
// deliveries on the Webhooks page (admin) as soon as the server starts.
export function seedDemoWebhooks(deps: Pick<PlatformDeps, 'db' | 'clock' | 'env'>): void {
  createEndpoint(deps, null, {
    url: `${deps.env.PUBLIC_URL.replace(/\/$/, '')}${localReceiverPath}`,
    description: 'Local receiver (demo): shows what a receiving system would get',
    events: ['edition.published', 'edition.proof_sent', 'edition.proof_returned', 'edition.approved', 'submission.reviewed', 'foundry.run_finished', 'payout.paid'],
  });
}
