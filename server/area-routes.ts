import type { AppDeps } from './app-deps';
import { registerAccountRoutes } from './areas/accounts/index';
import { registerEditionDueRoutes, registerEditionRoutes, registerPublicationRoutes } from './areas/editions/index';
import { registerFoundryRoutes } from './areas/foundry/index';
import { registerFeedRoutes, registerIntegrationRoutes } from './areas/integrations/index';
import { registerTilingRoutes, registerSubmissionRoutes } from './areas/intake/index';
import { registerMailboxRoutes } from './areas/mailbox/index';
import { registerMoneyRoutes } from './areas/payouts/index';
import { registerTemplateRoutes } from './areas/print/index';
import { registerPuzzleRoutes } from './areas/puzzles/index';
import { registerReaderPages, registerReaderRoutes } from './areas/reader/index';
import { registerStockRoutes } from './areas/stock/index';
import type { ApiRouter } from './platform/http/route';
import { registerSystemRoutes } from './platform/http/system-routes';

// Every area's router, one line each (add yours). Each registers with route().
export const areaRoutes: ((router: ApiRouter, deps: AppDeps) => void)[] = [
  registerSystemRoutes,
  registerAccountRoutes,
  registerMailboxRoutes,
  registerMoneyRoutes,
  registerTilingRoutes,
  registerSubmissionRoutes,
  registerStockRoutes,
  registerFoundryRoutes,
  registerPuzzleRoutes,
  registerTemplateRoutes,
  registerPublicationRoutes,
  // before registerEditionRoutes: /api/editions/due must not be read as /api/editions/:id
  registerEditionDueRoutes,
  registerEditionRoutes,
  registerIntegrationRoutes,
  registerFeedRoutes,
  registerReaderRoutes,
  // the readers' HTML pages (/read, /embed): not API routes, registered on the same router
  registerReaderPages,
];
