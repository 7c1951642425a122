import type Database from 'better-sqlite3';
import type { AppLucia } from '@server/auth/session';
import type { Db } from '@server/db/client';
import type { SignInLimits } from '@server/features/auth/sign-in-limiter';
import type { Mailer } from '@server/mail/mailer';
import type { JobPool } from '@server/pool';
import type { WriteTurns } from '@server/db/write-turns';

/** What the features need from the outside world; built in server/index.ts or by a test. */
export interface AppContext {
  db: Db;
  sqlite: Database.Database;
  lucia: AppLucia;
  mailer: Mailer;
  /** Worker threads for heavy computation (server/pool). */
  pool: JobPool;
  /** Keeps the request thread's writes and the pool's apart (server/db/write-turns.ts). */
  writeTurns: WriteTurns;
  config: {
    production: boolean;
    publicUrl: string;
    /** Uploaded files, named by content hash; never under the web root. */
    uploadsDir: string;
    /** Built client to serve, if any. */
    clientDir?: string;
    signInLimits: SignInLimits;
    /** Host names the app answers to (PUBLIC_URL's host, LUGBOOK_ALLOWED_HOSTS, and outside production localhost). */
    allowedHosts: string[];
    /** Where structured request logs go (one JSON line per request); none when absent. */
    requestLog?: NodeJS.WritableStream;
  };
  log: (message: string, detail?: unknown) => void;
}
