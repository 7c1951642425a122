// The pool worker's entry (Piscina loads it with the tsx loader: server/pool/index.ts). It tells the
// main thread when a job starts (its time budget counts from then), runs the job, and sends the
// engine's own refusals (and 4xx HttpErrors) back as data so that the main thread can answer them as the inline code did.
import type { MessagePort } from 'node:worker_threads';
import { move } from 'piscina';
import { WavError } from '@shared/audio/wav';
import { HarnessUnsolvableError } from '@shared/circuit/solver';
import { HttpError } from '@server/http/errors';
import { useJobTurns, type JobTurns } from '@server/db/write-turns';
import { TASKS, type TaskName } from './tasks';
import { JobRefusalError, type JobRefusal } from './refusal';

export interface JobMessage {
  name: TaskName;
  input: unknown;
  /** Gets one message as the job starts, then closes. */
  started: MessagePort;
  /** The job's part in the write turns (server/db/write-turns.ts); absent for a pool without them. */
  turns?: JobTurns;
}

function refusal(err: unknown): JobRefusal | null {
  if (err instanceof JobRefusalError) return err.refusal;
  if (err instanceof HarnessUnsolvableError) return { jobRefused: { kind: 'unsolvable', message: err.message } };
  if (err instanceof WavError) return { jobRefused: { kind: 'wav', message: err.message } };
  if (err instanceof RangeError) return { jobRefused: { kind: 'range', message: err.message } };
  // A refusal of the request (4xx) keeps its status, code and fields; a fault stays a fault (500).
  if (err instanceof HttpError && err.status >= 400 && err.status < 500) {
    const { status, code, message, fields } = err;
    return { jobRefused: { kind: 'http', status, code, message, ...(fields ? { fields } : {}) } };
  }
  return null;
}

export default async function runJob({ name, input, started, turns }: JobMessage): Promise<unknown> {
  started.postMessage('started');
  started.close();
  useJobTurns(turns);
  try {
    const value = await (TASKS[name] as (input: unknown) => unknown)(input);
    // A rendered file is moved to the main thread, not copied (as are the buffers a job names: transfer.ts).
    return value instanceof Uint8Array ? move(value) : value;
  } catch (err) {
    const known = refusal(err);
    if (known) return known;
    throw err;
  } finally {
    useJobTurns(undefined);
  }
}
