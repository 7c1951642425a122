// A fresh app on its own migrated SQLite file per test file, with one signed-in agent per role.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import request from 'supertest';
import type TestAgent from 'supertest/lib/agent';
import { createApp } from '@server/app';
import { createContext } from '@server/bootstrap';
import type { AppContext } from '@server/context';
import { DEMO_USERS, seedDemo } from '@server/demo/seed';
import type { SignInLimits } from '@server/features/auth/sign-in-limiter';
import type { Role } from '@shared/schemas/common';
import { poolOptionsFromEnv, type PoolOptions } from '@server/pool';
import { recordServerError } from './server-errors';
import { checkWritesTakeTurns } from './write-check';

export const TEST_PASSWORD = 'correct-horse-bench-staple';
export const ORIGIN = 'http://lugbook.test';
export const HOST = 'lugbook.test';

export interface TestApp {
  app: ReturnType<typeof createApp>;
  ctx: AppContext;
  dataDir: string;
  /** An agent that sends the app's own Origin/Host, without a session. */
  anon(): TestAgent;
  /** An agent signed in as the demo user of that role. */
  as(role: Role): Promise<TestAgent>;
  close(): void;
}

export function newAgent(app: TestApp['app']): TestAgent {
  return request.agent(app).set('Origin', ORIGIN).set('Host', HOST);
}

export async function createTestApp(
  opts: {
    signInLimits?: SignInLimits;
    studies?: boolean;
    production?: boolean;
    requestLog?: NodeJS.WritableStream;
    clientDir?: string;
    /** The job pool's settings (a tiny budget or queue for the pool's own tests); one thread by default. */
    pool?: Partial<PoolOptions>;
  } = {},
): Promise<TestApp> {
  const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'lugbook-test-'));
  const logs: string[] = [];
  const ctx = createContext({
    dbFile: path.join(dataDir, 'lugbook.db'),
    uploadsDir: path.join(dataDir, 'uploads'),
    signInLimits: opts.signInLimits ?? { perAddress: 1000, perAccount: 1000, windowMs: 60_000 },
    allowedHosts: [HOST],
    ...(opts.production ? { production: true } : {}),
    ...(opts.requestLog ? { requestLog: opts.requestLog } : {}),
    ...(opts.clientDir ? { clientDir: opts.clientDir } : {}),
    pool: { ...poolOptionsFromEnv(), threads: 1, ...opts.pool },
    // A message with a detail is the error handler's "Unhandled error" (a 500): recorded so the
    // test after which it was logged fails (tests/setup/server-errors.ts).
    log: (m, detail) => {
      logs.push(m);
      if (detail !== undefined) recordServerError(m, detail);
    },
  });
  await seedDemo(ctx, { password: TEST_PASSWORD, studies: opts.studies ?? false });
  const app = createApp(ctx);
  checkWritesTakeTurns(app, ctx.sqlite, ctx.writeTurns);
  const agents = new Map<Role, TestAgent>();
  return {
    app,
    ctx,
    dataDir,
    anon: () => newAgent(app),
    async as(role) {
      const existing = agents.get(role);
      if (existing) return existing;
      const agent = newAgent(app);
      const email = DEMO_USERS.find((u) => u.role === role)!.email;
      const res = await agent.post('/api/auth/sign-in').send({ email, password: TEST_PASSWORD });
      if (res.status !== 200) throw new Error(`sign-in as ${role} failed: ${res.status} ${JSON.stringify(res.body)}`);
      agents.set(role, agent);
      return agent;
    },
    close() {
      void ctx.pool.close();
      ctx.sqlite.close();
      fs.rmSync(dataDir, { recursive: true, force: true });
    },
  };
}

/**
 * Closes an app made at a pause point (LUGBOOK_PAUSE_AT, read by its pool's workers): its workers, one
 * perhaps still held there, are gone before the next app or the end of the file, and the variables with them.
 */
export async function closePausedApp(t: TestApp | undefined): Promise<void> {
  if (t) {
    await t.ctx.pool.close();
    t.ctx.sqlite.close();
    fs.rmSync(t.dataDir, { recursive: true, force: true });
  }
  delete process.env.LUGBOOK_PAUSE_AT;
  delete process.env.LUGBOOK_PAUSE_MS;
}
