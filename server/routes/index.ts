import type { AppDeps } from '../deps';
import type { ApiRouter } from '../http/route';
import { registerAccountRoutes } from './accounts';
import { registerFoundationRoutes } from './foundation';

// Every area's router, one line each (add yours). Each registers with route().
export const areaRoutes: ((router: ApiRouter, deps: AppDeps) => void)[] = [
  registerFoundationRoutes,
  registerAccountRoutes,
];
