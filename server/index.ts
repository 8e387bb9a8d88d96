import { exitOnSignals, startServer, startupErrorText } from './bootstrap';
import { serveBuiltClient } from './platform/http/static-client';

// Production entry (bundled to dist/server/index.js by `npm run build`).
try {
  const server = await startServer({
    source: { NODE_ENV: 'production', ...process.env },
    prepareClient: async () => (app) => serveBuiltClient(app),
  });
  exitOnSignals(server.close);
} catch (err) {
  console.error(startupErrorText(err));
  process.exit(1);
}
