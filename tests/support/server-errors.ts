// Errors the server logged during a test (its error handler's "Unhandled error": a 500). The test
// apps record them here and tests/setup/server-errors.ts fails the test after which any was
// logged. Kept on globalThis so the setup file and the test file see the same list.
const KEY = Symbol.for('lugbook.tests.serverErrors');
const store = globalThis as unknown as Record<symbol, string[] | undefined>;

function list(): string[] {
  return (store[KEY] ??= []);
}

export function recordServerError(message: string, detail: unknown): void {
  list().push(`${message}: ${detail instanceof Error ? (detail.stack ?? detail.message) : String(detail)}`);
}

/** The errors logged since the last call, and forgets them. */
export function takeServerErrors(): string[] {
  return list().splice(0);
}
