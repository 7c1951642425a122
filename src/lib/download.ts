import Papa from 'papaparse';
import { withConditions, type Condition } from '@shared/csv/conditions';

/** Offers text as a file download. */
export function downloadText(text: string, fileName: string, type = 'text/plain'): void {
  const url = URL.createObjectURL(new Blob([text], { type }));
  const a = document.createElement('a');
  a.href = url;
  a.download = fileName;
  a.click();
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}

/**
 * Offers rows as a CSV download, with the conditions they were made under as `# key: value` lines
 * above the header. Cells starting with = + - @ are escaped so that a spreadsheet cannot run them as
 * formulae (OWASP CSV injection).
 */
export function downloadCsv(rows: Record<string, unknown>[] | unknown[][], fileName: string, conditions: readonly Condition[]): void {
  downloadText(csvText(rows, stampExport(conditions)), fileName.endsWith('.csv') ? fileName : `${fileName}.csv`, 'text/csv');
}

/** The conditions with the time of the export last (unless they already carry it). */
export function stampExport(conditions: readonly Condition[], now = new Date()): Condition[] {
  if (conditions.some((c) => c.key === 'exported')) return [...conditions];
  return [...conditions, { key: 'exported', value: now.toISOString().replace(/\.\d{3}Z$/, 'Z') }];
}

/** The CSV text downloadCsv offers: conditions lines, then the rows. */
export function csvText(rows: Record<string, unknown>[] | unknown[][], conditions: readonly Condition[]): string {
  return withConditions(conditions, Papa.unparse(rows as never, { escapeFormulae: true, newline: '\n' }) + '\n');
}
