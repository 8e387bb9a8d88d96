import compression from 'compression';
import express, { type Express } from 'express';
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { fromRoot } from '../app-root';

/** Production: serve the built client from dist/client, with the SPA fallback for every other GET. */
export function serveBuiltClient(app: Express, folder = fromRoot('dist', 'client')): void {
  const index = join(folder, 'index.html');
  if (!existsSync(index)) throw new Error(`no built client at ${folder} (run npm run build)`);
  // gzip the scripts, styles and pages (a reader on a slow link downloads a third of the bytes)
  app.use(compression());
  app.use(express.static(folder, { index: false, maxAge: '1h' }));
  app.get('/{*splat}', (_req, res) => {
    res.setHeader('Cache-Control', 'no-cache');
    res.sendFile(index);
  });
}
