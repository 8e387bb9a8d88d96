import type { AppDeps } from '../deps';
import type { ApiRouter } from '../http/route';
import { registerAccountRoutes } from './accounts';
import { registerFoundationRoutes } from './foundation';
import { registerFoundryRoutes } from './foundry';
import { registerMoneyRoutes } from './payouts';
import { registerStockRoutes } from './stock';
import { registerSubmissionRoutes } from './submissions';
import { registerTilingRoutes } from './tilings';
import { registerEditionRoutes } from './editions';
import { registerPublicationRoutes } from './publications';
import { registerTemplateRoutes } from './templates';
import { registerPuzzleRoutes } from './puzzles';

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
