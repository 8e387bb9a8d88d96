import type { PlatformDeps } from '../../platform/deps';
import type { PuzzleSource } from '../editions/ports';
import type { PublishedContent } from '../reader/ports';
import type { WebhookSender } from './outbox';

// The integrations area's ports: the webhook sender (built in server/compose.ts; it is also
// the platform's `events` sink), and for the published-content feed the puzzle store's view
// of a puzzle and THE release rule of published content (the reader area's PublishedContent).

export type IntegrationsDeps = PlatformDeps & {
  webhooks: WebhookSender;
  puzzles: PuzzleSource;
  /** THE release rule of published content (the reader area's; interfaces.md 2026-12-04) */
  publishedContent: PublishedContent;
  /** the local receiver answers (development, demo and tests; never a production server without demo) */
  localReceiver: boolean;
};
