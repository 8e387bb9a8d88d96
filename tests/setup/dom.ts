import { afterEach, beforeEach, vi } from 'vitest';
import { cleanup } from '@testing-library/react';

// happy-dom's page URL is http://localhost:3000/: no test may reach a real server.
// Tests stub fetch themselves (vi.stubGlobal('fetch', ...)); the default refuses.
beforeEach(() => {
  vi.stubGlobal('fetch', vi.fn(async (input: unknown) => {
    throw new Error(`unstubbed fetch in a DOM test: ${String(input)}`);
  }));
  vi.spyOn(console, 'error').mockImplementation((...args: unknown[]) => {
    throw new Error(`unexpected console.error: ${args.map(String).join(' ')}`);
  });
});
afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
  vi.restoreAllMocks();
});
