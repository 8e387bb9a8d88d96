import type { JobHandler } from './platform/jobs/types';

// eslint-disable-next-line @typescript-eslint/no-explicit-any -- each kind has its own parameter type
type AnyJobHandler = JobHandler<any, unknown>;

// Job kinds: kind -> module with a `handler` export. Adding a kind = one file + one line here.
// Loaded lazily (inside the worker), so the bundler emits each kind as its own chunk.
export const jobKinds: Record<string, () => Promise<{ handler: AnyJobHandler }>> = {
  'foundry-run': () => import('./areas/foundry/run-job'),
  'puzzle-prove': () => import('./areas/puzzles/prove-job'),
  'print-render': () => import('./areas/print/render-job'),
  'print-layout-package': () => import('./areas/print/layout-package-job'),
  'tiling-png': () => import('./areas/stock/png-job'),
  'intake-upload': () => import('./areas/intake/upload-job'),
  'test-count': () => import('./platform/jobs/test-count-job'),
};

/** The kinds' names, for the job runner (started in server/compose.ts). */
export const jobKindNames: ReadonlySet<string> = new Set(Object.keys(jobKinds));
