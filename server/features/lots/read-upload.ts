// Reads a lot export from disk as a stream: the head is sniffed for header, delimiter and decimal
// separator, then papaparse delivers rows chunk by chunk into typed columns, so a 100,000-row file
// is never held whole as text or as row objects, and the event loop stays free between chunks.
import { createHash } from 'node:crypto';
import fs from 'node:fs';
import Papa from 'papaparse';
import {
  createLotRowReader,
  createRowLineCounter,
  isBlankRow,
  sniffTable,
  SNIFF_BYTES,
  DEFAULT_MAX_LOT_ROWS,
  type LotQuantity,
} from '@shared/csv/lots';
import type { CsvIssue } from '@shared/csv/issues';
import { isCsvIssue } from '@shared/csv/lots';
import type { ExplicitMapping, NeedsMapping } from '@shared/csv/columns';
import { isCommentRow } from '@shared/csv/read-table';

export interface LotColumns {
  items: string[];
  values: Float64Array;
  /** NaN where the row had no second reading. */
  second: Float64Array;
  /** NaN where the row had no test frequency. */
  frequency: Float64Array;
  /** File line of each row, for messages. */
  lines: Uint32Array;
  n: number;
  columns: Record<string, string>;
  /** Header texts of columns no role uses, listed back to the user. */
  ignored: string[];
  secondQuantity: 'dissipation' | 'esr' | null;
  contentHash: string;
}

export type ReadLotResult = { ok: true; data: LotColumns } | { ok: false; issues: CsvIssue[]; needsMapping?: NeedsMapping };

function grow<T extends Float64Array | Uint32Array>(a: T, n: number): T {
  if (n < a.length) return a;
  const b = new (a.constructor as new (n: number) => T)(a.length * 2);
  b.set(a);
  return b;
}

function readHead(file: string): string {
  const fd = fs.openSync(file, 'r');
  try {
    const buf = Buffer.alloc(SNIFF_BYTES);
    const read = fs.readSync(fd, buf, 0, SNIFF_BYTES, 0);
    return buf.subarray(0, read).toString('utf8');
  } finally {
    fs.closeSync(fd);
  }
}

export async function readLotFile(
  file: string,
  opts: { quantity: LotQuantity; mapping?: ExplicitMapping; maxRows?: number },
): Promise<ReadLotResult> {
  const maxRows = opts.maxRows ?? DEFAULT_MAX_LOT_ROWS;
  const size = fs.statSync(file).size;
  const head = readHead(file);
  if (head.includes('\u0000'))
    return { ok: false, issues: [{ line: null, column: null, message: 'This is not a text CSV file (it holds binary data).' }] };
  const sniff = sniffTable(head, { complete: size <= SNIFF_BYTES });
  if (!sniff.ok) return sniff;
  const reader = createLotRowReader(sniff.header, {
    quantity: opts.quantity,
    decimalComma: sniff.decimalComma,
    headerLine: sniff.headerLine,
    ...(opts.mapping ? { mapping: opts.mapping } : {}),
  });
  if (!reader.ok) return reader;

  const hash = createHash('sha256');
  let cap = 1024;
  let values = new Float64Array(cap);
  let second = new Float64Array(cap);
  let frequency = new Float64Array(cap);
  let lines = new Uint32Array(cap);
  const items: string[] = [];
  let n = 0;
  let failure: CsvIssue | null = null;
  let needsMapping: NeedsMapping | undefined;
  const lineOf = createRowLineCounter();
  let first = true;

  await new Promise<void>((resolve, reject) => {
    const stream = fs.createReadStream(file, { encoding: 'utf8', highWaterMark: 256 * 1024 });
    stream.on('data', (chunk) => hash.update(chunk as string, 'utf8'));
    stream.on('error', reject);
    Papa.parse<string[]>(stream as unknown as File, {
      delimiter: sniff.delimiter,
      skipEmptyLines: false,
      chunk: (results, parser) => {
        for (const cells of results.data) {
          if (first) {
            first = false;
            if (cells[0]?.charCodeAt(0) === 0xfeff) cells[0] = cells[0].slice(1);
          }
          const line = lineOf(cells);
          if (line <= sniff.headerLine || isBlankRow(cells)) continue;
          const c0 = cells[0]!.charCodeAt(0);
          if ((c0 === 35 || c0 === 47) && isCommentRow(cells)) continue;
          if (n >= maxRows) {
            failure = {
              line,
              column: null,
              message: `the lot has more than ${maxRows.toLocaleString('en')} rows, the most one upload may hold.`,
            };
            parser.abort();
            return;
          }
          const row = reader.read(cells, line);
          if (isCsvIssue(row)) {
            failure = row;
            needsMapping = reader.needsMappingFor(row);
            parser.abort();
            return;
          }
          if (n >= cap) {
            cap *= 2;
            values = grow(values, n);
            second = grow(second, n);
            frequency = grow(frequency, n);
            lines = grow(lines, n);
          }
          items.push(row.item);
          values[n] = row.value;
          second[n] = row.second ?? NaN;
          frequency[n] = row.frequency ?? NaN;
          lines[n] = line;
          n++;
        }
      },
      complete: () => resolve(),
      error: (err: Error) => reject(err),
    });
  });
  if (failure) return { ok: false, issues: [failure], ...(needsMapping ? { needsMapping } : {}) };
  if (n === 0)
    return {
      ok: false,
      issues: [{ line: null, column: null, message: `The file has a header (line ${sniff.headerLine}) but no data rows.` }],
    };
  // The stream was aborted early only on failure, so the hash covers the whole file here.
  return {
    ok: true,
    data: {
      items,
      values: values.subarray(0, n),
      second: second.subarray(0, n),
      frequency: frequency.subarray(0, n),
      lines: lines.subarray(0, n),
      n,
      columns: reader.columns,
      ignored: reader.ignored,
      secondQuantity: reader.secondQuantity,
      contentHash: hash.digest('hex'),
    },
  };
}
