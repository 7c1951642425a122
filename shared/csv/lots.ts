// A lot export (docs/domain.md, "Lot"): one row per part — item, value, optionally a second reading
// (dissipation factor or ESR) and the test frequency — up to 100,000 rows.
//
// Built for a server that streams the upload through papaparse rather than holding it whole:
//   1. `sniffTable(head)` on the first few KB finds the header line, delimiter and decimal separator
//      (it is readTable on the complete lines of the head, so a preamble and a BOM are handled the same).
//   2. `createLotRowReader(header, …)` recognises the columns once and returns `read(cells, line)`.
//   3. papaparse (`step`, `chunkSize`, the sniffed `delimiter`) delivers rows; `createRowLineCounter()`
//      turns them into file line numbers; rows at or before the header line and blank rows are skipped
//      (`isBlankRow`); the first `read` that returns a CsvIssue stops the upload (`parser.abort()`).
// `parseLotRows(text, …)` does exactly that for a file held as a string.
//
// Lot rows stop at the first bad row (unlike sweeps, which list every problem): a lot export is
// machine-written, so one bad row usually means a wrong column or a truncated file, and a
// 100,000-row file should not produce 100,000 messages.
//
// Decisions: an empty item or value cell is an error; an empty second or frequency cell is null;
// a negative value, D, ESR or frequency is an error; a zero value is kept (an open capacitor reads
// 0 and must show up as out of tolerance). A value column with no unit in its header is in SI (F, Ω);
// for capacitance only while every value is below 1e-3 (no capacitor in a lot is a millifarad: a
// bare 47 or 0.047 in such a column is nF or µF written without its unit), else the upload stops and
// opens the mapping step for the column's unit (`needsMappingFor`; common practice). Columns no
// role uses are listed back (`ignored`), as sweeps do.
import Papa from 'papaparse';
import { readNumberCell } from './cell-number';
import {
  columnsUsed,
  resolveColumns,
  roleWord,
  ROLES_OF,
  scaleExponent,
  type ColumnInfo,
  type ExplicitMapping,
  type NeedsMapping,
} from './columns';
import { capIssues, csvIssue, isCsvIssue, type CsvIssue } from './issues';
import { isCommentRow, readTable } from './read-table';

export { isCsvIssue } from './issues';

export type LotQuantity = 'capacitance' | 'resistance';

export interface LotRow {
  item: string;
  /** F or Ω. */
  value: number;
  /** Dissipation factor (a fraction) or ESR (Ω), per the reader's `secondQuantity`; null when absent. */
  second: number | null;
  /** Test frequency, Hz. */
  frequency: number | null;
}

export interface LotReaderOptions {
  quantity: LotQuantity;
  mapping?: ExplicitMapping;
  decimalComma: boolean;
  headerLine: number;
}

export type LotRowReader =
  | {
      ok: true;
      /** A row's cells and its file line → the row, or the issue that stops the upload. */
      read(cells: string[], line: number): LotRow | CsvIssue;
      columns: Record<string, string>;
      /** Header texts of the file's columns that no role uses: listed back to the user, never dropped silently. */
      ignored: string[];
      secondQuantity: 'dissipation' | 'esr' | null;
      /**
       * For the issue `read` returned: the mapping step that settles it, when the issue is a unit the
       * file does not give (a unit-less capacitance column with a value of 1e-3 or more), else undefined.
       */
      needsMappingFor(issue: CsvIssue): NeedsMapping | undefined;
    }
  | { ok: false; issues: CsvIssue[]; needsMapping?: NeedsMapping };

const QUANTITY_DIMENSION: Record<LotQuantity, 'F' | 'Ω'> = { capacitance: 'F', resistance: 'Ω' };

/** Precomputed reading of one number column: index, scale as a power of ten, unit suffix, header. */
interface NumberColumn {
  index: number;
  exp: number | null;
  scale: number;
  suffix: string | null;
  header: string;
}

function numberColumn(info: ColumnInfo): NumberColumn {
  return { index: info.index, exp: scaleExponent(info.scale), scale: info.scale, suffix: info.unit ?? null, header: info.header };
}

export function createLotRowReader(header: string[], opts: LotReaderOptions): LotRowReader {
  const cols = resolveColumns(header, 'lot', opts.mapping);
  const issues = [...cols.issues];
  if (cols.missing.length > 0) {
    issues.push(
      csvIssue(
        opts.headerLine,
        null,
        `no column found for the ${cols.missing.map(roleWord).join(' and the ')} (the header has ${header
          .map((h) => `"${h}"`)
          .join(', ')}); choose the columns by hand.`,
      ),
    );
  }
  const valueInfo = cols.mapping.value;
  const want = QUANTITY_DIMENSION[opts.quantity];
  if (valueInfo && valueInfo.dimension !== '' && valueInfo.dimension !== want) {
    issues.push(
      csvIssue(
        opts.headerLine,
        valueInfo.header,
        `the value column is in ${valueInfo.unit ?? valueInfo.dimension}, but this lot is of ${opts.quantity === 'capacitance' ? 'capacitors (F)' : 'resistors (Ω)'}.`,
      ),
    );
  }
  if (issues.length > 0) {
    return {
      ok: false,
      issues: capIssues(issues),
      ...(cols.missing.length > 0 ? { needsMapping: { header, detected: cols.detected, missing: cols.missing } } : {}),
    };
  }

  const width = header.length;
  const headerLine = opts.headerLine;
  const decimalComma = opts.decimalComma;
  const itemIndex = cols.mapping.item!.index;
  const itemHeader = cols.mapping.item!.header;
  const value = numberColumn(valueInfo!);
  const second = cols.mapping.second ? numberColumn(cols.mapping.second) : null;
  const freq = cols.mapping.testFrequency ? numberColumn(cols.mapping.testFrequency) : null;
  const bareFarads = opts.quantity === 'capacitance' && (valueInfo!.dimension ?? '') === '' && valueInfo!.scale === 1;
  const secondName = cols.mapping.second?.secondQuantity === 'esr' ? 'an ESR' : 'a dissipation factor';
  let unitIssue: CsvIssue | null = null;

  // Returns the scaled number, or an issue; `optional` turns an empty cell into null.
  function num(c: NumberColumn, cells: string[], line: number, optional: boolean): number | null | CsvIssue {
    const raw = cells[c.index]!;
    if (optional && raw.trim() === '') return null;
    const v = readNumberCell(raw, decimalComma, c.suffix, c.exp ?? 0);
    if (typeof v === 'string') return csvIssue(line, c.header, `${v}.`);
    return c.exp === null ? v * c.scale : v;
  }

  function read(cells: string[], line: number): LotRow | CsvIssue {
    if (cells.length !== width) {
      let n = cells.length;
      while (n > width && cells[n - 1]!.trim() === '') n--;
      if (n !== width) {
        return csvIssue(line, null, `the row has ${n} cell${n === 1 ? '' : 's'}, but the header (line ${headerLine}) has ${width}.`);
      }
    }
    const item = cells[itemIndex]!.trim();
    if (item === '') return csvIssue(line, itemHeader, 'the item is empty; every row needs its item label or number.');
    const v = num(value, cells, line, false);
    if (v === null || typeof v === 'object') return v ?? csvIssue(line, value.header, 'the cell is empty.');
    if (v < 0) return csvIssue(line, value.header, `${cells[value.index]!.trim()} is negative; a ${opts.quantity} cannot be.`);
    if (bareFarads && v >= 1e-3) {
      unitIssue = csvIssue(
        line,
        value.header,
        `${cells[value.index]!.trim()} in a capacitance column whose header names no unit would be ${v} F; give the column's unit (for example "${value.header} (nF)" or choose it in the column mapping).`,
      );
      return unitIssue;
    }
    let s: number | null = null;
    if (second) {
      const r = num(second, cells, line, true);
      if (r !== null && typeof r === 'object') return r;
      if (r !== null && r < 0) return csvIssue(line, second.header, `${cells[second.index]!.trim()} is negative; ${secondName} cannot be.`);
      s = r;
    }
    let f: number | null = null;
    if (freq) {
      const r = num(freq, cells, line, true);
      if (r !== null && typeof r === 'object') return r;
      if (r !== null && r <= 0)
        return csvIssue(line, freq.header, `${cells[freq.index]!.trim()} is not a test frequency: it must be greater than zero.`);
      f = r;
    }
    return { item, value: v, second: s, frequency: f };
  }

  const needsUnit: NeedsMapping = {
    header,
    detected: cols.mapping,
    missing: [],
    unitNeeded: [
      {
        role: 'value',
        index: value.index,
        header: value.header,
        reason: `The column "${value.header}" names no unit and holds values of 1e-3 or more, which cannot be farads: say which unit it is written in (pF, nF, µF).`,
      },
    ],
  };
  return {
    ok: true,
    read,
    columns: columnsUsed(cols.mapping, ROLES_OF.lot),
    ignored: cols.unknown,
    secondQuantity: cols.mapping.second?.secondQuantity ?? null,
    needsMappingFor: (issue) => (issue === unitIssue ? needsUnit : undefined),
  };
}

export type SniffResult =
  { ok: true; header: string[]; headerLine: number; delimiter: string; decimalComma: boolean } | { ok: false; issues: CsvIssue[] };

/** How much of a streamed file to sniff: enough for any preamble and a few hundred rows. */
export const SNIFF_BYTES = 16 * 1024;

/**
 * Header line, delimiter and decimal separator of a file from its head (the first SNIFF_BYTES or so).
 * Unless `complete` (the head is the whole file), the last, possibly cut, line is ignored. Problems in
 * the head's rows (ragged rows, unclosed quotes) are reported here already.
 */
export function sniffTable(head: string, opts: { complete?: boolean } = {}): SniffResult {
  let text = head;
  if (!opts.complete) {
    const cut = Math.max(head.lastIndexOf('\n'), head.lastIndexOf('\r'));
    if (cut > 0) text = head.slice(0, cut);
  }
  const t = readTable(text, { minRows: 1 });
  if (!t.ok) return t;
  return { ok: true, header: t.header, headerLine: t.headerLine, delimiter: t.delimiter, decimalComma: t.decimalComma };
}

/** True for a row with no text in any cell (papaparse gives `['']` for a blank line). */
export function isBlankRow(cells: string[]): boolean {
  for (let i = 0; i < cells.length; i++) if (cells[i]!.trim() !== '') return false;
  return true;
}

/**
 * Line numbers for rows delivered one by one by papaparse (with `newline` unset or a real line end):
 * each row starts on the line after the previous row ends, and a quoted cell may hold line breaks.
 * `quoted: false` (the file has no `"`, so no cell can hold a line break) skips scanning the cells.
 */
export function createRowLineCounter(opts: { quoted?: boolean } = {}): (cells: string[]) => number {
  let next = 1;
  if (opts.quoted === false) return () => next++;
  return (cells) => {
    const line = next;
    next++;
    for (let i = 0; i < cells.length; i++) {
      const c = cells[i]!;
      if (c.length === 0) continue;
      for (let j = c.indexOf('\n'); j >= 0; j = c.indexOf('\n', j + 1)) next++;
      // A lone CR counts as a line end too (CRLF inside a cell counts once, via its LF).
      for (let j = c.indexOf('\r'); j >= 0; j = c.indexOf('\r', j + 1)) if (c[j + 1] !== '\n') next++;
    }
    return line;
  };
}

export interface ParseLotOptions {
  quantity: LotQuantity;
  mapping?: ExplicitMapping;
  /** Fewest rows accepted; default 1. */
  minRows?: number;
  /** Most rows accepted; default 100,000. */
  maxRows?: number;
}

export const DEFAULT_MAX_LOT_ROWS = 100_000;

export type LotParseResult =
  | {
      ok: true;
      rows: LotRow[];
      columns: Record<string, string>;
      ignored: string[];
      secondQuantity: 'dissipation' | 'esr' | null;
      headerLine: number;
    }
  | { ok: false; issues: CsvIssue[]; needsMapping?: NeedsMapping };

/** A whole lot file held as a string: sniff, then one papaparse pass with the row reader, stopping at the first bad row. */
export function parseLotRows(text: string, opts: ParseLotOptions): LotParseResult {
  const maxRows = opts.maxRows ?? DEFAULT_MAX_LOT_ROWS;
  const minRows = Math.max(1, opts.minRows ?? 1);
  const complete = text.length <= SNIFF_BYTES;
  const sniff = sniffTable(complete ? text : text.slice(0, SNIFF_BYTES), { complete });
  if (!sniff.ok) return sniff;
  const reader = createLotRowReader(sniff.header, {
    quantity: opts.quantity,
    decimalComma: sniff.decimalComma,
    headerLine: sniff.headerLine,
    ...(opts.mapping ? { mapping: opts.mapping } : {}),
  });
  if (!reader.ok) return reader;

  const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  // One pass without `step`: for a string the whole result fits in memory anyway, and papaparse's
  // fast path (no quotes in the file) is a plain split.
  const parsed = Papa.parse<string[]>(body, { delimiter: sniff.delimiter, skipEmptyLines: false });
  const lineOf = createRowLineCounter({ quoted: body.indexOf('"') >= 0 });
  const rows: LotRow[] = [];
  for (const cells of parsed.data) {
    const line = lineOf(cells);
    if (line <= sniff.headerLine || isBlankRow(cells)) continue;
    const c0 = cells[0]!.charCodeAt(0);
    if ((c0 === 35 || c0 === 47) && isCommentRow(cells)) continue; // '#' or '/'
    if (rows.length >= maxRows) {
      return {
        ok: false,
        issues: [csvIssue(line, null, `the lot has more than ${maxRows.toLocaleString('en')} rows, the most one upload may hold.`)],
      };
    }
    const r = reader.read(cells, line);
    if (isCsvIssue(r)) {
      const needsMapping = reader.needsMappingFor(r);
      return { ok: false, issues: [r], ...(needsMapping ? { needsMapping } : {}) };
    }
    rows.push(r);
  }
  const unclosed = parsed.errors.find((e) => e.code === 'MissingQuotes');
  if (unclosed) return { ok: false, issues: [csvIssue(null, null, 'A quoted cell is not closed (a `"` is missing).')] };
  if (rows.length < minRows) {
    return {
      ok: false,
      issues: [
        csvIssue(
          null,
          null,
          `The file has a header (line ${sniff.headerLine}) but ${rows.length === 0 ? 'no data rows' : `only ${rows.length} data row${rows.length === 1 ? '' : 's'}`}; at least ${minRows} ${minRows === 1 ? 'is' : 'are'} needed.`,
        ),
      ],
    };
  }
  return {
    ok: true,
    rows,
    columns: reader.columns,
    ignored: reader.ignored,
    secondQuantity: reader.secondQuantity,
    headerLine: sniff.headerLine,
  };
}
