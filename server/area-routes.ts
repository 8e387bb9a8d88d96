import type { AppDeps } from './platform/deps';
import type { ApiRouter } from './platform/http/route';
import { registerAccountRoutes } from './areas/accounts/routes';
import { registerFoundationRoutes } from './platform/http/system-routes';
import { registerFoundryRoutes } from './areas/foundry/routes';
import { registerMoneyRoutes } from './areas/payouts/routes';
import { registerStockRoutes } from './areas/stock/routes';
import { registerSubmissionRoutes } from './areas/intake/routes';
import { registerTilingRoutes } from './areas/intake/check-routes';
import { registerEditionRoutes } from './areas/editions/routes';
import { registerPublicationRoutes } from './areas/editions/publication-routes';
import { registerTemplateRoutes } from './areas/print/routes';
import { registerPuzzleRoutes } from './areas/puzzles/routes';

// Every area's router, one line each (add yours). Each registers with route().
export const areaRoutes: ((router: ApiRouter, deps: AppDeps) => void)[] = [
  registerFoundationRoutes,
  registerAccountRoutes,
  registerMoneyRoutes,
  registerTilingRoutes,
  registerSubmissionRoutes,
  registerStockRoutes,
  registerFoundryRoutes,
  registerPuzzleRoutes,
  registerTemplateRoutes,
  registerPublicationRoutes,
  registerEditionRoutes,
];
