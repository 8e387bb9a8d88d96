import { defineConfig } from 'vitest/config';
import react from '@vitejs/plugin-react';

// Three projects: pure/server tests in Node, React tests in happy-dom, and the
// end-to-end suite that drives the built app in Debian's Chromium.
export default defineConfig({
  test: {
    projects: [
      {
        test: {
          name: 'node',
          environment: 'node',
          include: ['tests/**/*.test.ts'],
          exclude: ['tests/e2e/**', 'node_modules/**'],
          setupFiles: ['tests/setup/node.ts'],
          testTimeout: 60_000,
          hookTimeout: 60_000,
        },
      },
      {
        plugins: [react()],
        test: {
          name: 'dom',
          environment: 'happy-dom',
          include: ['tests/**/*.test.tsx'],
          exclude: ['tests/e2e/**', 'node_modules/**'],
          setupFiles: ['tests/setup/dom.ts'],
          testTimeout: 30_000,
        },
      },
      {
        test: {
          name: 'e2e',
          environment: 'node',
          include: ['tests/e2e/**/*.e2e.test.ts'],
          globalSetup: ['tests/e2e/global-setup.ts'],
          fileParallelism: false,
          testTimeout: 60_000,
          hookTimeout: 120_000,
        },
      },
    ],
  },
});
