import type { ComponentType } from 'react';
import type { Role } from '../lib/roles';

/** What a lazy page loader resolves to (React Router's `lazy` shape). */
export interface LazyPage {
  Component: ComponentType;
}

/** One signed-in page of the app. */
export interface AppRoute {
  /** Path below the root, without a leading slash: 'stock', 'stock/:id', 'admin/users'. */
  path: string;
  /** Page title (shown in the browser tab and, for placeholders, on the page). */
  title: string;
  /** Roles that may open the page. The client only hides; the server enforces. */
  roles: readonly Role[];
  /** The page, loaded lazily. Leave it out while the feature is not built: a "coming soon" page is shown. */
  page?: () => Promise<LazyPage>;
  /** One sentence for the "coming soon" placeholder. */
  summary?: string;
}

/**
 * Wraps a dynamic import of a feature module with a named page export into the shape
 * React Router's `lazy` expects:
 * `page: lazyPage(() => import('../features/stock/components/stock-page'), 'StockPage')`.
 */
export function lazyPage<M extends Record<string, unknown>, K extends keyof M & string>(
  load: () => Promise<M>,
  exportName: K,
): () => Promise<LazyPage> {
  return async () => {
    const mod = await load();
    const Component = mod[exportName];
    if (typeof Component !== 'function' && (typeof Component !== 'object' || Component === null)) {
      throw new Error(`Page module has no component export named "${exportName}"`);
    }
    return { Component: Component as ComponentType };
  };
}
