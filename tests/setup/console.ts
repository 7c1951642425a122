import { afterEach, beforeEach, vi } from 'vitest';

// console.error during a test is a failure: it usually hides a swallowed exception.
let errors: unknown[][] = [];
beforeEach(() => {
  errors = [];
  vi.spyOn(console, 'error').mockImplementation((...args: unknown[]) => {
    errors.push(args);
  });
});
afterEach(() => {
  vi.restoreAllMocks();
  if (errors.length > 0) {
    throw new Error(`console.error was called:\n${errors.map((a) => a.map(String).join(' ')).join('\n')}`);
  }
});
