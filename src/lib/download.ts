import Papa from 'papaparse';

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
 * Offers rows as a CSV download. Cells starting with = + - @ are escaped so that a spreadsheet
 * cannot run them as formulae (OWASP CSV injection).
 */
export function downloadCsv(rows: Record<string, unknown>[] | unknown[][], fileName: string): void {
  downloadText(Papa.unparse(rows as never, { escapeFormulae: true }), fileName.endsWith('.csv') ? fileName : `${fileName}.csv`, 'text/csv');
}
