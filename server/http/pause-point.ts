// Named points where a test may stop the server on purpose: with LUGBOOK_PAUSE_AT=<name> (never
// in production) the server writes "pause point reached: <name>" to standard output and blocks its
// thread for up to a minute (LUGBOOK_PAUSE_MS, if set), so that the crash test
// (tests/server/crash-upload.test.ts) can kill -9 it at exactly that moment — inside a transaction, or
// between the commit and the answer — and the ingest test (tests/server/lot-ingest-budget.test.ts) can
// run a lot ingest past its time budget there. The lot upload's points are in its pool worker
// (server/features/lots/ingest.ts); a worker reads the variables from the environment the pool gave it.
// Without the variable each call is a comparison and nothing else.
import fs from 'node:fs';

export type PausePoint = 'lot-upload:mid-insert' | 'lot-upload:file-moved' | 'lot-upload:committed';

const wanted = process.env.NODE_ENV === 'production' ? undefined : process.env.LUGBOOK_PAUSE_AT;
const pauseMs = Number(process.env.LUGBOOK_PAUSE_MS) > 0 ? Number(process.env.LUGBOOK_PAUSE_MS) : 60_000;

export function pausePoint(name: PausePoint): void {
  if (wanted !== name) return;
  // Written synchronously: the line must be out before the thread blocks.
  fs.writeSync(1, `pause point reached: ${name}\n`);
  // Blocks this thread (the transaction stays open) until the test kills the process (or the worker).
  Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 0, pauseMs);
}
