import { afterEach, vi } from "vitest";

// A stray console.error in a test is a failure: it usually hides a swallowed exception.
const originalError = console.error;
let errors: unknown[][] = [];
console.error = (...args: unknown[]) => {
  errors.push(args);
  originalError(...args);
};
afterEach(() => {
  const seen = errors;
  errors = [];
  vi.restoreAllMocks();
  if (seen.length > 0) throw new Error(`console.error was called during the test: ${String(seen[0][0])}`);
});
