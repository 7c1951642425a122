import { WriteTurns } from '@server/db/write-turns';
import fs from 'node:fs';
import { createLucia } from '@server/auth/session';
import { openDatabase } from '@server/db/client';
import type { AppContext } from '@server/context';
import { DEFAULT_SIGN_IN_LIMITS, type SignInLimits } from '@server/features/auth/sign-in-limiter';
import { labelClashes } from '@server/features/parts/repository';
import { createMailer } from '@server/mail/mailer';
import { allowedHostNames } from '@server/http/hosts';
import { createJobPool, poolOptionsFromEnv, type PoolOptions } from '@server/pool';

export interface ContextOptions {
  dbFile: string;
  uploadsDir: string;
  production?: boolean;
  publicUrl?: string;
  smtpUrl?: string;
  mailFrom?: string;
  clientDir?: string;
  signInLimits?: SignInLimits;
  /** Extra host names to answer to (LUGBOOK_ALLOWED_HOSTS), beside PUBLIC_URL's host. */
  allowedHosts?: string[];
  requestLog?: NodeJS.WritableStream;
  log?: AppContext['log'];
  /** The job pool's threads, queue and time budget; default from the environment (server/pool). */
  pool?: PoolOptions;
}

/** Opens the database (migrating it) and wires the services the app needs. */
export function createContext(opts: ContextOptions): AppContext {
  const { db, sqlite } = openDatabase(opts.dbFile);
  fs.mkdirSync(opts.uploadsDir, { recursive: true });
  const log: AppContext['log'] = opts.log ?? ((message, detail) => console.error(`[lugbook] ${message}`, detail ?? ''));
  // Labels that differ only in case, from before labels were compared without case: nothing is
  // renamed; an admin sees them here and on the Team screen, and a look-up by one answers 409.
  for (const clash of labelClashes(db)) {
    log(`Part labels differ only in case (rename one): ${clash.parts.map((p) => `${p.label} (id ${p.id})`).join(', ')}`);
  }
  const writeTurns = new WriteTurns();
  const pool = createJobPool(opts.pool ?? poolOptionsFromEnv(), writeTurns);
  return {
    db,
    sqlite,
    lucia: createLucia(db, { production: opts.production ?? false, writeTurns }),
    pool,
    writeTurns,
    mailer: createMailer(db, {
      smtpUrl: opts.smtpUrl,
      from: opts.mailFrom ?? 'Lugbook <no-reply@lugbook.test>',
      writeTurns,
      pool,
      dbFile: sqlite.name,
    }),
    config: {
      production: opts.production ?? false,
      publicUrl: opts.publicUrl ?? 'http://localhost:3000',
      uploadsDir: opts.uploadsDir,
      clientDir: opts.clientDir,
      signInLimits: opts.signInLimits ?? DEFAULT_SIGN_IN_LIMITS,
      allowedHosts: allowedHostNames(opts.publicUrl ?? 'http://localhost:3000', opts.allowedHosts ?? [], opts.production ?? false),
      ...(opts.requestLog ? { requestLog: opts.requestLog } : {}),
    },
    log,
  };
}
