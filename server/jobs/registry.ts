import type { JobHandler } from './types';

// eslint-disable-next-line @typescript-eslint/no-explicit-any -- each kind has its own parameter type
type AnyJobHandler = JobHandler<any, unknown>;

// Job kinds: kind -> module with a `handler` export. Adding a kind = one file + one line here.
// Loaded lazily (inside the worker), so the bundler emits each kind as its own chunk.
export const jobKinds: Record<string, () => Promise<{ handler: AnyJobHandler }>> = {
  'foundry-run': () => import('./kinds/foundry-run'),
  'puzzle-prove': () => import('./kinds/puzzle-prove'),
  'test-count': () => import('./kinds/test-count'),
};

export function isJobKind(kind: string): boolean {
  return Object.hasOwn(jobKinds, kind);
}
