// SQLite lets one connection write at a time. Pool workers write through connections of their own, some
// for long (a 100,000-row lot ingest about a second, a promotion of 1,000 items about two), and a write
// on the request thread that met one of them waited in SQLite's busy handler: the whole event loop
// stopped with it (/api/health waited 450 ms during a 100,000-row upload). Write turns keep the two apart
// without ever blocking the request thread:
//
// - A worker job writes inside `workerWrite`: it waits (blocking its own thread, which serves nothing
//   else) while the request thread has a turn, then marks its job as writing until its transaction ends.
// - The request thread takes a turn (`take`, awaited) before it writes: that waits, asynchronously, while
//   any job is writing, and then holds the turn for the rest of the current turn of the event loop, so
//   that the synchronous writes which follow cannot meet a worker's lock.
//
// Each job has a flag of its own, which the pool clears when the job settles: a worker terminated inside
// a transaction (a job cancelled past its budget) leaves no mark that would hold the request thread back.
// The two sides check each other in the Dekker way: each announces itself, then looks at the other, and
// withdraws if the other is there (atomics are sequentially consistent), so both can never go ahead.

/** The request thread's side: the turns counter every job sees, and the flags of the jobs running now. */
export class WriteTurns {
  /** How many turns the request thread holds now (taken and not yet released). */
  readonly main = new Int32Array(new SharedArrayBuffer(4));
  private readonly flags = new Set<Int32Array>();

  /** A new job's writing flag (give it to the job; `settled` when the job ends, however it ends). */
  jobFlag(): Int32Array {
    const flag = new Int32Array(new SharedArrayBuffer(4));
    this.flags.add(flag);
    return flag;
  }

  settled(flag: Int32Array): void {
    this.flags.delete(flag);
    Atomics.store(flag, 0, 0);
    Atomics.notify(flag, 0);
  }

  /** Whether a job is inside a write now. */
  get writing(): boolean {
    return this.writer() !== undefined;
  }

  /** A job writing now, if any. */
  private writer(): Int32Array | undefined {
    for (const flag of this.flags) if (Atomics.load(flag, 0) !== 0) return flag;
    return undefined;
  }

  /**
   * Resolves when the request thread may write: no job is writing, and none will start until the current
   * turn of the event loop ends. Call it right before the synchronous writes (after any other await).
   */
  async take(): Promise<void> {
    for (;;) {
      Atomics.add(this.main, 0, 1);
      const writer = this.writer();
      if (!writer) {
        setImmediate(() => this.release());
        return;
      }
      this.release();
      // Woken when that job's transaction ends (or its job settles); looked at again every 50 ms regardless.
      const wait = Atomics.waitAsync(writer, 0, 1, 50);
      if (wait.async) await wait.value;
    }
  }

  private release(): void {
    Atomics.sub(this.main, 0, 1);
    Atomics.notify(this.main, 0);
  }
}

/** What a job carries to take part in the turns (pool/index.ts puts it in every job's message). */
export interface JobTurns {
  main: Int32Array;
  flag: Int32Array;
}

let current: JobTurns | undefined;
/** How deep in workerWrite this thread is (a write inside a write is already marked). */
let depth = 0;

/** The turns of the job this worker runs now (worker.ts, before each job); undefined outside the pool. */
export function useJobTurns(turns: JobTurns | undefined): void {
  current = turns;
}

/**
 * Runs a job's write transaction: waits while the request thread holds a turn, marks the job as writing,
 * runs, and clears the mark. Outside a pool job (a test calling the code directly) it just runs.
 */
export function workerWrite<T>(run: () => T): T {
  const turns = current;
  if (!turns || depth > 0) return run();
  const { main, flag } = turns;
  for (;;) {
    const held = Atomics.load(main, 0);
    if (held !== 0) {
      Atomics.wait(main, 0, held, 50);
      continue;
    }
    Atomics.store(flag, 0, 1);
    if (Atomics.load(main, 0) === 0) break;
    Atomics.store(flag, 0, 0);
    Atomics.notify(flag, 0);
  }
  depth++;
  try {
    return run();
  } finally {
    depth--;
    Atomics.store(flag, 0, 0);
    Atomics.notify(flag, 0);
  }
}
