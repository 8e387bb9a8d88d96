import { startServer, exitOnSignals } from './bootstrap';
import { EnvError } from './env';
import { serveBuiltClient } from './http/static-client';

// Production entry (bundled to dist/server/index.js by `npm run build`).
try {
  const server = await startServer({
    source: { NODE_ENV: 'production', ...process.env },
    prepareClient: async () => (app) => serveBuiltClient(app),
  });
  exitOnSignals(server.close);
} catch (err) {
  console.error(err instanceof EnvError ? err.message : err);
  process.exit(1);
}
