// The job pool: heavy computation (harness sweeps, the bleed finder, audio renders, coil fits, lot
// statistics) runs in worker threads (Piscina), never on the thread that answers requests.
//
// Workers run the project's TypeScript through the same loader as the server (tsx, registered with
// `--import` in each worker), so `npm start`, `npm run dev`, the tests and the e2e server all run the
// very same source, with no build step. Each job has a time budget that counts from the moment a
// worker starts it: a job still running when it runs out is cancelled (its worker is terminated and
// replaced) and answered 503 with Retry-After; a request that finds every worker busy and the queue
// full is answered 503 with Retry-After at once.
import { createRequire } from 'node:module';
import os from 'node:os';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { MessageChannel } from 'node:worker_threads';
import { Piscina } from 'piscina';
import { HttpError } from '@server/http/errors';
import { isJobRefusal, refusalError } from './refusal';
import type { TASKS, TaskName } from './tasks';
import type { JobMessage } from './worker';
import type { WriteTurns } from '@server/db/write-turns';

type Tasks = typeof TASKS;
export type JobInput<K extends TaskName> = Parameters<Tasks[K]>[0];
export type JobResult<K extends TaskName> = Awaited<ReturnType<Tasks[K]>>;

export interface PoolOptions {
  /** Worker threads. */
  threads: number;
  /** Jobs that may wait for a worker; one more is refused (503). */
  maxQueue: number;
  /** How long a job may run once a worker has started it, in ms. */
  budgetMs: number;
  /** Start the workers now (a server) rather than on the first job (tests). */
  warm?: boolean;
}

/** One worker per core beyond the one that answers requests (at least one, at most four). */
export const DEFAULT_POOL_OPTIONS: PoolOptions = {
  threads: Math.max(1, Math.min(4, os.availableParallelism() - 1)),
  maxQueue: 32,
  budgetMs: 5000,
};

/** LUGBOOK_POOL_THREADS, LUGBOOK_POOL_QUEUE and LUGBOOK_JOB_BUDGET_MS, else the defaults. */
export function poolOptionsFromEnv(env: NodeJS.ProcessEnv = process.env): PoolOptions {
  const int = (name: string, fallback: number, min: number) => {
    const raw = env[name];
    if (raw === undefined || raw === '') return fallback;
    const n = Number(raw);
    if (!Number.isInteger(n) || n < min) throw new Error(`${name} must be a whole number of at least ${min}; it is "${raw}".`);
    return n;
  };
  return {
    threads: int('LUGBOOK_POOL_THREADS', DEFAULT_POOL_OPTIONS.threads, 1),
    maxQueue: int('LUGBOOK_POOL_QUEUE', DEFAULT_POOL_OPTIONS.maxQueue, 0),
    budgetMs: int('LUGBOOK_JOB_BUDGET_MS', DEFAULT_POOL_OPTIONS.budgetMs, 1),
  };
}

export interface JobPool {
  /**
   * Runs a job in a worker. Refusals: 503 `busy` (queue full) and 503 `over_budget` (cancelled), both with
   * Retry-After. `budgetMs` replaces the pool's budget for this job.
   */
  run<K extends TaskName>(name: K, input: JobInput<K>, opts?: RunOptions): Promise<JobResult<K>>;
  /** Jobs submitted and not yet settled (running or waiting). */
  readonly pending: number;
  readonly options: PoolOptions;
  close(): Promise<void>;
}

export interface RunOptions {
  /** Buffers moved to the worker (not copied). */
  transfer?: ArrayBuffer[];
  budgetMs?: number;
  /**
   * Asked when the budget runs out: false leaves the job to finish (a lot ingest past its commit, whose
   * readings are stored whatever happens, is answered rather than cancelled). Cancelled when absent.
   */
  cancellable?: () => boolean;
}

const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const WORKER = new URL('./worker.ts', import.meta.url).href;
/** tsx's loader (`--import tsx`), by its file so the worker finds it whatever the working folder. */
const TSX_LOADER = pathToFileURL(createRequire(import.meta.url).resolve('tsx')).href;

class BudgetExceeded extends Error {}

export function createJobPool(options: PoolOptions = DEFAULT_POOL_OPTIONS, writeTurns?: WriteTurns): JobPool {
  const piscina = new Piscina<JobMessage, unknown>({
    filename: WORKER,
    execArgv: ['--import', TSX_LOADER],
    // The `@server/…` and `@shared/…` paths resolve through tsconfig.json whatever the working folder.
    env: { ...process.env, TSX_TSCONFIG_PATH: `${ROOT}tsconfig.json` },
    maxThreads: options.threads,
    minThreads: options.warm ? options.threads : 0,
    idleTimeout: options.warm ? Infinity : 30_000,
    // The pool's own count refuses first (below); Piscina's queue is never the limit.
    maxQueue: Infinity,
  });
  let pending = 0;

  async function run<K extends TaskName>(name: K, input: JobInput<K>, opts: RunOptions = {}): Promise<JobResult<K>> {
    const budgetMs = opts.budgetMs ?? options.budgetMs;
    const retryAfter = String(Math.max(1, Math.ceil(budgetMs / 1000)));
    if (pending >= options.threads + options.maxQueue) {
      throw new HttpError(503, 'busy', 'The server is busy with other computations; try again in a moment.', undefined, undefined, {
        'Retry-After': retryAfter,
      });
    }
    pending++;
    const controller = new AbortController();
    const { port1, port2 } = new MessageChannel();
    // The job's writes take turns with the request thread's (server/db/write-turns.ts).
    const flag = writeTurns?.jobFlag();
    let timer: NodeJS.Timeout | undefined;
    port1.once('message', () => {
      timer = setTimeout(() => {
        if (opts.cancellable?.() !== false) controller.abort(new BudgetExceeded());
      }, budgetMs);
    });
    try {
      const result = await piscina.run(
        { name, input, started: port2, ...(writeTurns && flag ? { turns: { main: writeTurns.main, flag } } : {}) },
        { signal: controller.signal, transferList: [port2, ...(opts.transfer ?? [])] },
      );
      if (isJobRefusal(result)) throw refusalError(result);
      return result as JobResult<K>;
    } catch (err) {
      if (controller.signal.aborted) {
        throw new HttpError(
          503,
          'over_budget',
          `The computation took longer than ${budgetMs / 1000} s and was stopped; try a smaller request, or again in a moment.`,
          undefined,
          undefined,
          { 'Retry-After': retryAfter },
        );
      }
      throw err;
    } finally {
      pending--;
      if (flag) writeTurns!.settled(flag);
      clearTimeout(timer);
      port1.close();
    }
  }

  return {
    run,
    get pending() {
      return pending;
    },
    options,
    close: () => piscina.destroy(),
  };
}
