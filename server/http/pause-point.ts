// Named points where a test may stop the server on purpose: with LUGBOOK_PAUSE_AT=<name> (never
// in production) the server writes "pause point reached: <name>" to standard output and blocks its
// thread for up to a minute, so that the crash test (tests/server/crash-upload.test.ts) can kill -9
// it at exactly that moment — inside a transaction, or between the commit and the answer. Without
// the variable each call is a comparison and nothing else.
import fs from 'node:fs';

export type PausePoint = 'lot-upload:mid-insert' | 'lot-upload:file-moved' | 'lot-upload:committed';

const wanted = process.env.NODE_ENV === 'production' ? undefined : process.env.LUGBOOK_PAUSE_AT;

export function pausePoint(name: PausePoint): void {
  if (wanted !== name) return;
  // Written synchronously: the line must be out before the thread blocks.
  fs.writeSync(1, `pause point reached: ${name}\n`);
  // Blocks this thread (the transaction stays open) until the test kills the process.
  Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 0, 60_000);
}
