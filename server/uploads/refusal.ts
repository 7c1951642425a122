import { HttpError } from '@server/http/errors';
import type { NeedsMapping } from '@shared/csv/columns';
import type { CsvIssue } from '@shared/csv/issues';

/**
 * The one answer to a refused measurement file: 422 with every problem (line, column, message),
 * or, when its columns were not recognised or a column's unit is not known, `needs_mapping` with what
 * was found for the mapping step.
 */
export function fileRefused(result: { issues: CsvIssue[]; needsMapping?: NeedsMapping }): HttpError {
  const first = result.issues[0];
  const unit = result.needsMapping?.unitNeeded?.[0];
  const message = unit
    ? `${unit.reason}${first?.line != null ? ` (the first such value is on line ${first.line})` : ''}`
    : result.needsMapping
      ? 'The columns of this file were not recognised; choose which column holds what.'
      : `The file was refused, nothing was stored: ${first?.message ?? 'it could not be read.'}${result.issues.length > 1 ? ` (${result.issues.length} problems listed)` : ''}`;
  return new HttpError(
    422,
    result.needsMapping ? 'needs_mapping' : 'invalid_file',
    message,
    { file: message },
    {
      issues: result.issues,
      ...(result.needsMapping ? { details: { needsMapping: result.needsMapping } } : {}),
    },
  );
}
