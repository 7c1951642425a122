// Reading a measurement file (a meter's or a fixture's CSV export) into a header and rows of cells,
// before anything is known about what the columns mean.
//
// What real exports do, and what this handles: a UTF-8 byte-order mark; preamble lines before the
// header (`Instrument: …`, `Device;Bench fixture 2`, `# comment`); comma, semicolon or tab as the
// delimiter; decimal commas (with a semicolon or tab delimiter, or inside quoted cells); quoted
// cells; blank lines anywhere; CRLF, LF or CR line ends. Papaparse does the tokenising; this file
// decides the delimiter, finds the header and keeps every row's line number for the messages.
import { parseUnit } from './columns';
import Papa from 'papaparse';
import { capIssues, csvIssue, type CsvIssue } from './issues';

export type { CsvIssue } from './issues';

export interface TableRow {
  /** 1-based line of the file where the row starts. */
  line: number;
  cells: string[];
}

export type TableResult =
  | {
      ok: true;
      /** Header cells, trimmed. */
      header: string[];
      headerLine: number;
      /** Data rows (blank and comment lines dropped), cells as written (untrimmed). */
      rows: TableRow[];
      delimiter: string;
      decimalComma: boolean;
    }
  | { ok: false; issues: CsvIssue[] };

export interface ReadTableOptions {
  /** Fewest data rows accepted; default 1. */
  minRows?: number;
}

export const DELIMITERS = [',', ';', '\t'] as const;
const DELIMITER_NAME: Record<string, string> = { ',': 'comma', ';': 'semicolon', '\t': 'tab' };

// Starts like a number: the test for "numeric row" when looking for the header. Deliberately loose
// (a cell like `12.5 kΩ` or `2024-05-01` counts), since it only separates names from data.
const NUMBER_LIKE = /^\s*[+-]?(?:\d|[.,]\d)/;
// A whole cell that is a number with either decimal separator: the delimiter score needs this,
// since a wrong delimiter leaves pieces like `5\t2` that start like a number but are not one.
const WHOLE_NUMBER = /^\s*[+-]?(?:\d+(?:[.,]\d*)?|[.,]\d+)(?:[eE][+-]?\d+)?\s*$/;
const COMMA_DECIMAL = /^\s*[+-]?\d*,\d+(?:[eE][+-]?\d+)?\s*$/;
const POINT_DECIMAL = /^\s*[+-]?\d*\.\d+(?:[eE][+-]?\d+)?\s*$/;
const COMMENT_START = /^\s*(?:#\s|\/\/)/;
const SNIFF_CHARS = 64 * 1024;

export function describeDelimiter(d: string): string {
  return DELIMITER_NAME[d] ?? JSON.stringify(d);
}

/**
 * True when the text is not a text file: any NUL character (binary data, or a UTF-16 file read as
 * UTF-8), or more than 1 % control characters / U+FFFD replacement characters in the first 64 KB.
 */
export function looksBinary(text: string): boolean {
  const n = Math.min(text.length, SNIFF_CHARS);
  let bad = 0;
  for (let i = 0; i < n; i++) {
    const c = text.charCodeAt(i);
    if (c === 0) return true;
    if ((c < 32 && c !== 9 && c !== 10 && c !== 13) || c === 0xfffd || (c >= 0x7f && c < 0xa0)) bad++;
  }
  return bad > n * 0.01;
}

function isBlank(cells: string[]): boolean {
  for (const c of cells) if (c.trim() !== '') return false;
  return true;
}

/** A comment line: `# …`, `// …`, or a line whose only text starts with `#` (not `#` as a header name). */
export function isCommentRow(cells: string[]): boolean {
  const first = cells[0] ?? '';
  if (COMMENT_START.test(first)) return true;
  // A lone `#` line, but not `#` as the first header name (`#;C (nF);D`).
  if (first.trim().startsWith('#')) {
    for (let i = 1; i < cells.length; i++) if ((cells[i] ?? '').trim() !== '') return false;
    return true;
  }
  return false;
}

function countNumberLike(cells: string[]): { numeric: number; text: number } {
  let numeric = 0;
  let text = 0;
  for (const c of cells) {
    if (c.trim() === '') continue;
    if (NUMBER_LIKE.test(c)) numeric++;
    else text++;
  }
  return { numeric, text };
}

/** Tokenise with one delimiter, keeping each row's first line (quoted cells may hold line breaks). */
function tokenise(text: string, delimiter: string): { rows: TableRow[]; errors: Papa.ParseError[] } {
  const parsed = Papa.parse<string[]>(text, { delimiter, newline: '\n', skipEmptyLines: false });
  const hasQuotes = text.indexOf('"') >= 0;
  const rows: TableRow[] = [];
  let line = 1;
  for (const cells of parsed.data) {
    rows.push({ line, cells });
    line += 1;
    if (hasQuotes) for (const c of cells) for (let i = c.indexOf('\n'); i >= 0; i = c.indexOf('\n', i + 1)) line++;
  }
  return { rows, errors: parsed.errors };
}

/**
 * Score of a delimiter on the head of the file: over the rows that have the most common cell count
 * (at least two cells), whole-number cells count for it and cells that start like a number but are
 * not one count against it; text cells (preamble, header) count for neither. A wrong delimiter either
 * leaves one cell per row or cuts numbers apart (`1,5;2,3` split at the commas gives `5;2`).
 */
function delimiterScore(head: string, delimiter: string): number {
  const { rows } = tokenise(head, delimiter);
  const counts = new Map<number, number>();
  for (const r of rows) if (r.cells.length >= 2 && !isBlank(r.cells)) counts.set(r.cells.length, (counts.get(r.cells.length) ?? 0) + 1);
  let mode = 0;
  let best = 0;
  for (const [k, n] of counts) if (n > best || (n === best && k > mode)) [mode, best] = [k, n];
  if (mode === 0) return -Infinity;
  let score = 0;
  for (const r of rows) {
    if (r.cells.length !== mode) continue;
    for (const c of r.cells) {
      if (WHOLE_NUMBER.test(c)) score += 1;
      else if (NUMBER_LIKE.test(c)) score -= 1; // a number cut apart, or a date or code
    }
  }
  return score;
}

export function detectDelimiter(head: string): string {
  let best: string = ',';
  let bestScore = -Infinity;
  for (const d of DELIMITERS) {
    const s = delimiterScore(head, d);
    if (s > bestScore) [best, bestScore] = [d, s];
  }
  return best;
}

function headOf(text: string): string {
  if (text.length <= SNIFF_CHARS) return text;
  const cut = text.lastIndexOf('\n', SNIFF_CHARS);
  return cut > 0 ? text.slice(0, cut) : text.slice(0, SNIFF_CHARS);
}

// A data cell: a number, optionally followed by a unit (`12.5 kΩ`, `45°`) but nothing with more digits
// or separators after it, so `2026-02-03`, `10:32`, `250k audio` or `1 V drive` in a preamble are not data.
const DATA_NUMBER = /^\s*[+-]?(?:\d+(?:[.,]\d*)?|[.,]\d+)(?:[eE][+-]?\d+)?\s*[^\d\s\-:/.,;]*\s*$/;

function dataNumbers(cells: string[]): number {
  let n = 0;
  for (const c of cells) if (DATA_NUMBER.test(c)) n++;
  return n;
}

/**
 * Index (into rows) of the header: a row of at least two cells, mostly text, followed by rows of
 * numbers — in at least two cells, or in one when the header has only two columns (a lot of item
 * labels and values). Two passes: first the header must be followed by two such rows in a row (so a
 * preamble pair like `Range;Auto` / `Points;31` is not taken for a header); if that finds nothing
 * (a table whose second row has a typo), one such row and a majority of the next five suffice.
 */
function findHeader(rows: TableRow[]): number {
  for (const strict of [true, false]) {
    for (let i = 0; i + 1 < rows.length; i++) {
      const own = countNumberLike(rows[i]!.cells);
      if (own.numeric + own.text < 2 || own.text <= own.numeric) continue;
      const need = rows[i]!.cells.length <= 2 ? 1 : 2;
      const isData = (j: number) => j < rows.length && dataNumbers(rows[j]!.cells) >= need;
      if (!isData(i + 1)) continue;
      if (strict) {
        if (i + 2 >= rows.length || isData(i + 2)) return i;
        continue;
      }
      const look = Math.min(5, rows.length - (i + 1));
      let numericRows = 0;
      for (let j = i + 1; j <= i + look; j++) if (isData(j)) numericRows++;
      if (numericRows * 2 >= look) return i;
    }
  }
  return -1;
}

function noHeaderIssue(rows: TableRow[], minRows: number): CsvIssue {
  const firstNumeric = rows.find((r) => countNumberLike(r.cells).numeric >= 2);
  if (!firstNumeric) {
    // No data at all: if the last line reads like a header, say it is a header-only file.
    const last = [...rows].reverse().find((r) => {
      const c = countNumberLike(r.cells);
      return c.text >= 2 && c.text > c.numeric;
    });
    if (last) {
      return csvIssue(
        null,
        null,
        `The file has a header (line ${last.line}) but no data rows; at least ${minRows} ${minRows === 1 ? 'is' : 'are'} needed.`,
      );
    }
    return csvIssue(
      null,
      null,
      'No header line found: expected a line of column names (such as "Rotation (°),R (kΩ)") followed by rows of numbers.',
    );
  }
  return csvIssue(
    null,
    null,
    `No header line found: the rows of numbers (from line ${firstNumeric.line}) are not preceded by a line of column names with at least two columns. Add a header line such as "Rotation (°),R (kΩ)".`,
  );
}

/**
 * The table with its ragged rows set aside: `raggedIssues` names each row whose cell count differs
 * from the header's (those rows are left out of `rows`; the list is not capped). The sweep reader uses this to report ragged
 * rows together with the value problems of the other rows; readTable refuses the file outright.
 */
export type ScanResult = (Extract<TableResult, { ok: true }> & { raggedIssues: CsvIssue[] }) | { ok: false; issues: CsvIssue[] };

/** A unit cell without its brackets: `(kΩ)` → `kΩ`. */
function unitText(cell: string): string {
  return cell.trim().replace(/^[([]\s*(.*?)\s*[)\]]$/, '$1');
}

/** A row whose every filled cell is a unit (`deg`, `kOhm`, `(Ω)`, `%`) and at least one names a dimension. */
function isUnitsRow(cells: string[]): boolean {
  let dims = 0;
  for (const c of cells) {
    const u = unitText(c);
    if (u === '') continue;
    const parsed = parseUnit(u);
    if (!parsed) return false;
    if (parsed.dimension !== '') dims++;
  }
  return dims > 0;
}

export function scanTable(text: string, opts: ReadTableOptions = {}): ScanResult {
  const minRows = Math.max(1, opts.minRows ?? 1);
  if (text.length === 0 || (text.charCodeAt(0) === 0xfeff && text.length === 1)) {
    return { ok: false, issues: [csvIssue(null, null, 'The file is empty.')] };
  }
  if (looksBinary(text)) {
    return {
      ok: false,
      issues: [
        csvIssue(
          null,
          null,
          'This is not a text CSV file: it contains binary data (if it is a text file saved as UTF-16, save it again as UTF-8 CSV).',
        ),
      ],
    };
  }
  let body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  if (body.trim() === '') return { ok: false, issues: [csvIssue(null, null, 'The file is empty (only blank lines).')] };
  if (body.indexOf('\r') >= 0) body = body.replace(/\r\n?/g, '\n');

  const delimiter = detectDelimiter(headOf(body));
  const { rows: all, errors } = tokenise(body, delimiter);
  const issues: CsvIssue[] = [];
  for (const e of errors) {
    if (e.code === 'MissingQuotes') {
      const line = e.row !== undefined && all[e.row] ? all[e.row]!.line : null;
      issues.push(csvIssue(line, null, 'a quoted cell is not closed (a `"` is missing).'));
    }
  }
  const rows = all.filter((r) => !isBlank(r.cells) && !isCommentRow(r.cells));

  let h = findHeader(rows);
  if (h < 0) return { ok: false, issues: capIssues([...issues, noHeaderIssue(rows, minRows)]) };
  // A units row under the names (`Angle;R1-2;R2-3` then `deg;kOhm;kOhm`): the finder takes the
  // units row for the header, since it is the text row right above the numbers. Names and units
  // are joined into `Angle (deg)`, `R1-2 (kOhm)` so each column keeps its name and its unit.
  let unitsRow: string[] | null = null;
  if (h > 0 && isUnitsRow(rows[h]!.cells) && !isUnitsRow(rows[h - 1]!.cells) && rows[h - 1]!.cells.length >= rows[h]!.cells.length) {
    unitsRow = rows[h]!.cells.map((c) => c.trim());
    h -= 1;
  }
  const headerRow = rows[h]!;
  const header = headerRow.cells.map((c, i) => {
    const name = c.trim();
    const unit = unitsRow ? unitText(unitsRow[i] ?? '') : '';
    return unit === '' ? name : `${name} (${unit})`;
  });
  while (header.length > 1 && header[header.length - 1] === '') header.pop(); // trailing delimiter
  const width = header.length;
  const data = rows.slice(h + (unitsRow ? 2 : 1));

  const good: TableRow[] = [];
  const ragged: CsvIssue[] = [];
  for (const r of data) {
    // Exports that end every line with a delimiter give empty trailing cells: drop them.
    while (r.cells.length > width && (r.cells[r.cells.length - 1] ?? '').trim() === '') r.cells.pop();
    if (r.cells.length !== width) {
      let hint = '';
      const raw = r.cells.join(delimiter);
      for (const d of DELIMITERS) {
        if (d !== delimiter && raw.split(d).length === width) {
          hint = ` It seems to use the ${describeDelimiter(d)} as its delimiter, while the file uses the ${describeDelimiter(delimiter)}.`;
        }
      }
      ragged.push(
        csvIssue(
          r.line,
          null,
          `the row has ${r.cells.length} cell${r.cells.length === 1 ? '' : 's'}, but the header (line ${headerRow.line}) has ${width}.${hint}`,
        ),
      );
    } else {
      good.push(r);
    }
  }

  if (data.length < minRows) {
    const only = data.length === 0 ? 'no data rows' : `only ${data.length} data row${data.length === 1 ? '' : 's'}`;
    issues.push(
      csvIssue(
        null,
        null,
        `The file has a header (line ${headerRow.line}) but ${only}; at least ${minRows} ${minRows === 1 ? 'is' : 'are'} needed.`,
      ),
    );
  }
  if (issues.length > 0) return { ok: false, issues: capIssues([...issues, ...ragged]) };

  // A file has one decimal separator; the one most number cells use wins, and a cell written with the
  // other is reported by the number reader.
  let commaCells = 0;
  let pointCells = 0;
  for (const r of good) {
    for (const c of r.cells) {
      if (COMMA_DECIMAL.test(c)) commaCells++;
      else if (POINT_DECIMAL.test(c)) pointCells++;
    }
  }
  return {
    ok: true,
    header,
    headerLine: headerRow.line,
    rows: good,
    delimiter,
    decimalComma: commaCells > pointCells,
    raggedIssues: ragged,
  };
}

/** Read the text of a CSV file into header and rows, or the reasons it cannot be read (every ragged row among them). */
export function readTable(text: string, opts: ReadTableOptions = {}): TableResult {
  const scan = scanTable(text, opts);
  if (!scan.ok) return scan;
  const { raggedIssues, ...table } = scan;
  if (raggedIssues.length > 0) return { ok: false, issues: capIssues(raggedIssues) };
  return table;
}
