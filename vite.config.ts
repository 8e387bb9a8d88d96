import { defineConfig } from 'vite';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';

// The two builds' entries, typed alike (two different object shapes in one conditional do not
// type-check as Rollup's input).
const serverEntries: Record<string, string> = { index: 'server/index.ts', 'job-worker': 'server/worker-entry.ts', 'stock-reader': 'server/areas/stock/stock-reader-thread.ts' };
const clientEntries: Record<string, string> = { index: 'index.html', 'reader-play': 'src/reader/main.tsx', 'reader-embed': 'src/reader/embed-height.ts', reader: 'src/reader/reader.css' };

// Client build goes to dist/client. The server is bundled separately with
// `vite build --ssr --outDir dist/server` with the entries listed below (see package.json).
export default defineConfig(({ isSsrBuild }) => ({
  plugins: isSsrBuild ? [] : [react(), tailwindcss()],
  // The server bundle has no React plugin: its JSX (the PDF layout) must use React's
  // production runtime (jsx/jsxs), not the development one (jsxDEV) production React lacks.
  ...(isSsrBuild ? { oxc: { jsx: { runtime: 'automatic' as const, development: false } } } : {}),
  build: isSsrBuild
    ? {
        target: 'node20',
        emptyOutDir: true,
        // public/ belongs to the client build only.
        copyPublicDir: false,
        rollupOptions: {
          // Extra server entries (worker threads) are listed in serverEntries above. The build runs
          // `vite build --ssr` without an entry argument, which would override this list.
          input: serverEntries,
          output: { entryFileNames: '[name].js', format: 'es' },
        },
      }
    : {
        outDir: 'dist/client',
        emptyOutDir: true,
        // the readers' pages are server-rendered and load their own small entries (not the
        // staff app): the server finds the built files in .vite/manifest.json (server/areas/reader/page-assets.ts)
        manifest: true,
        rollupOptions: {
          input: clientEntries,
        },
      },
  ssr: { noExternal: [] },
}));
