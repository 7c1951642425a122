// The engine's own refusals, as they cross from a pool worker to the main thread (errors lose their
// class on the way), and back into the same errors the inline code threw.
import { WavError } from '@shared/audio/wav';
import { HarnessUnsolvableError } from '@shared/circuit/solver';

export interface JobRefusal {
  jobRefused: { kind: 'unsolvable' | 'wav' | 'range'; message: string };
}

export function isJobRefusal(value: unknown): value is JobRefusal {
  return typeof value === 'object' && value !== null && 'jobRefused' in value;
}

export function refusalError({ jobRefused: { kind, message } }: JobRefusal): Error {
  if (kind === 'unsolvable') return new HarnessUnsolvableError();
  if (kind === 'wav') return new WavError(message);
  return new RangeError(message);
}
