// Proving that a route does its work in the job pool: while `run` runs, the app's pool refuses every job
// (503 busy, as with every worker busy and its queue full), and the jobs the route asked for are recorded.
import { vi } from 'vitest';
import { HttpError } from '@server/http/errors';
import type { JobPool } from '@server/pool';

export async function withPoolRefusing<T>(pool: JobPool, run: () => Promise<T>): Promise<{ result: T; asked: string[] }> {
  const asked: string[] = [];
  const spy = vi.spyOn(pool, 'run').mockImplementation(((name: string) => {
    asked.push(name);
    return Promise.reject(new HttpError(503, 'busy', 'The server is busy.', undefined, undefined, { 'Retry-After': '5' }));
  }) as unknown as JobPool['run']);
  try {
    return { result: await run(), asked };
  } finally {
    spy.mockRestore();
  }
}
