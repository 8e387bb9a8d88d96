import { createServer as createViteServer } from 'vite';
import { exitOnSignals, startServer, startupErrorText } from './bootstrap';

// `npm run dev`: one process, one port; Vite runs as Express middleware and shares the
// HTTP server for its websocket (no second port).
try {
  const server = await startServer({
    prepareClient: async (httpServer) => {
      const vite = await createViteServer({
        server: { middlewareMode: true, ws: { server: httpServer } },
        appType: 'spa',
      });
      httpServer.on('close', () => void vite.close());
      return (app) => {
        app.use(vite.middlewares);
      };
    },
  });
  exitOnSignals(server.close);
} catch (err) {
  console.error(startupErrorText(err));
  process.exit(1);
}
