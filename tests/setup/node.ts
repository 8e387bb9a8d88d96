import { afterEach, beforeEach, vi } from 'vitest';

// An unexpected console.error fails the test (strict harness). Tests that expect
// an error log spy on console.error themselves and restore it.
let errorSpy: ReturnType<typeof vi.spyOn> | undefined;
beforeEach(() => {
  errorSpy = vi.spyOn(console, 'error').mockImplementation((...args: unknown[]) => {
    throw new Error(`unexpected console.error: ${args.map(String).join(' ')}`);
  });
});
afterEach(() => {
  errorSpy?.mockRestore();
});
