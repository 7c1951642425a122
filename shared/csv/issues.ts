// Problems found in a CSV file, each pinned to a line of the file and a column (header text) where
// that makes sense, so the upload screen can point at the cell.

export interface CsvIssue {
  /** 1-based line in the file as the user sees it in an editor, or null for the file as a whole. */
  line: number | null;
  /** Header text of the column, or null. */
  column: string | null;
  /** Complete sentence that already names the line and column, so it can be shown on its own. */
  message: string;
}

/** More than this many problems are summarised: past twenty the user fixes the file's export, not the cells. */
export const MAX_ISSUES = 20;

export function csvIssue(line: number | null, column: string | null, text: string): CsvIssue {
  const where =
    line !== null && column !== null
      ? `Line ${line}, column "${column}": `
      : line !== null
        ? `Line ${line}: `
        : column !== null
          ? `Column "${column}": `
          : '';
  return { line, column, message: where === '' ? text.charAt(0).toUpperCase() + text.slice(1) : where + text };
}

/** Issues in line order (whole-file issues first), at most MAX_ISSUES plus one line counting the rest. */
export function capIssues(issues: CsvIssue[]): CsvIssue[] {
  const sorted = issues
    .map((issue, order) => ({ issue, order }))
    .sort((a, b) => (a.issue.line ?? 0) - (b.issue.line ?? 0) || a.order - b.order)
    .map((x) => x.issue);
  if (sorted.length <= MAX_ISSUES) return sorted;
  const rest = sorted.length - MAX_ISSUES;
  return [
    ...sorted.slice(0, MAX_ISSUES),
    { line: null, column: null, message: `… and ${rest} more problem${rest === 1 ? '' : 's'} not listed; fix these first.` },
  ];
}

export function isCsvIssue(x: unknown): x is CsvIssue {
  return typeof x === 'object' && x !== null && 'message' in x && 'line' in x;
}
