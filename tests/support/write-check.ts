// Every write the request thread makes while answering a request must come after a write turn
// (server/db/write-turns.ts): otherwise it may meet a pool worker's write lock and wait in SQLite's busy
// handler, holding the whole event loop. The test apps wrap their connection so that a writing statement
// run during a request with no turn held is recorded as a server error: the test after which it ran
// fails (tests/setup/server-errors.ts). Writes outside requests (a test's own set-up) are not looked at.
import { AsyncLocalStorage } from 'node:async_hooks';
import type Database from 'better-sqlite3';
import type { Express } from 'express';
import type { WriteTurns } from '@server/db/write-turns';
import { recordServerError } from './server-errors';

const inRequest = new AsyncLocalStorage<true>();

type Method = 'run' | 'get' | 'all' | 'iterate';

export function checkWritesTakeTurns(app: Express, sqlite: Database.Database, turns: WriteTurns): void {
  const handle = (app as unknown as { handle: (...args: unknown[]) => unknown }).handle.bind(app);
  (app as unknown as { handle: (...args: unknown[]) => unknown }).handle = (...args: unknown[]) =>
    inRequest.run(true, () => handle(...args));
  const prepare = sqlite.prepare.bind(sqlite);
  sqlite.prepare = ((source: string) => {
    const statement = prepare(source);
    if (statement.readonly) return statement;
    for (const method of ['run', 'get', 'all', 'iterate'] as Method[]) {
      const original = (statement[method] as (...a: unknown[]) => unknown).bind(statement);
      (statement as unknown as Record<Method, (...a: unknown[]) => unknown>)[method] = (...a: unknown[]) => {
        if (inRequest.getStore() && Atomics.load(turns.main, 0) === 0) {
          recordServerError('A write on the request thread without a write turn', new Error(source.slice(0, 200)));
        }
        return original(...a);
      };
    }
    return statement;
  }) as typeof sqlite.prepare;
}
