import { existsSync } from 'node:fs';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { fromRoot } from '../app-root';

// Where the worker script lives. From source (tsx, vitest) this module is a .ts file and the
// worker loads server/worker-entry.ts through tsx's loader; in the bundle
// (vite build --ssr, see vite.config.ts rollupOptions.input) it is dist/server/job-worker.js.
export interface WorkerSpec {
  url: URL;
  /** true when the entry is TypeScript source that needs the tsx loader */
  source: boolean;
}

/**
 * A worker entry: its TypeScript source when this runs from source, else its bundle
 * dist/server/<bundle>.js (vite.config.ts serverEntries). Default: the job worker.
 */
export function workerSpec(entry: { source: URL; bundle: string } = { source: new URL('../../worker-entry.ts', import.meta.url), bundle: 'job-worker' }): WorkerSpec {
  const here = fileURLToPath(import.meta.url);
  if (here.endsWith('.ts')) return { url: entry.source, source: true };
  const bundled = fromRoot('dist', 'server', `${entry.bundle}.js`);
  if (!existsSync(bundled)) throw new Error(`worker bundle missing: ${bundled} (run npm run build)`);
  return { url: pathToFileURL(bundled), source: false };
}

/** A data: URL module that registers tsx and then imports the TypeScript worker entry. */
export function sourceBootstrap(entry: URL): URL {
  const api = pathToFileURL(fromRoot('node_modules', 'tsx', 'dist', 'esm', 'api', 'index.mjs')).href;
  const code = `import { register } from ${JSON.stringify(api)}; register(); await import(${JSON.stringify(entry.href)});`;
  return new URL('data:text/javascript,' + encodeURIComponent(code));
}
