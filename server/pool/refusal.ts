// The refusals a job may answer, as they cross from a pool worker to the main thread (errors lose their
// class on the way), and back into the same errors the inline code threw: the engine's own (an
// unsolvable circuit, a bad WAV file, a value out of range), a lot ingest's (a refused file, a lot
// that changed meanwhile) and any 4xx HttpError a job's service code throws (a promotion's checks), which
// the routes answer as 4xx.
import { WavError } from '@shared/audio/wav';
import { HarnessUnsolvableError } from '@shared/circuit/solver';
import type { NeedsMapping } from '@shared/csv/columns';
import type { CsvIssue } from '@shared/csv/issues';
import { conflict, HttpError } from '@server/http/errors';
import { fileRefused } from '@server/uploads/refusal';

export type Refusal =
  | { kind: 'unsolvable' | 'wav' | 'range' | 'conflict'; message: string }
  | { kind: 'file'; issues: CsvIssue[]; needsMapping?: NeedsMapping }
  | { kind: 'http'; status: number; code: string; message: string; fields?: Record<string, string> };

export interface JobRefusal {
  jobRefused: Refusal;
}

/** Thrown inside a job to answer a refusal (worker.ts sends it back as data). */
export class JobRefusalError extends Error {
  readonly refusal: JobRefusal;
  constructor(refusal: Refusal) {
    super('kind' in refusal && 'message' in refusal ? refusal.message : 'refused');
    this.refusal = { jobRefused: refusal };
  }
}

export function isJobRefusal(value: unknown): value is JobRefusal {
  return typeof value === 'object' && value !== null && 'jobRefused' in value;
}

export function refusalError({ jobRefused: r }: JobRefusal): Error {
  switch (r.kind) {
    case 'unsolvable':
      return new HarnessUnsolvableError();
    case 'wav':
      return new WavError(r.message);
    case 'conflict':
      return conflict(r.message);
    case 'file':
      return fileRefused(r);
    case 'http':
      return new HttpError(r.status, r.code, r.message, r.fields);
    default:
      return new RangeError(r.message);
  }
}
